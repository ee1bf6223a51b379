using System.Runtime.CompilerServices;

namespace Lightward.Spacetime;

/// <summary>
/// An event accumulated as an unevaluated sum hi + lo per component (Knuth's TwoSum), so that millions of small
/// steps far from the origin keep metre-level precision: at 1000 ly a plain double resolves only ~2 km.
/// </summary>
public readonly record struct CompensatedEvent(FourVector High, FourVector Low)
{
    public CompensatedEvent(FourVector start) : this(start, default) { }

    /// <summary>The event rounded to one double per component.</summary>
    public FourVector Value => High + Low;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public CompensatedEvent Add(FourVector step)
    {
        (double t, double tl) = TwoSum(High.T, step.T);
        (double x, double xl) = TwoSum(High.X, step.X);
        (double y, double yl) = TwoSum(High.Y, step.Y);
        (double z, double zl) = TwoSum(High.Z, step.Z);
        // Fold the low part back in so it stays within half a unit in the last place of the high part. The sum never
        // falls below the low part here (it is either exact after cancellation or much larger), so the shorter
        // FastTwoSum is exact (Dekker 1971; Hida, Li & Bailey 2001, double-double + double).
        (t, tl) = FastTwoSum(t, Low.T + tl);
        (x, xl) = FastTwoSum(x, Low.X + xl);
        (y, yl) = FastTwoSum(y, Low.Y + yl);
        (z, zl) = FastTwoSum(z, Low.Z + zl);
        return new CompensatedEvent(new FourVector(t, x, y, z), new FourVector(tl, xl, yl, zl));
    }

    /// <summary>This event minus <paramref name="origin"/>, with the low part added after the large terms cancel.</summary>
    public FourVector RelativeTo(FourVector origin) => (High - origin) + Low;

    private static (double Sum, double Error) TwoSum(double a, double b)
    {
        double sum = a + b;
        double bVirtual = sum - a;
        double error = (a - (sum - bVirtual)) + (b - bVirtual);
        return (sum, error);
    }

    /// <summary>Dekker's FastTwoSum: the exact rounding error of a + b when |a| ≥ |b| (or a = 0), in three operations instead of six.</summary>
    private static (double Sum, double Error) FastTwoSum(double a, double b)
    {
        double sum = a + b;
        return (sum, b - (sum - a));
    }
}
