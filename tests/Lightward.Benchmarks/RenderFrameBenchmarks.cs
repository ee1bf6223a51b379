using BenchmarkDotNet.Attributes;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;
using SkiaSharp;

namespace Lightward.Benchmarks;

/// <summary>Scenes and observers shared by the render benchmarks.</summary>
internal static class RenderBenchmarkScenes
{
    /// <summary>A ship flying nose first with rapidity <paramref name="rapidity"/>, turned away from the home axes.</summary>
    public static Observer Coasting(double rapidity)
    {
        Rotation orientation = Rotation.FromAxisAngle(new Vec3(0.3, -0.2, 0.93), 0.5);
        var frame = new LorentzFrame(new Velocity(rapidity, orientation.Rotate(Vec3.UnitZ)), orientation);
        return new Observer(ShipState.AtRest(default) with { Frame = frame }, Rotation.Identity);
    }

    public static Camera Perspective1080 => new(ProjectionKind.Perspective, 1920, 1080, Math.PI / 2, 0, Exposure.Auto);
}

/// <summary>
/// One 1920×1080 perspective frame of the full Hipparcos sky with the CMB stage on. Goals: median ≤ 8 ms; ≥ 30× faster
/// than drawing every star with SkiaSharp's DrawCircle (the baseline: the same culled optics, then one anti-aliased
/// circle per star in front of the camera). <see cref="PipelineAtRest"/> renders the same view over and over, so
/// each frame writes black only where the last one was lit; <see cref="PipelineTurning"/> turns the view 0.2° every
/// frame (12°/s at 60 fps), as in live flight, so each frame also blacks out the stars the last one showed.
/// <see cref="BlackFrameFloor"/> is what writing all 1920×1080 pixels black on all cores costs, for comparison.
/// The cost of speed is in <see cref="RelativisticCostBenchmarks"/>.
/// </summary>
[MemoryDiagnoser]
public class RenderFrameBenchmarks
{
    private Scene _scene = null!;
    private readonly FrameRenderer _renderer = new();
    private readonly RgbaImage _image = new(1920, 1080);
    /// <summary>What the baseline and the floor write: taking an image's pixels drops the renderer's note of its lit groups, which would cost the pipeline's next frame.</summary>
    private readonly RgbaImage _baselineImage = new(1920, 1080);
    private readonly Observer _rest = RenderBenchmarkScenes.Coasting(0);
    private readonly Observer[] _turning = [.. new[] { -0.1, 0.1 }.Select(degrees => RenderBenchmarkScenes.Coasting(0) with { Look = Rotation.FromAxisAngle(Vec3.UnitY, degrees * Math.PI / 180) })];
    private int _turn;

    // The baseline's own state: the same optics, then one anti-aliased circle per star.
    private readonly SkyTransform _skyTransform = new();
    private readonly ApparentStars _stars = new();
    private SKSurface _surface = null!;
    private readonly SKPaint _paint = new() { IsAntialias = true, Style = SKPaintStyle.Fill };
    private Projection _projection = null!;

    [GlobalSetup]
    public void Setup()
    {
        _scene = new Scene(StarCatalog.LoadHipparcos());
        _surface = SKSurface.Create(new SKImageInfo(1920, 1080, SKColorType.Rgba8888, SKAlphaType.Premul));
        _projection = RenderBenchmarkScenes.Perspective1080.CreateProjection();
        _renderer.Render(_scene, _rest, RenderBenchmarkScenes.Perspective1080, _image);
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        _surface.Dispose();
        _paint.Dispose();
    }

    [Benchmark(Baseline = true)]
    public unsafe void SkiaCirclePerStar()
    {
        _skyTransform.Apply(_scene.Sky, _rest.Ship.Frame, _stars, new ViewCone(Vec3.UnitZ, _projection.EnclosingHalfAngle, _projection.EdgePlanes), new ParallelOptions());
        SKCanvas canvas = _surface.Canvas;
        canvas.Clear(SKColors.Black);
        const float exposure = 64;
        for (int i = 0; i < _stars.Count; i++)
        {
            if (!_projection.TryProject(new Vec3(_stars.X[i], _stars.Y[i], _stars.Z[i]), out double x, out double y)) continue;
            float r = _stars.R[i] * exposure, g = _stars.G[i] * exposure, b = _stars.B[i] * exposure;
            float peak = MathF.Max(r, MathF.Max(g, b));
            float radius = 0.6f * MathF.Sqrt(MathF.Max(peak, 1));
            float scale = 255 / MathF.Max(peak, 1);
            _paint.Color = new SKColor((byte)MathF.Min(255, r * scale), (byte)MathF.Min(255, g * scale), (byte)MathF.Min(255, b * scale));
            canvas.DrawCircle((float)x, (float)y, radius, _paint);
        }
        fixed (byte* pixels = _baselineImage.Pixels)
            _surface.ReadPixels(new SKImageInfo(1920, 1080, SKColorType.Rgba8888, SKAlphaType.Premul), (IntPtr)pixels, 1920 * 4, 0, 0);
    }

    [Benchmark]
    public void PipelineAtRest() => _renderer.Render(_scene, _rest, RenderBenchmarkScenes.Perspective1080, _image);

    [Benchmark]
    public void PipelineTurning() => _renderer.Render(_scene, _turning[_turn ^= 1], RenderBenchmarkScenes.Perspective1080, _image);

    [Benchmark]
    public void BlackFrameFloor() =>
        Parallel.For(0, 1080 / StarSplatter.BandHeight + 1, band =>
        {
            int firstRow = band * StarSplatter.BandHeight, rows = Math.Min(StarSplatter.BandHeight, 1080 - firstRow);
            if (rows > 0) System.Runtime.InteropServices.MemoryMarshal.Cast<byte, uint>(_baselineImage.Pixels.Slice(firstRow * 1920 * 4, rows * 1920 * 4)).Fill(0xFF000000u);
        });
}

/// <summary>
/// What speed costs: the same Hipparcos sky (CMB stage on) at rest (each group's baseline) and at rapidity 3. Goal:
/// rapidity 3 within 1.15× of rest. In the 1920×1080 perspective view, aberration gathers most of the sky into the
/// view at speed (about 116k stars against 14k at rest, whose off-view sky cells are culled), so that ratio also
/// counts the extra stars; the 2160×1080 equirectangular view shows every star at both speeds, so its ratio is the
/// cost of the relativistic optics and crowding alone.
/// </summary>
[MemoryDiagnoser]
[GroupBenchmarksBy(BenchmarkDotNet.Configs.BenchmarkLogicalGroupRule.ByCategory)]
[CategoriesColumn]
public class RelativisticCostBenchmarks
{
    private Scene _scene = null!;
    private readonly FrameRenderer _renderer = new();
    private readonly RgbaImage _perspectiveImage = new(1920, 1080), _fullSkyImage = new(2160, 1080);
    private readonly Observer _rest = RenderBenchmarkScenes.Coasting(0), _fast = RenderBenchmarkScenes.Coasting(3);
    private static readonly Camera FullSky = new(ProjectionKind.Equirectangular, 2160, 1080, 2 * Math.PI, 0, Exposure.Auto);

    [GlobalSetup]
    public void Setup() => _scene = new Scene(StarCatalog.LoadHipparcos());

    [Benchmark(Baseline = true), BenchmarkCategory("Perspective")]
    public void PerspectiveAtRest() => _renderer.Render(_scene, _rest, RenderBenchmarkScenes.Perspective1080, _perspectiveImage);

    [Benchmark, BenchmarkCategory("Perspective")]
    public void PerspectiveAtRapidity3() => _renderer.Render(_scene, _fast, RenderBenchmarkScenes.Perspective1080, _perspectiveImage);

    [Benchmark(Baseline = true), BenchmarkCategory("FullSky")]
    public void FullSkyAtRest() => _renderer.Render(_scene, _rest, FullSky, _fullSkyImage);

    [Benchmark, BenchmarkCategory("FullSky")]
    public void FullSkyAtRapidity3() => _renderer.Render(_scene, _fast, FullSky, _fullSkyImage);
}

/// <summary>A 4096×4096 180° domemaster of the Hipparcos sky (goal ≤ 100 ms), and the same size filled by the CMB glow ahead (φ = 12, 0.05° aperture).</summary>
[MemoryDiagnoser]
public class RenderDomeBenchmarks
{
    private Scene _scene = null!;
    private readonly FrameRenderer _renderer = new();
    private readonly RgbaImage _image = new(4096, 4096);
    private static readonly Camera Dome = new(ProjectionKind.Domemaster, 4096, 4096, Math.PI, 0, Exposure.Auto);
    private static readonly Camera GlowDome = Dome with { FieldOfView = 0.05 * Math.PI / 180, DomeTilt = Math.PI / 2 };

    [GlobalSetup]
    public void Setup() => _scene = new Scene(StarCatalog.LoadHipparcos());

    [Benchmark(Baseline = true)]
    public void DomeAtRest() => _renderer.Render(_scene, RenderBenchmarkScenes.Coasting(0), Dome, _image);

    [Benchmark]
    public void DomeFullOfBackgroundGlow() => _renderer.Render(_scene, RenderBenchmarkScenes.Coasting(12), GlowDome, _image);
}

/// <summary>Frame cost against star count: procedural skies of 10k (baseline), 100k and 1M stars, 1920×1080 perspective.</summary>
[MemoryDiagnoser]
public class RenderStarCountBenchmarks
{
    private readonly FrameRenderer _renderer = new();
    private readonly RgbaImage _image = new(1920, 1080);
    private Scene _tenThousand = null!, _hundredThousand = null!, _million = null!;
    private readonly Observer _observer = RenderBenchmarkScenes.Coasting(1);

    [GlobalSetup]
    public void Setup()
    {
        _tenThousand = new Scene(StarCatalog.Procedural(10_000, 1));
        _hundredThousand = new Scene(StarCatalog.Procedural(100_000, 1));
        _million = new Scene(StarCatalog.Procedural(1_000_000, 1));
    }

    [Benchmark(Baseline = true)]
    public void Stars10k() => _renderer.Render(_tenThousand, _observer, RenderBenchmarkScenes.Perspective1080, _image);

    [Benchmark]
    public void Stars100k() => _renderer.Render(_hundredThousand, _observer, RenderBenchmarkScenes.Perspective1080, _image);

    [Benchmark]
    public void Stars1M() => _renderer.Render(_million, _observer, RenderBenchmarkScenes.Perspective1080, _image);
}
