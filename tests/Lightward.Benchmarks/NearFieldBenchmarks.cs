using BenchmarkDotNet.Attributes;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.NearField;
using Lightward.Spacetime;

namespace Lightward.Benchmarks;

/// <summary>
/// What the near field adds to a 1080p frame: three passing bodies plus the grid of space. Goal: ≤ 4 ms added with
/// three bodies of ≥ 2,000 triangles each. <see cref="Bands"/> sets the sphere detail (4·b² − 4·b triangles each:
/// 24 → 2,208; 48 → 9,024; 96 → 36,480) to show how the cost grows with the triangle count. The layer alone
/// (bodies, grid) is timed on its own HDR frame; <see cref="FrameWithEmptyNearField"/> shows what any layer costs the
/// frame before it draws anything (the frame then goes through the band-by-band composite pass, stars splatted into
/// band buffers and tone-mapped from there, instead of the stars-only pass).
/// </summary>
[MemoryDiagnoser]
public class NearFieldBenchmarks
{
    private readonly RgbaImage _image = new(1920, 1080);
    private FrameRenderer _plain = null!, _withNearField = null!;
    private Scene _scene = null!;
    private Observer _observer;
    private FrameRenderer _withEmptyLayer = null!;
    private NearFieldLayer _bodiesOnly = null!, _gridOnly = null!;
    private HdrFrame _hdr = null!;
    private DisplayOverlay _guides = null!;
    private Rendering.Projections.Projection _projection = null!;

    [Params(24, 48, 96)]
    public int Bands { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        _scene = new Scene(StarCatalog.Procedural(100_000, 7));
        // A ship at rest at the origin looking along +Z; three glowing spheres 20 ls ahead cross the view at 0.3, 0.6 and 0.9 c.
        _observer = new Observer(ShipState.AtRest(new FourVector(0, 0, 0, 0)), Rotation.Identity);
        var surface = new BodySurface(SurfaceKind.Glowing, 6500, 50, Vec3.UnitZ);
        NearFieldBody[] bodies = new[] { -6.0, 0.0, 6.0 }.Select((x, i) => new NearFieldBody($"ball {i}", MeshShapes.Sphere(1.5, Bands),
            new InertialWorldline(new FourVector(-20, x, 0, 20), Velocity.FromBeta(new Vec3(0.3 * (i + 1), 0, 0))), surface)).ToArray();
        SpaceGrid grid = SpaceGrid.AtRestInHome(2, 20);
        Camera camera = RenderBenchmarkScenes.Perspective1080;
        _plain = new FrameRenderer();
        _withNearField = new FrameRenderer();
        _withNearField.Layers.Add(new NearFieldLayer(bodies, grid));
        _withEmptyLayer = new FrameRenderer();
        _withEmptyLayer.Layers.Add(new NearFieldLayer([], null));
        _bodiesOnly = new NearFieldLayer(bodies, null);
        _gridOnly = new NearFieldLayer([], grid);
        _projection = camera.CreateProjection();
        _hdr = new HdrFrame(1920, 1080);
        _guides = new DisplayOverlay(1920, 1080);
        _plain.Render(_scene, _observer, camera, _image);
        _withNearField.Render(_scene, _observer, camera, _image);
        _withEmptyLayer.Render(_scene, _observer, camera, _image);
    }

    [Benchmark(Baseline = true)]
    public void FrameWithoutNearField() => _plain.Render(_scene, _observer, RenderBenchmarkScenes.Perspective1080, _image);

    [Benchmark]
    public void FrameWithBodiesAndGrid() => _withNearField.Render(_scene, _observer, RenderBenchmarkScenes.Perspective1080, _image);

    [Benchmark]
    public void FrameWithEmptyNearField() => _withEmptyLayer.Render(_scene, _observer, RenderBenchmarkScenes.Perspective1080, _image);

    [Benchmark]
    public void BodiesAlone() => _bodiesOnly.Draw(_hdr, _guides, _projection, _observer.Ship, Rotation.Identity, new ParallelOptions());

    [Benchmark]
    public void GridAlone() => _gridOnly.Draw(_hdr, _guides, _projection, _observer.Ship, Rotation.Identity, new ParallelOptions());
}
