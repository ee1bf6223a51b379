using System.Runtime.CompilerServices;

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
        double squared = v.LengthSquared;
        (Velocity result, Rotation wigner) = Compose(v, squared / (1 + Math.Sqrt(1 + squared)));
        return (result, wigner.Normalized());
    }

    /// <summary>
    /// <see cref="Compose(Vec3)"/> for a non-zero <paramref name="v"/> whose γ − 1 the caller already knows, with the
    /// Wigner quaternion left unnormalised (callers normalise the orientation it multiplies anyway). It is exactly
    /// <see cref="Rotation.Identity"/> when the boosts are collinear.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    internal (Velocity Result, Rotation Wigner) Compose(Vec3 v, double gammaVMinusOne)
    {
        Vec3 n = Direction;
        double alongV = Vec3.Dot(n, v);
        Vec3 across = v - alongV * n;
        double acrossSquared = across.LengthSquared;
        bool collinear = acrossSquared == 0;
        double gamma = 1 + _coshMinusOne;
        // B(this) applied to v's four-velocity (γ_v, v): the part along n becomes γ_v sinh φ + cosh φ (n·v).
        double alongChange = _sinh * gammaVMinusOne + gamma * alongV;
        // When braking hard, possibly through rest, the sums below would cancel; rapidities are added along n instead.
        if (alongChange < -0.5 * _sinh) return BrakeHard(alongV, across, acrossSquared, v, gammaVMinusOne);

        // Speeding up, or slowing by less than half: the sums below cancel by at most a factor 3, keeping full precision.
        double resultAlong = _sinh + alongChange;
        double properSpeed = collinear ? resultAlong : Math.Sqrt(resultAlong * resultAlong + acrossSquared);
        Vec3 direction = collinear ? n : (1 / properSpeed) * (resultAlong * n + across);
        // The rapidity grows by log(1 + x), x = e^(φ'−φ) − 1 = (Δcosh + Δsinh) / e^φ, with Δsinh = (u'² − u²)/(u' + u):
        // both changes come from the step itself, so nothing cancels even at γ ≈ 1e10. log(1 + x) = 2 atanh(x/(2 + x)),
        // and for an ordinary step a short series of that replaces asinh.
        double coshChange = gamma * gammaVMinusOne + _sinh * alongV;
        double speedSum = properSpeed + _sinh;
        double scaledGrowth = coshChange * speedSum + alongChange * (resultAlong + _sinh) + acrossSquared; // x (γ + u)(u' + u)
        double halfRatio = scaledGrowth / (2 * (gamma + _sinh) * speedSum + scaledGrowth); // x/(2 + x)
        // (Above a proper speed of 1e100 the scaled sums could overflow.)
        double rapidity = properSpeed < 1e100 && Math.Abs(halfRatio) <= HyperbolicMath.AtanhSeriesLimit
            ? Rapidity + 2 * HyperbolicMath.AtanhSeries(halfRatio)
            : Math.Asinh(properSpeed);
        var result = new Velocity(rapidity, direction, properSpeed);
        return collinear ? (result, Rotation.Identity) : (result, Wigner(v, gammaVMinusOne, alongV));
    }

    /// <summary>
    /// <see cref="Compose(Vec3, double)"/> when the boost takes away more than half the speed along the motion:
    /// the component of v along n is w·(cosh ψ, sinh ψ), w = √(1 + |across|²), so boosting along n just adds ψ to φ.
    /// </summary>
    private (Velocity Result, Rotation Wigner) BrakeHard(double alongV, Vec3 across, double acrossSquared, Vec3 v, double gammaVMinusOne)
    {
        Vec3 n = Direction;
        double w = Math.Sqrt(1 + acrossSquared);
        double summedRapidity = Rapidity + Math.Asinh(alongV / w);
        double summedSinh = Math.Sinh(summedRapidity);
        // Collinear: the summed rapidity is the answer, exactly (no round trip through asinh), and no rotation.
        if (acrossSquared == 0)
            return (summedRapidity >= 0 ? new Velocity(summedRapidity, n, summedSinh) : new Velocity(-summedRapidity, -n, -summedSinh), Rotation.Identity);
        double resultAlong = w * summedSinh;
        double properSpeed = Math.Sqrt(resultAlong * resultAlong + acrossSquared);
        return (FromProperSpeed(properSpeed, (1 / properSpeed) * (resultAlong * n + across)), Wigner(v, gammaVMinusOne, alongV));
    }

    /// <summary>
    /// The Thomas–Wigner rotation, unnormalised: angle ε with tan(ε/2) = |u×v| / ((1+γu)(1+γv) + u·v), about the
    /// axis v×u. Dividing through by (1+γu) leaves only tanh(φ/2) = sinh φ/(1 + cosh φ), so nothing overflows.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private Rotation Wigner(Vec3 v, double gammaVMinusOne, double alongV)
    {
        double halfTanh = _sinh / (2 + _coshMinusOne);
        Vec3 axis = halfTanh * Vec3.Cross(v, Direction);
        return new Rotation(2 + gammaVMinusOne + halfTanh * alongV, axis.X, axis.Y, axis.Z);
    }
}
