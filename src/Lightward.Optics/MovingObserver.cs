using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>
/// Aberration and Doppler factor for one fixed velocity, with everything that depends only on the velocity —
/// e^(−φ), e^(−2φ), sinh φ — worked out once, for loops that see many directions from the same motion. The
/// formulas and their sources are those of <see cref="Aberration"/> and <see cref="Doppler"/>.
/// </summary>
public readonly struct MovingObserver
{
    private readonly Vec3 _motion;
    private readonly double _expMinus, _expMinusTwice, _sinh;

    /// <param name="motion">Direction of motion (normalised here; +Z when zero).</param>
    /// <param name="rapidity">φ; a negative value gives the inverse map (apparent → source direction).</param>
    public MovingObserver(Vec3 motion, double rapidity)
    {
        _motion = motion.NormalizedOr(Vec3.UnitZ);
        _expMinus = Math.Exp(-rapidity);
        _expMinusTwice = Math.Exp(-2 * rapidity);
        _sinh = Math.Sinh(rapidity);
    }

    public MovingObserver(Velocity velocity) : this(velocity.Direction, velocity.Rapidity) { }

    /// <summary>The direction of motion, unit.</summary>
    public Vec3 Motion => _motion;

    /// <summary>Apparent direction (comoving axes, unit) of a source toward <paramref name="direction"/> (any length; zero means dead ahead).</summary>
    public Vec3 Apparent(Vec3 direction) => ApparentOfUnit(direction.NormalizedOr(_motion), out _);

    /// <summary>Apparent direction of a source toward unit <paramref name="source"/>, and the Doppler factor D of its light.</summary>
    public Vec3 ApparentOfUnit(Vec3 source, out double doppler)
    {
        Vec3 n = _motion;
        // 1 ± cos θ as half squared chords, each free of cancellation.
        double onePlusCos = (source + n).LengthSquared / 2;
        double oneMinusCos = (source - n).LengthSquared / 2;
        double denominator = onePlusCos + _expMinusTwice * oneMinusCos;
        double apparentCos = (onePlusCos - _expMinusTwice * oneMinusCos) / denominator;
        double acrossScale = 2 * _expMinus / denominator;
        doppler = _expMinus + _sinh * onePlusCos;
        return (apparentCos * n + acrossScale * (source - Vec3.Dot(source, n) * n)).NormalizedOr(n);
    }

    /// <summary>D = e^(−φ) + sinh φ (1 + cos θ) for a source toward <paramref name="direction"/> (any length; zero means dead ahead).</summary>
    public double Doppler(Vec3 direction)
    {
        Vec3 s = direction.NormalizedOr(_motion);
        return _expMinus + _sinh * (s + _motion).LengthSquared / 2;
    }
}
