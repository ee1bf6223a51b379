namespace Lightward.Rendering;

/// <summary>
/// Precomputed point-spread kernels for stars too bright for a single bilinear sample. The profile is a Gaussian
/// core (σ = <see cref="CoreSigma"/> px) plus a glare halo falling off as (1 + r²/r_h²)^(−3/2) that carries
/// <see cref="HaloFraction"/> of the light, the shape of scattered light in an eye or lens at small angles (common
/// practice, no published source). Kernels come in growing radii, so a brighter star gets a wider footprint and its
/// halo shows further out, and in 4 × 4 sub-pixel phases, so the centroid lands within ⅛ px of the true position.
/// Every kernel sums to 1, so a splat deposits exactly the star's flux.
/// </summary>
public sealed class PointSpreadKernels
{
    public const float CoreSigma = 0.6f;
    public const float HaloRadius = 1.2f;
    public const float HaloFraction = 0.06f;
    public const int Phases = 4;

    /// <summary>Exposed display level below which light at a kernel's edge is invisible (a quarter of an 8-bit step near black).</summary>
    public const float InvisibleLevel = 1 / 4096f;

    public static readonly int[] Radii = [1, 2, 3, 4, 6, 8, 12, 16, 24, 32, 48, 64];

    public static PointSpreadKernels Shared { get; } = new();

    private readonly float[][] _weights;
    private readonly float[] _brightestForRadius;

    private PointSpreadKernels()
    {
        _weights = new float[Radii.Length * Phases * Phases][];
        _brightestForRadius = new float[Radii.Length];
        for (int size = 0; size < Radii.Length; size++)
        {
            for (int phaseY = 0; phaseY < Phases; phaseY++)
                for (int phaseX = 0; phaseX < Phases; phaseX++)
                    _weights[(size * Phases + phaseY) * Phases + phaseX] = Build(Radii[size], (phaseX + 0.5) / Phases, (phaseY + 0.5) / Phases);
            // The halo's value at the kernel's edge sets how bright a star this footprint can carry invisibly cut off.
            float[] centred = _weights[size * Phases * Phases];
            int radius = Radii[size], side = 2 * radius + 1;
            _brightestForRadius[size] = InvisibleLevel / centred[radius * side];
        }
    }

    /// <summary>
    /// The smallest kernel whose cut-off edge stays invisible for a star of exposed flux <paramref name="exposedFlux"/>
    /// (the biggest kernel for anything brighter).
    /// </summary>
    public int SizeFor(float exposedFlux)
    {
        for (int size = 0; size < Radii.Length - 1; size++)
            if (exposedFlux <= _brightestForRadius[size]) return size;
        return Radii.Length - 1;
    }

    /// <summary>Weights of a (2R+1)² kernel, row-major, for a star at sub-pixel phase (<paramref name="phaseX"/>, <paramref name="phaseY"/>) of its centre pixel.</summary>
    public float[] Weights(int size, int phaseX, int phaseY) => _weights[(size * Phases + phaseY) * Phases + phaseX];

    /// <summary>Phase index (0 … Phases−1) of a sub-pixel offset in [0, 1).</summary>
    public static int PhaseOf(float offset) => Math.Clamp((int)(offset * Phases), 0, Phases - 1);

    /// <summary>One kernel, sampled at pixel centres around a star at (offsetX, offsetY) within its centre pixel, normalised to sum 1.</summary>
    private static float[] Build(int radius, double offsetX, double offsetY)
    {
        int side = 2 * radius + 1;
        var profile = new double[side * side];
        double coreNorm = 1 / (2 * Math.PI * CoreSigma * CoreSigma);
        double haloNorm = 1 / (2 * Math.PI * HaloRadius * HaloRadius);
        double total = 0;
        for (int row = 0; row < side; row++)
            for (int column = 0; column < side; column++)
            {
                double dx = column - radius + 0.5 - offsetX, dy = row - radius + 0.5 - offsetY;
                double r2 = dx * dx + dy * dy;
                double core = coreNorm * Math.Exp(-r2 / (2 * CoreSigma * CoreSigma));
                double halo = haloNorm * Math.Pow(1 + r2 / (HaloRadius * HaloRadius), -1.5);
                double value = (1 - HaloFraction) * core + HaloFraction * halo;
                profile[row * side + column] = value;
                total += value;
            }
        var weights = new float[side * side];
        for (int i = 0; i < weights.Length; i++) weights[i] = (float)(profile[i] / total);
        return weights;
    }
}
