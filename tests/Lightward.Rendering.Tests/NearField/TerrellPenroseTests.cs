using Lightward.Rendering.NearField;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

/// <summary>The classic appearance results, measured on rendered images.</summary>
public class TerrellPenroseTests
{
    [Theory]
    [InlineData(0.0)]
    [InlineData(0.6)]
    [InlineData(0.9)]
    [InlineData(0.99)]
    public void SphereOutlineStaysACircleAtAnySpeed(double beta)
    {
        // A sphere of radius 1 ls passing 20 ls from the camera, seen as its light arrives from straight across its path.
        var sphere = new NearFieldBody("ball", MeshShapes.Sphere(1, bands: 32), NearFieldImages.Passing(new Vec3(0, 20, 0), -20, new Vec3(beta, 0, 0)), NearFieldImages.Glow);
        NearFieldLayer layer = NearFieldImages.Layer(sphere);
        ShipState ship = NearFieldImages.ShipAtRest();
        BodyAppearance seen = layer.Look(ship, Rotation.Identity)[0].Appearance!.Value;
        var projection = new PerspectiveProjection(400, 400, 12 * Math.PI / 180);
        HdrFrame frame = NearFieldImages.Render(layer, projection, ship, NearFieldImages.LookingAlong(seen.Direction));

        var (area, _, _, axisRatio) = NearFieldImages.Moments(frame, (x, y) => frame.Luminance(x, y) > 0 ? 1 : 0);
        // Penrose (1959), Proc. Camb. Phil. Soc. 55, 137: the outline of a sphere is a circle for every observer.
        // A picture of the Lorentz-contracted sphere would have axis ratio 1/γ (0.8 at β = 0.6, 0.44 at 0.9, 0.14 at 0.99).
        Assert.InRange(axisRatio, 0.985, 1.0);
        Assert.True(area > 1000, $"sphere covers {area} pixels");
    }

    [Fact]
    public void SphereAngularSizeAtRestMatchesGeometry()
    {
        var sphere = new NearFieldBody("ball", MeshShapes.Sphere(1, bands: 48), NearFieldImages.Passing(new Vec3(0, 0, 20), 0, Vec3.Zero), NearFieldImages.Glow);
        NearFieldLayer layer = NearFieldImages.Layer(sphere);
        var projection = new PerspectiveProjection(400, 400, 12 * Math.PI / 180);
        HdrFrame frame = NearFieldImages.Render(layer, projection, NearFieldImages.ShipAtRest(), Rotation.Identity);
        var (area, cx, cy, _) = NearFieldImages.Moments(frame, (x, y) => Math.Min(1, frame.Luminance(x, y) / NearFieldImages.MaxLuminance(frame)));
        // Elementary geometry: a sphere of radius r at distance d fills a cone of half-angle asin(r/d); on a flat screen
        // centred on it that is a disc of radius f·tan(asin(r/d)).
        double radius = projection.FocalLength * Math.Tan(Math.Asin(1.0 / 20));
        Assert.Equal(Math.PI * radius * radius, area, Math.PI * radius * radius * 0.01);
        Assert.Equal(200, cx, 0.05);
        Assert.Equal(200, cy, 0.05);
    }

    [Theory]
    [InlineData(0.3)]
    [InlineData(0.6)]
    [InlineData(0.8)]
    public void PassingCubeShowsItsTrailingFaceAsIfTurnedByArcsinBeta(double beta)
    {
        // Faces +X, −X, +Y, −Y, +Z, −Z: the camera-facing side (−Y) is red, the trailing side (−X) green, the rest blue.
        SurfaceTint red = new(1, 0, 0), green = new(0, 1, 0), blue = new(0, 0, 1);
        TriangleMesh cube = MeshShapes.Box(new Vec3(1, 1, 1), [blue, green, blue, red, blue, blue], tilesPerEdge: 4);
        // Moving along +X, 600 ls away (small: perspective changes the face widths by ~size/distance), its light
        // arriving from straight across its path (+Y) at the camera's time 0.
        var body = new NearFieldBody("cube", cube, NearFieldImages.Passing(new Vec3(0, 600, 0), -600, new Vec3(beta, 0, 0)), NearFieldImages.Glow);
        NearFieldLayer layer = NearFieldImages.Layer(body);
        ShipState ship = NearFieldImages.ShipAtRest();
        var projection = new PerspectiveProjection(500, 500, 0.2 * Math.PI / 180);
        HdrFrame frame = NearFieldImages.Render(layer, projection, ship, NearFieldImages.LookingAlong(Vec3.UnitY));

        // Each face's area in pixels: its channel's sum over the value a fully covered pixel has (both faces are seen with
        // the centre's Doppler factor to within 1e-4, and D·T sets different red and green levels).
        BodyAppearance seen = layer.LastViews[0].Appearance!.Value;
        var fullPixel = SurfaceShader.OfLuminance(NearFieldImages.Glow.Temperature, NearFieldImages.Glow.Luminance, projection.ReferencePixelSolidAngle).Shade(seen.Doppler);
        double redArea = frame.Red.Sum() / fullPixel.X, greenArea = frame.Green.Sum() / fullPixel.Y;
        double trailingFraction = greenArea / (redArea + greenArea);
        // Terrell (1959), Phys. Rev. 116, 1041: a small object seen at closest approach appears rotated by θ with
        // sin θ = β. A cube turned by θ shows its front face with width cos θ and its trailing face with width sin θ
        // (both with the same height), so the trailing face takes β / (β + 1/γ) of the picture.
        double gammaInverse = Math.Sqrt(1 - beta * beta);
        Assert.Equal(beta / (beta + gammaInverse), trailingFraction, 0.005);
        Assert.Equal(Math.Asin(beta), seen.ApparentRotation, 1e-3);
    }
}
