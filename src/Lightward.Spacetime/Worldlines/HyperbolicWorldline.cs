namespace Lightward.Spacetime;

/// <summary>
/// A body under constant proper acceleration with non-rotating (Fermi–Walker) axes: hyperbolic motion.
/// It passes <see cref="Start"/> with frame <see cref="StartFrame"/> and clock <see cref="StartProperTime"/>,
/// pushed by <see cref="ProperAcceleration"/> (body axes, 1/s); before the start the same hyperbola is extended.
/// </summary>
/// <remarks>
/// The worldline is written about its vertex, the event where it moves slowest in home coordinates:
/// X(θ) = vertex + (γ⊥ sinh θ, w sinh θ + m (cosh θ − 1)) / a with θ = α + a·(τ − τ₀), w ⊥ m, |m| = 1,
/// γ⊥ = √(1 + |w|²) (Rindler, Relativity: Special, General, and Cosmological, 2006, ch. 3, hyperbolic motion,
/// boosted across the push). Every term is of one sign or orthogonal to the others, so nothing cancels when a fast
/// ship brakes, and differences from the start use sinh θ − sinh α = 2 cosh((θ+α)/2) sinh((θ−α)/2).
/// </remarks>
public sealed class HyperbolicWorldline : IWorldline
{
    public FourVector Start { get; }
    public LorentzFrame StartFrame { get; }
    public Vec3 ProperAcceleration { get; }
    public double StartProperTime { get; }
    public double StartHomeTime { get; init; } = double.NegativeInfinity;

    private readonly double _a;
    private readonly Vec3 _pushInBodyAxes;
    private readonly double _gammaAcross;
    private readonly Vec3 _w, _m;
    private readonly double _alpha, _sinhAlpha;

    public HyperbolicWorldline(FourVector start, LorentzFrame startFrame, Vec3 properAcceleration, double startProperTime = 0)
    {
        if (!start.IsFinite) throw new ArgumentException("start event must be finite", nameof(start));
        _a = properAcceleration.Length;
        if (!(_a > 0) || !double.IsFinite(_a)) throw new ArgumentOutOfRangeException(nameof(properAcceleration), "proper acceleration must be non-zero and finite; use InertialWorldline for coasting");
        Start = start;
        StartFrame = startFrame;
        ProperAcceleration = properAcceleration;
        StartProperTime = startProperTime;
        _pushInBodyAxes = properAcceleration / _a;

        // Push direction in comoving home-aligned axes, split along and across the start velocity.
        Vec3 push = startFrame.Orientation.Rotate(_pushInBodyAxes);
        Vec3 n = startFrame.Velocity.Direction;
        double along = Vec3.Dot(n, push);
        Vec3 across = push - along * n;
        double sinh0 = startFrame.Velocity.ProperSpeed, cosh0 = startFrame.Velocity.Gamma;
        _gammaAcross = Math.Sqrt(1 + across.LengthSquared * sinh0 * sinh0);
        _w = (sinh0 / _gammaAcross) * (cosh0 * across.LengthSquared * n - along * across);
        _m = (along * n + cosh0 * across) / _gammaAcross;
        _sinhAlpha = along * sinh0 / _gammaAcross;
        _alpha = Math.Asinh(_sinhAlpha);
    }

    public HyperbolicWorldline(FourVector start, Velocity startVelocity, Vec3 properAcceleration, double startProperTime = 0)
        : this(start, new LorentzFrame(startVelocity, Rotation.Identity), properAcceleration, startProperTime) { }

    /// <summary>Magnitude of the proper acceleration, 1/s.</summary>
    public double Acceleration => _a;

    public FourVector EventAtProperTime(double tau)
    {
        double half = _a * (tau - StartProperTime) / 2;
        double sinhHalf = Math.Sinh(half);
        double mid = _alpha + half;
        double timeLike = 2 * Math.Cosh(mid) * sinhHalf / _a;   // (sinh θ − sinh α)/a
        double spaceLike = 2 * Math.Sinh(mid) * sinhHalf / _a;  // (cosh θ − cosh α)/a
        return Start + new FourVector(_gammaAcross * timeLike, timeLike * _w + spaceLike * _m);
    }

    public FourVector FourVelocityAtProperTime(double tau)
    {
        double theta = _alpha + _a * (tau - StartProperTime);
        double cosh = Math.Cosh(theta);
        return new FourVector(_gammaAcross * cosh, cosh * _w + Math.Sinh(theta) * _m);
    }

    public LorentzFrame RestFrameAtProperTime(double tau)
    {
        double rapidity = _a * (tau - StartProperTime);
        var boost = new Velocity(Math.Abs(rapidity), rapidity >= 0 ? _pushInBodyAxes : -_pushInBodyAxes);
        return StartFrame.Compose(new LorentzFrame(boost, Rotation.Identity));
    }

    public FourVector EventAtHomeTime(double t) => EventAtProperTime(ProperTimeAtHomeTime(t));

    public FourVector FourVelocityAtHomeTime(double t) => FourVelocityAtProperTime(ProperTimeAtHomeTime(t));

    public LorentzFrame RestFrameAtHomeTime(double t) => RestFrameAtProperTime(ProperTimeAtHomeTime(t));

    public double ProperTimeAtHomeTime(double t) =>
        StartProperTime + HyperbolicMath.AsinhDifference(_sinhAlpha, _a * (t - Start.T) / _gammaAcross) / _a;

    public double HomeTimeAtProperTime(double tau) => EventAtProperTime(tau).T;

    /// <summary>
    /// Whether a light signal sent from <paramref name="emitter"/> can ever reach this hyperbola. It cannot when the
    /// emitter lies on or beyond the future horizon, the null plane the body approaches but never crosses:
    /// (P − C)·K ≤ 0 with C the hyperbola's centre and K = (γ⊥, w + m); at the start (X₀ − C)·K = e^(−α)/a.
    /// </summary>
    public bool CanBeReachedFrom(FourVector emitter) =>
        FourVector.Dot(emitter - Start, new FourVector(_gammaAcross, _w + _m)) + Math.Exp(-_alpha) / _a > 0;

    /// <summary>Whether light from this hyperbola (extended to the past) can reach <paramref name="observer"/>:
    /// the observer must lie beyond the past horizon, (P − C)·K′ &gt; 0 with K′ = (−γ⊥, m − w).</summary>
    public bool CanBeSeenFrom(FourVector observer) =>
        FourVector.Dot(observer - Start, new FourVector(-_gammaAcross, _m - _w)) + Math.Exp(_alpha) / _a > 0;
}
