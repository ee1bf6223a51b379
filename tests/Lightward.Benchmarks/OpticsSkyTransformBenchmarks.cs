using BenchmarkDotNet.Attributes;
using Lightward.Optics;
using Lightward.Spacetime;

namespace Lightward.Benchmarks;

/// <summary>
/// The per-frame star pass over the full Hipparcos catalogue (118 216 stars), vectorized on both cores.
/// Goals: ≤ 1.5 ms per frame, and rapidity 3 within ~1.15× the cost at rest (the ratio column).
/// </summary>
[MemoryDiagnoser]
public class OpticsSkyTransformSpeedBenchmarks
{
    private readonly StarCatalog catalog = StarCatalog.LoadHipparcos();
    private readonly ApparentStars output = new();
    private readonly SkyTransform transform = new();
    private static readonly Rotation Orientation = Rotation.FromAxisAngle(new Vec3(1, 2, 3), 0.7);

    [Benchmark(Baseline = true)]
    public void AtRest() => transform.Apply(catalog, new LorentzFrame(Velocity.Rest, Orientation), output);

    [Benchmark]
    public void AtRapidity3() => transform.Apply(catalog, new LorentzFrame(new Velocity(3, new Vec3(0.6, 0, 0.8)), Orientation), output);
}

/// <summary>The same pass as a plain scalar loop (baseline) and with <c>Vector&lt;float&gt;</c>, both on both cores, at rapidity 3.</summary>
[MemoryDiagnoser]
public class OpticsSkyTransformSimdBenchmarks
{
    private readonly StarCatalog catalog = StarCatalog.LoadHipparcos();
    private readonly ApparentStars output = new();
    private readonly SkyTransform scalar = new(vectorized: false);
    private readonly SkyTransform vectorized = new();
    private static readonly LorentzFrame Frame = new(new Velocity(3, new Vec3(0.6, 0, 0.8)), Rotation.FromAxisAngle(new Vec3(1, 2, 3), 0.7));

    [Benchmark(Baseline = true)]
    public void Scalar() => scalar.Apply(catalog, Frame, output);

    [Benchmark]
    public void Vectorized() => vectorized.Apply(catalog, Frame, output);
}
