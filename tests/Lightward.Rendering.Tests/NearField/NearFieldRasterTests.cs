using Lightward.Rendering.NearField;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

public class NearFieldRasterTests
{
    private static NearFieldBody Ball(Vec3 position, double radius = 1, Vec3? beta = null) =>
        new("ball", MeshShapes.Sphere(radius, bands: 24), NearFieldImages.Passing(position, -position.Length, beta ?? Vec3.Zero), NearFieldImages.Glow);

    private static double LitArea(HdrFrame frame, float fullPixel)
    {
        double area = 0;
        for (int y = 0; y < frame.Height; y++)
            for (int x = 0; x < frame.Width; x++) area += Math.Min(1, frame.Luminance(x, y) / fullPixel);
        return area;
    }

    [Fact]
    public void EquirectangularWrapSeamCutsNothingOut()
    {
        var projection = new EquirectangularProjection(720, 360);
        HdrFrame ahead = NearFieldImages.Render(NearFieldImages.Layer(Ball(new Vec3(10, 0, 0))), projection, NearFieldImages.ShipAtRest(), Rotation.Identity);
        // Straight behind the camera the image is split between the left and right edges of the picture.
        HdrFrame behind = NearFieldImages.Render(NearFieldImages.Layer(Ball(new Vec3(0, 0, -10))), projection, NearFieldImages.ShipAtRest(), Rotation.Identity);
        double aheadArea = LitArea(ahead, NearFieldImages.MaxLuminance(ahead)), behindArea = LitArea(behind, NearFieldImages.MaxLuminance(behind));
        Assert.True(behind.Luminance(0, 180) > 0 && behind.Luminance(719, 180) > 0, "both halves drawn at the seam");
        // Both lie on the equator of the map, where equal solid angles cover equal pixel areas.
        Assert.Equal(aheadArea, behindArea, aheadArea * 0.02);
    }

    [Fact]
    public void DomeShowsNothingOutsideItsDisc()
    {
        var projection = new DomemasterProjection(400, Math.PI);
        // A large sphere on the dome's horizon (camera +X), cut by the rim.
        HdrFrame frame = NearFieldImages.Render(NearFieldImages.Layer(Ball(new Vec3(10, 0, 0), radius: 3)), projection, NearFieldImages.ShipAtRest(), Rotation.Identity);
        double inside = 0, outside = 0;
        for (int y = 0; y < 400; y++)
            for (int x = 0; x < 400; x++)
            {
                double r = Math.Sqrt((x + 0.5 - 200) * (x + 0.5 - 200) + (y + 0.5 - 200) * (y + 0.5 - 200));
                if (r > 201) outside += frame.Luminance(x, y);
                else inside += frame.Luminance(x, y);
            }
        Assert.True(inside > 0);
        Assert.Equal(0, outside);
    }

    [Fact]
    public void SameFrameWithOneOrTwoThreadsIsIdentical()
    {
        NearFieldBody[] bodies =
        [
            Ball(new Vec3(-3, 0, 20), beta: new Vec3(0.7, 0, 0)),
            new("hull", MeshShapes.Hull(4), NearFieldImages.Passing(new Vec3(3, 1, 18), -18, new Vec3(0, -0.5, 0)), NearFieldImages.Glow),
        ];
        var layer = new NearFieldLayer(bodies, SpaceGrid.AtRestInHome(2, 16));
        var projection = new PerspectiveProjection(320, 200, Math.PI / 2);
        ShipState ship = ShipState.AtRest(new FourVector(0, 0.3, 0.2, 0.1)) with { Frame = new LorentzFrame(new Velocity(1.5, Vec3.UnitZ), Rotation.Identity) };
        (HdrFrame one, DisplayOverlay oneGuides) = NearFieldImages.RenderWithGuides(layer, projection, ship, Rotation.Identity, threads: 1);
        (HdrFrame two, DisplayOverlay twoGuides) = NearFieldImages.RenderWithGuides(layer, projection, ship, Rotation.Identity, threads: 2);
        HdrFrame again = NearFieldImages.Render(layer, projection, ship, Rotation.Identity, threads: 2);
        // Determinism is our own rule (DEVELOPERS.md): no pixel may depend on thread scheduling.
        Assert.Equal(one.Red, two.Red);
        Assert.Equal(one.Green, two.Green);
        Assert.Equal(one.Blue, again.Blue);
        Assert.Equal(oneGuides.Pixels, twoGuides.Pixels);
        Assert.True(one.Red.Sum() > 0);
        Assert.Contains(oneGuides.Pixels, code => code != 0);
    }

    [Fact]
    public void WholeFrameWithBodiesAndGridIsTheSameForOneOrTwoThreads()
    {
        // Determinism is our own rule (DEVELOPERS.md): metering the surfaces, laying them over the stars and drawing the
        // grid over both must not depend on scheduling.
        NearFieldLayer Layer() => new(
        [
            Ball(new Vec3(-3, 0, 20), beta: new Vec3(0.7, 0, 0)),
            new("hull", MeshShapes.Hull(4), NearFieldImages.Passing(new Vec3(3, 1, 18), -18, new Vec3(0, -0.5, 0)), NearFieldImages.Glow),
        ], SpaceGrid.AtRestInHome(2, 16));
        var scene = new Scene(Optics.StarCatalog.Procedural(3000, 5));
        ShipState ship = ShipState.AtRest(new FourVector(0, 0.3, 0.2, 0.1)) with { Frame = new LorentzFrame(new Velocity(1.5, Vec3.UnitZ), Rotation.Identity) };
        var camera = new Camera(ProjectionKind.Perspective, 321, 200, Math.PI / 2, 0, Exposure.Auto);
        byte[] Render(int threads)
        {
            var renderer = new FrameRenderer(threads);
            renderer.Layers.Add(Layer());
            return renderer.Render(scene, new Observer(ship, Rotation.Identity), camera).ReadOnlyPixels.ToArray();
        }
        byte[] one = Render(1);
        Assert.Equal(one, Render(2));
        Assert.Contains(one, b => b is > 30 and < 255);
    }


    [Fact]
    public void BodiesDrawnFrameAfterFrameLeaveNothingBehindThem()
    {
        // The surface layer keeps its planes between frames and empties the tiles it drew only as the next frame fills
        // each band (our own design): a body moving across the view must look in every frame as it does when drawn afresh.
        NearFieldLayer Layer() => new([Ball(new Vec3(-2, 0, 12), beta: new Vec3(0.5, 0.1, 0))], SpaceGrid.AtRestInHome(2, 12));
        var scene = new Scene(Optics.StarCatalog.Procedural(2000, 9));
        var camera = new Camera(ProjectionKind.Perspective, 257, 160, Math.PI / 2, 0, Exposure.Manual(0));
        var renderer = new FrameRenderer(2);
        renderer.Layers.Add(Layer());
        var image = new RgbaImage(257, 160);
        for (int frame = 0; frame < 5; frame++)
        {
            // A few pixels a frame, so that each frame draws over tiles the last one drew; frame 3 looks away from the
            // body and draws no surface at all, so the next frame starts from nothing drawn.
            Rotation look = frame == 3 ? Rotation.FromAxisAngle(Vec3.UnitY, Math.PI) : Rotation.Identity;
            var observer = new Observer(NearFieldImages.ShipAtRest(time: 0.5 * frame), look);
            var fresh = new FrameRenderer(1);
            fresh.Layers.Add(Layer());
            byte[] expected = fresh.Render(scene, observer, camera).ReadOnlyPixels.ToArray();
            renderer.Render(scene, observer, camera, image);
            Assert.True(expected.AsSpan().SequenceEqual(image.Pixels), $"frame {frame} differs from a fresh render");
        }
    }
    [Fact]
    public void GridAheadOfAFastShipIsBluerAndBrighterThanBehindIt()
    {
        var grid = new NearFieldLayer([], SpaceGrid.AtRestInHome(1, 8));
        var projection = new PerspectiveProjection(200, 200, Math.PI / 2);
        ShipState ship = ShipState.AtRest(new FourVector(0, 0.5, 0.5, 0.5)) with { Frame = new LorentzFrame(new Velocity(1, Vec3.UnitZ), Rotation.Identity) };
        DisplayOverlay ahead = NearFieldImages.RenderWithGuides(grid, projection, ship, Rotation.Identity).Guides;
        DisplayOverlay behind = NearFieldImages.RenderWithGuides(grid, projection, ship, Rotation.FromAxisAngle(Vec3.UnitY, Math.PI)).Guides;
        // Rybicki & Lightman (1979) ch. 4: a blackbody seen with Doppler factor D is a blackbody at D·T, brighter and
        // bluer ahead (D up to e^φ) and fainter and redder behind (down to e^−φ). The lines are display codes:
        // decoded with the IEC 61966-2-1 transfer function, they compare as (tone-mapped) linear light.
        double Light(DisplayOverlay guides, int channel)
        {
            double sum = 0;
            for (int y = 0; y < guides.Height; y++)
                for (int x = 0; x < guides.Width; x++) sum += SrgbTransfer.Decode(guides.Code(x, y, channel) / 255.0);
            return sum;
        }
        double aheadLight = Light(ahead, 0) + Light(ahead, 1) + Light(ahead, 2), behindLight = Light(behind, 0) + Light(behind, 1) + Light(behind, 2);
        Assert.True(aheadLight > 5 * behindLight, $"ahead {aheadLight}, behind {behindLight}");
        Assert.True(Light(ahead, 2) / Light(ahead, 0) > Light(behind, 2) / Light(behind, 0));
    }

    [Theory]
    [InlineData(ProjectionKind.Perspective)]
    [InlineData(ProjectionKind.Domemaster)]
    public void GridLinesAreDrawnWhereverTheirPointsAppear(ProjectionKind kind)
    {
        // Where each lattice point is seen comes from the closed-form retarded sight (checked against the aberration
        // formulas in RestFrameSightTests); the drawn lines must pass through those places to within about a pixel,
        // however the lines were cut to the view and sampled.
        var grid = SpaceGrid.AtRestInHome(1, 6);
        ShipState ship = ShipState.AtRest(new FourVector(0, 0.3, 0.2, 0.1)) with { Frame = new LorentzFrame(new Velocity(1.5, new Vec3(0.6, 0, 0.8)), Rotation.Identity) };
        Rotation cameraToShip = NearFieldImages.LookingAlong(new Vec3(1, 0.4, 0.2));
        Projection projection = new Camera(kind, 240, kind == ProjectionKind.Domemaster ? 240 : 160, kind == ProjectionKind.Domemaster ? Math.PI : Math.PI / 3, 0, Exposure.Auto).CreateProjection();
        DisplayOverlay lines = NearFieldImages.RenderWithGuides(new NearFieldLayer([], grid), projection, ship, cameraToShip).Guides;
        RestFrameSight sight = RestFrameSight.Of(grid.Origin, grid.Frame, ship, cameraToShip);
        Vec3 camera = sight.CameraEvent.Space;
        int checkedPoints = 0;
        var latticeLines = new List<(Vec3 From, Vec3 To)>();
        grid.LinesAround(camera, latticeLines);
        foreach ((Vec3 from, Vec3 to) in latticeLines)
            for (int k = 0; k <= 40; k++)
            {
                Vec3 point = from + k / 40.0 * (to - from);
                // Only where the line is at full brightness (inside the fade), and away from the image's edge.
                if (grid.Fade((point - camera).Length) < 1) continue;
                if (!projection.TryProject(sight.See(point).Direction, out double x, out double y)) continue;
                int px = (int)x, py = (int)y;
                if (px < 2 || py < 2 || px >= projection.Width - 2 || py >= projection.Height - 2) continue;
                bool drawn = false;
                for (int dy = -1; dy <= 1; dy++)
                    for (int dx = -1; dx <= 1; dx++) drawn |= lines.Coverage(px + dx, py + dy) > 0;
                Assert.True(drawn, $"line point {point} seen at ({x:F1}, {y:F1}) is not drawn");
                checkedPoints++;
            }
        Assert.True(checkedPoints > 200, $"{checkedPoints} points checked");
    }

    [Fact]
    public void RightEdgeOfAnOddWidthFrameIsDrawnLikeTheRest()
    {
        // 203 px: every row ends in a partial eight-pixel group, which the surface fill and the line drawer handle a
        // pixel at a time; nothing may be lost there, nor spill into the next row.
        var projection = new PerspectiveProjection(203, 120, Math.PI / 2);
        ShipState ship = NearFieldImages.ShipAtRest();
        HdrFrame Draw(NearFieldLayer layer) => NearFieldImages.Render(layer, projection, ship, Rotation.Identity);

        // A sphere cut by the right edge and its mirror image cut by the left edge, where the rows' groups are whole:
        // a pinhole camera looking along its axis pictures the scene mirrored in the plane x = 0 as the mirror image
        // of its picture (Hartley & Zisserman, Multiple View Geometry, 2nd ed. (2004), §6.1: x = f X / Z). The faceted
        // spheres need not match facet for facet (facets may stray half a pixel from the true outline), so the
        // pictures are compared by area and by centroid to within a quarter pixel.
        HdrFrame right = Draw(NearFieldImages.Layer(Ball(new Vec3(9.6, 0.5, 10), radius: 1.2)));
        HdrFrame left = Draw(NearFieldImages.Layer(Ball(new Vec3(-9.6, 0.5, 10), radius: 1.2)));
        (double rightArea, double rightX, double rightY, _) = NearFieldImages.Moments(right, (x, y) => right.Luminance(x, y));
        (double leftArea, double leftX, double leftY, _) = NearFieldImages.Moments(left, (x, y) => left.Luminance(x, y));
        Assert.True(right.Luminance(projection.Width - 1, 60) > 0, "the sphere reaches the right edge");
        Assert.Equal(leftArea, rightArea, leftArea * 0.01);
        Assert.Equal(projection.Width - leftX, rightX, 0.25);
        Assert.Equal(leftY, rightY, 0.25);
        for (int y = 0; y < projection.Height; y++)
            for (int x = 0; x < 20; x++) Assert.Equal(0, right.Luminance(x, y));

        // Lattice lines where they cross the last, partial group of the rows: each point's image is drawn (its place
        // comes from the closed-form retarded sight, checked against the aberration formulas in RestFrameSightTests).
        var grid = SpaceGrid.AtRestInHome(1, 10);
        DisplayOverlay lines = NearFieldImages.RenderWithGuides(new NearFieldLayer([], grid), projection, ship, Rotation.Identity).Guides;
        RestFrameSight sight = RestFrameSight.Of(grid.Origin, grid.Frame, ship, Rotation.Identity);
        int checkedPoints = 0;
        var latticeLines = new List<(Vec3 From, Vec3 To)>();
        grid.LinesAround(sight.CameraEvent.Space, latticeLines);
        foreach ((Vec3 from, Vec3 to) in latticeLines)
            for (int k = 0; k <= 200; k++)
            {
                Vec3 point = from + k / 200.0 * (to - from);
                // Clear of the faint ends, where the fade takes a line's colour to zero.
                if (grid.Fade((point - sight.CameraEvent.Space).Length) < 0.1) continue;
                if (!projection.TryProject(sight.See(point).Direction, out double x, out double y)) continue;
                int px = (int)x, py = (int)y;
                if (px < projection.Width - 3 || px >= projection.Width || py < 1 || py >= projection.Height - 1) continue;
                bool drawn = false;
                for (int dy = -1; dy <= 1; dy++)
                    for (int dx = -1; dx <= 1 && px + dx < projection.Width; dx++) drawn |= lines.Coverage(px + dx, py + dy) > 0;
                Assert.True(drawn, $"line point {point} seen at ({x:F1}, {y:F1}) is not drawn");
                checkedPoints++;
            }
        Assert.True(checkedPoints > 50, $"{checkedPoints} points checked");
    }
}
