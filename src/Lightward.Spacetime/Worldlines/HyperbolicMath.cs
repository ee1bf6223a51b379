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

    /// <summary>cosh φ − 1 = 2 sinh²(φ/2), exact near rest.</summary>
    public static double CoshMinusOne(double phi)
    {
        double half = Math.Sinh(phi / 2);
        return 2 * half * half;
    }
}
