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

    public CompensatedEvent Add(FourVector step)
    {
        (double t, double tl) = TwoSum(High.T, step.T);
        (double x, double xl) = TwoSum(High.X, step.X);
        (double y, double yl) = TwoSum(High.Y, step.Y);
        (double z, double zl) = TwoSum(High.Z, step.Z);
        FourVector low = new(Low.T + tl, Low.X + xl, Low.Y + yl, Low.Z + zl);
        // Fold the low part back in so it stays small against the high part.
        (t, tl) = TwoSum(t, low.T);
        (x, xl) = TwoSum(x, low.X);
        (y, yl) = TwoSum(y, low.Y);
        (z, zl) = TwoSum(z, low.Z);
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
}
