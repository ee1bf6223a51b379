namespace Lightward.Spacetime;

/// <summary>
/// A velocity kept as rapidity φ ≥ 0 along a unit direction, never as β alone, so that γ, β and 1 − β stay exact
/// from rest up to φ = 25 and beyond (γ ≈ 3.6e10). Velocities compose by adding rapidities along the current
/// direction, which is exact for collinear boosts and free of cancellation when a fast ship brakes back to rest.
/// </summary>
public readonly record struct Velocity
{
    public static readonly Velocity Rest = new(0, Vec3.UnitZ);

    // sinh φ and cosh φ − 1, computed once: every boost and composition needs them, and cosh φ − 1 stored directly
    // keeps full precision near rest (and makes default(Velocity) a valid rest velocity).
    private readonly double _sinh, _coshMinusOne;

    public double Rapidity { get; }
    public Vec3 Direction { get; }

    public Velocity(double rapidity, Vec3 direction) : this(rapidity, direction, Math.Sinh(rapidity)) { }

    private Velocity(double rapidity, Vec3 direction, double sinh)
        // cosh φ − 1 = sinh²φ / (1 + cosh φ): one transcendental call; the half-angle form where sinh² would overflow.
        : this(rapidity, direction, sinh, Math.Abs(sinh) < 1e150 ? sinh * sinh / (1 + Math.Sqrt(1 + sinh * sinh)) : HyperbolicMath.CoshMinusOne(rapidity)) { }

    private Velocity(double rapidity, Vec3 direction, double sinh, double coshMinusOne)
    {
        Rapidity = rapidity;
        Direction = direction;
        _sinh = sinh;
        _coshMinusOne = coshMinusOne;
    }

    public void Deconstruct(out double rapidity, out Vec3 direction) => (rapidity, direction) = (Rapidity, Direction);

    /// <summary>From a proper speed |u| = sinh φ along a unit direction, without a round trip through asinh and sinh.</summary>
    private static Velocity FromProperSpeed(double properSpeed, Vec3 direction) => new(Math.Asinh(properSpeed), direction, properSpeed);

    /// <summary>From a proper velocity u = γβ (c = 1).</summary>
    public static Velocity FromProperVelocity(Vec3 u)
    {
        double length = u.Length;
        return length > 0 ? FromProperSpeed(length, u / length) : Rest;
    }

    /// <summary>From a coordinate velocity β (|β| &lt; 1).</summary>
    public static Velocity FromBeta(Vec3 beta)
    {
        double speed = beta.Length;
        if (!(speed < 1)) throw new ArgumentOutOfRangeException(nameof(beta), "speed must be below c");
        return speed > 0 ? new Velocity(Math.Atanh(speed), beta / speed) : Rest;
    }

    public double Gamma => 1 + _coshMinusOne;
    /// <summary>β = sinh φ / cosh φ.</summary>
    public double Beta => _sinh / (1 + _coshMinusOne);
    /// <summary>|u| = γβ = sinh φ.</summary>
    public double ProperSpeed => _sinh;
    /// <summary>γ − 1, exact near rest (kinetic energy per unit rest energy).</summary>
    public double GammaMinusOne => _coshMinusOne;
    /// <summary>1 − β = e^(−φ) / cosh φ, never by subtraction.</summary>
    public double OneMinusBeta => Math.Exp(-Rapidity) / Gamma;
    public Vec3 ProperVelocity => _sinh * Direction;
    public Vec3 BetaVector => Beta * Direction;
    public FourVector FourVelocity => new(Gamma, ProperVelocity);

    /// <summary>
    /// The pure boost by this velocity: maps coordinates of the comoving frame (axes parallel to home axes)
    /// to home coordinates.
    /// </summary>
    public FourVector BoostToHome(FourVector comoving) => Boost(comoving, _sinh);

    /// <summary>The inverse pure boost: home coordinates → comoving coordinates (axes parallel to home axes).</summary>
    public FourVector BoostFromHome(FourVector home) => Boost(home, -_sinh);

    private FourVector Boost(FourVector v, double sinh)
    {
        Vec3 n = Direction;
        double along = Vec3.Dot(n, v.Space);
        return new FourVector((1 + _coshMinusOne) * v.T + sinh * along, v.Space + (sinh * v.T + _coshMinusOne * along) * n);
    }

    /// <summary>
    /// Composes pure boosts: B(this) · B(v) = B(result) · W, with <paramref name="v"/> the proper velocity of the
    /// second boost in this velocity's comoving axes. W is the Thomas–Wigner rotation, returned exactly
    /// (it is the identity when the boosts are collinear).
    /// </summary>
    public (Velocity Result, Rotation Wigner) Compose(Vec3 v)
    {
        if (v.X == 0 && v.Y == 0 && v.Z == 0) return (this, Rotation.Identity); // coasting
        Vec3 n = Direction;
        double alongV = Vec3.Dot(n, v);
        Vec3 across = v - alongV * n;
        double acrossSquared = across.LengthSquared;
        double w = Math.Sqrt(1 + acrossSquared);
        // The component along n is w·(cosh ψ, sinh ψ): boosting along n just adds ψ to φ.
        double sinhPsi = alongV / w;
        // The summed rapidity itself is needed only when braking or for a collinear result; asinh is the costly call.
        bool needsSummedRapidity = sinhPsi < 0 || acrossSquared == 0;
        double summedRapidity = needsSummedRapidity ? Rapidity + Math.Asinh(sinhPsi) : double.NaN;
        // sinh(φ + ψ) by the addition theorem while both terms are non-negative (speeding up), which saves a call;
        // when braking the terms could cancel, so the summed rapidity is used instead.
        double summedSinh = sinhPsi >= 0
            ? _sinh * Math.Sqrt(1 + sinhPsi * sinhPsi) + (1 + _coshMinusOne) * sinhPsi
            : Math.Sinh(summedRapidity);
        Velocity result;
        if (acrossSquared == 0)
        {
            // Collinear: the summed rapidity is the answer, exactly (no round trip through asinh).
            result = summedRapidity >= 0 ? new Velocity(summedRapidity, n, summedSinh) : new Velocity(-summedRapidity, -n, -summedSinh);
        }
        else
        {
            double resultAlong = w * summedSinh;
            double resultProperSpeed = Math.Sqrt(resultAlong * resultAlong + acrossSquared);
            result = FromProperSpeed(resultProperSpeed, (1 / resultProperSpeed) * (resultAlong * n + across));
        }

        // Thomas–Wigner rotation: angle ε with tan(ε/2) = |u×v| / ((1+γu)(1+γv) + u·v), about the axis v×u.
        // Dividing through by (1+γu) leaves only tanh(φ/2) = sinh φ/(1 + cosh φ), so nothing overflows.
        double halfTanh = _sinh / (2 + _coshMinusOne);
        double gammaV = Math.Sqrt(1 + v.LengthSquared);
        double scalar = 1 + gammaV + halfTanh * alongV;
        Vec3 axis = halfTanh * Vec3.Cross(v, n);
        Rotation wigner = new Rotation(scalar, axis.X, axis.Y, axis.Z).Normalized();
        return (result, wigner);
    }
}
