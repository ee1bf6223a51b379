namespace Lightward.Spacetime;

/// <summary>
/// A body on a circular orbit at constant speed: x(t) = centre + r (cos ψ e₁ + sin ψ e₂), ψ = Ω t + phase,
/// turning right-handed about <see cref="Axis"/>. e₁, the reference direction, is home +X projected into the orbit
/// plane (home +Y when the axis lies within 26° of X); e₂ = axis × e₁. Its own clock runs at 1/γ and reads 0 at home
/// time 0. Its axes are the home axes carried by the pure boost (the slow Thomas precession of a gyroscope is not
/// modelled).
/// </summary>
public sealed class CircularWorldline : IWorldline
{
    public Vec3 Centre { get; }
    public double Radius { get; }
    public Vec3 Axis { get; }
    /// <summary>Angular rate in home time, rad/s.</summary>
    public double AngularRate { get; }
    /// <summary>Angle from the reference direction at home time 0, rad.</summary>
    public double Phase { get; }
    public double StartHomeTime { get; init; } = double.NegativeInfinity;

    private readonly Vec3 _e1, _e2;
    private readonly double _speed, _gamma;

    private CircularWorldline(Vec3 centre, double radius, Vec3 axis, double angularRate, double phase)
    {
        if (!centre.IsFinite) throw new ArgumentException("centre must be finite", nameof(centre));
        if (!(radius > 0) || !double.IsFinite(radius)) throw new ArgumentOutOfRangeException(nameof(radius), "radius must be positive and finite");
        if (!(axis.Length > 0) || !axis.IsFinite) throw new ArgumentException("orbit axis must be a non-zero finite vector", nameof(axis));
        _speed = radius * angularRate;
        if (!(_speed < 1)) throw new ArgumentOutOfRangeException(nameof(angularRate), $"orbital speed {_speed:G6} c must be below c");
        Centre = centre;
        Radius = radius;
        Axis = axis.NormalizedOr(Vec3.UnitZ);
        AngularRate = angularRate;
        Phase = phase;
        Vec3 reference = Math.Abs(Axis.X) < 0.9 ? Vec3.UnitX : Vec3.UnitY;
        _e1 = (reference - Vec3.Dot(reference, Axis) * Axis).NormalizedOr(Vec3.UnitX);
        _e2 = Vec3.Cross(Axis, _e1);
        _gamma = 1 / Math.Sqrt((1 - _speed) * (1 + _speed));
    }

    /// <summary>An orbit taking <paramref name="period"/> seconds of home time per turn.</summary>
    public static CircularWorldline FromPeriod(Vec3 centre, double radius, double period, Vec3 axis, double phase = 0)
    {
        if (!(period > 0) || !double.IsFinite(period)) throw new ArgumentOutOfRangeException(nameof(period), "period must be positive and finite");
        return new CircularWorldline(centre, radius, axis, 2 * Math.PI / period, phase);
    }

    /// <summary>An orbit at speed <paramref name="speed"/> (fraction of c, below 1).</summary>
    public static CircularWorldline FromSpeed(Vec3 centre, double radius, double speed, Vec3 axis, double phase = 0)
    {
        if (!(speed > 0) || !(speed < 1)) throw new ArgumentOutOfRangeException(nameof(speed), "speed must lie between 0 and c");
        return new CircularWorldline(centre, radius, axis, speed / radius, phase);
    }

    public double Period => 2 * Math.PI / AngularRate;
    public double Speed => _speed;

    public FourVector EventAtHomeTime(double t)
    {
        (double sin, double cos) = Math.SinCos(AngularRate * t + Phase);
        return new FourVector(t, Centre + Radius * (cos * _e1 + sin * _e2));
    }

    private Vec3 BetaAt(double t)
    {
        (double sin, double cos) = Math.SinCos(AngularRate * t + Phase);
        return _speed * (cos * _e2 - sin * _e1);
    }

    public FourVector FourVelocityAtHomeTime(double t) => new(_gamma, _gamma * BetaAt(t));

    public double ProperTimeAtHomeTime(double t) => t / _gamma;

    public double HomeTimeAtProperTime(double tau) => tau * _gamma;

    public LorentzFrame RestFrameAtHomeTime(double t) => new(Velocity.FromBeta(BetaAt(t)), Rotation.Identity);
}
