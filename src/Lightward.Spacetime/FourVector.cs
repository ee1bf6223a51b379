namespace Lightward.Spacetime;

/// <summary>
/// A four-vector (T, X, Y, Z) with c = 1 and metric signature (−, +, +, +).
/// Time and space share one unit (seconds and light-seconds inside the core).
/// </summary>
public readonly record struct FourVector(double T, double X, double Y, double Z)
{
    public FourVector(double t, Vec3 space) : this(t, space.X, space.Y, space.Z) { }

    public Vec3 Space => new(X, Y, Z);

    public static FourVector operator +(FourVector a, FourVector b) => new(a.T + b.T, a.X + b.X, a.Y + b.Y, a.Z + b.Z);
    public static FourVector operator -(FourVector a, FourVector b) => new(a.T - b.T, a.X - b.X, a.Y - b.Y, a.Z - b.Z);
    public static FourVector operator *(double s, FourVector a) => new(s * a.T, s * a.X, s * a.Y, s * a.Z);

    /// <summary>Minkowski inner product −a.T b.T + a·b.</summary>
    public static double Dot(FourVector a, FourVector b) => -a.T * b.T + a.X * b.X + a.Y * b.Y + a.Z * b.Z;

    /// <summary>Interval −T² + |x|² (negative for timelike separations).</summary>
    public double Interval => Dot(this, this);

    public bool IsFinite => double.IsFinite(T) && Space.IsFinite;

    public override string ToString() => FormattableString.Invariant($"[t={T:G12}, x={X:G12}, y={Y:G12}, z={Z:G12}]");
}
