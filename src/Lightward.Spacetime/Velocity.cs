namespace Lightward.Spacetime;

/// <summary>
/// A velocity kept as rapidity φ ≥ 0 along a unit direction, never as β alone, so that γ, β and 1 − β stay exact
/// from rest up to φ = 25 and beyond (γ ≈ 3.6e10). Velocities compose by adding rapidities along the current
/// direction, which is exact for collinear boosts and free of cancellation when a fast ship brakes back to rest.
/// </summary>
public readonly record struct Velocity(double Rapidity, Vec3 Direction)
{
    public static readonly Velocity Rest = new(0, Vec3.UnitZ);

    /// <summary>From a proper velocity u = γβ (c = 1).</summary>
    public static Velocity FromProperVelocity(Vec3 u)
    {
        double length = u.Length;
        return length > 0 ? new Velocity(Math.Asinh(length), u / length) : Rest;
    }

    /// <summary>From a coordinate velocity β (|β| &lt; 1).</summary>
    public static Velocity FromBeta(Vec3 beta)
    {
        double speed = beta.Length;
        if (!(speed < 1)) throw new ArgumentOutOfRangeException(nameof(beta), "speed must be below c");
        return speed > 0 ? new Velocity(Math.Atanh(speed), beta / speed) : Rest;
    }

    public double Gamma => Math.Cosh(Rapidity);
    public double Beta => Math.Tanh(Rapidity);
    /// <summary>|u| = γβ = sinh φ.</summary>
    public double ProperSpeed => Math.Sinh(Rapidity);
    /// <summary>1 − β = e^(−φ) / cosh φ, never by subtraction.</summary>
    public double OneMinusBeta => Math.Exp(-Rapidity) / Math.Cosh(Rapidity);
    public Vec3 ProperVelocity => ProperSpeed * Direction;
    public Vec3 BetaVector => Beta * Direction;
    public FourVector FourVelocity => new(Gamma, ProperVelocity);

    /// <summary>
    /// The pure boost by this velocity: maps coordinates of the comoving frame (axes parallel to home axes)
    /// to home coordinates.
    /// </summary>
    public FourVector BoostToHome(FourVector comoving) => Boost(comoving, Rapidity);

    /// <summary>The inverse pure boost: home coordinates → comoving coordinates (axes parallel to home axes).</summary>
    public FourVector BoostFromHome(FourVector home) => Boost(home, -Rapidity);

    private FourVector Boost(FourVector v, double rapidity)
    {
        Vec3 n = Direction;
        double sinh = Math.Sinh(rapidity), cosh = Math.Cosh(rapidity);
        double along = Vec3.Dot(n, v.Space);
        // cosh φ − 1 written as sinh φ · tanh(φ/2) keeps full precision near rest.
        double coshMinusOne = sinh * Math.Tanh(rapidity / 2);
        return new FourVector(cosh * v.T + sinh * along, v.Space + (sinh * v.T + coshMinusOne * along) * n);
    }

    /// <summary>
    /// Composes pure boosts: B(this) · B(v) = B(result) · W, with <paramref name="v"/> the proper velocity of the
    /// second boost in this velocity's comoving axes. W is the Thomas–Wigner rotation, returned exactly
    /// (it is the identity when the boosts are collinear).
    /// </summary>
    public (Velocity Result, Rotation Wigner) Compose(Vec3 v)
    {
        Vec3 n = Direction;
        double phi = Rapidity;
        double alongV = Vec3.Dot(n, v);
        Vec3 across = v - alongV * n;
        double acrossSquared = across.LengthSquared;
        double w = Math.Sqrt(1 + acrossSquared);
        // The component along n is w·(cosh ψ, sinh ψ): boosting along n just adds ψ to φ.
        double summedRapidity = phi + Math.Asinh(alongV / w);
        double resultAlong = w * Math.Sinh(summedRapidity);
        Vec3 u = resultAlong * n + across;
        double resultProperSpeed = Math.Sqrt(resultAlong * resultAlong + acrossSquared);
        Velocity result = resultProperSpeed > 0
            ? new Velocity(Math.Asinh(resultProperSpeed), u / resultProperSpeed)
            : new Velocity(0, n);

        // Thomas–Wigner rotation: angle ε with tan(ε/2) = |u×v| / ((1+γu)(1+γv) + u·v), about the axis v×u.
        // Dividing through by (1+γu) leaves only tanh(φ/2), so nothing overflows at high rapidity.
        double halfTanh = Math.Tanh(phi / 2);
        double gammaV = Math.Sqrt(1 + v.LengthSquared);
        double scalar = 1 + gammaV + halfTanh * alongV;
        Vec3 axis = halfTanh * Vec3.Cross(v, n);
        Rotation wigner = new Rotation(scalar, axis.X, axis.Y, axis.Z).Normalized();
        return (result, wigner);
    }
}
