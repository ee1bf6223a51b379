namespace Lightward.Spacetime;

/// <summary>Hyperbolic-function identities written so that nothing cancels at high rapidity or near rest.</summary>
internal static class HyperbolicMath
{
    /// <summary>asinh(y + δ) − asinh(y) without subtracting two large rapidities.</summary>
    public static double AsinhDifference(double y, double delta)
    {
        double x = y + delta;
        if (y == 0 || x == 0 || (x > 0) != (y > 0)) return Math.Asinh(x) - Math.Asinh(y);
        // asinh x − asinh y = asinh((x² − y²) / (x√(1+y²) + y√(1+x²))), with x² − y² = δ(x + y).
        return Math.Asinh(delta * (x + y) / (x * Math.Sqrt(1 + y * y) + y * Math.Sqrt(1 + x * x)));
    }

    /// <summary>acosh(1 + y) = 2 asinh(√(y/2)) for y ≥ 0, exact near y = 0 where 1 + y would round.</summary>
    public static double AcoshOnePlus(double y) => 2 * Math.Asinh(Math.Sqrt(y / 2));

    /// <summary>Largest |z| for which <see cref="AtanhSeries"/> is exact to rounding.</summary>
    public const double AtanhSeriesLimit = 1.0 / 2048;

    /// <summary>
    /// atanh z for |z| ≤ 2⁻¹¹ by its series z + z³/3 + z⁵/5 (Abramowitz &amp; Stegun 4.1.28, from memory:
    /// ln((1 + z)/(1 − z)) = 2(z + z³/3 + z⁵/5 + …)); the first term left out, z⁷/7, is below 2⁻⁶⁸ of the sum,
    /// far under rounding. Plain multiplies and adds with a short dependency chain, no library call.
    /// </summary>
    public static double AtanhSeries(double z)
    {
        double squared = z * z;
        return z + z * squared * (1.0 / 3 + squared * (1.0 / 5));
    }

    /// <summary>cosh φ − 1 = 2 sinh²(φ/2), exact near rest.</summary>
    public static double CoshMinusOne(double phi)
    {
        double half = Math.Sinh(phi / 2);
        return 2 * half * half;
    }
}
