namespace Lightward.Spacetime;

/// <summary>
/// A body in uniform motion (or at rest): it passes <see cref="Start"/> with its clock reading
/// <see cref="StartProperTime"/> and its axes given by <see cref="Frame"/>, and keeps that velocity for ever.
/// </summary>
public sealed class InertialWorldline : IWorldline
{
    public FourVector Start { get; }
    public LorentzFrame Frame { get; }
    public double StartProperTime { get; }
    public double StartHomeTime { get; init; } = double.NegativeInfinity;

    private readonly FourVector _fourVelocity;
    private readonly Vec3 _beta;
    private readonly double _gamma;

    public InertialWorldline(FourVector start, LorentzFrame frame, double startProperTime = 0)
    {
        if (!start.IsFinite) throw new ArgumentException("start event must be finite", nameof(start));
        Start = start;
        Frame = frame;
        StartProperTime = startProperTime;
        _fourVelocity = frame.Velocity.FourVelocity;
        _beta = frame.Velocity.BetaVector;
        _gamma = frame.Velocity.Gamma;
    }

    public InertialWorldline(FourVector start, Velocity velocity, double startProperTime = 0)
        : this(start, new LorentzFrame(velocity, Rotation.Identity), startProperTime) { }

    /// <summary>A body at rest at <paramref name="position"/> whose clock reads home time.</summary>
    public static InertialWorldline AtRest(Vec3 position) => new(new FourVector(0, position), LorentzFrame.Identity);

    public Velocity Velocity => Frame.Velocity;

    public FourVector EventAtHomeTime(double t) => new(t, Start.Space + (t - Start.T) * _beta);

    public FourVector EventAtProperTime(double tau) => Start + (tau - StartProperTime) * _fourVelocity;

    public FourVector FourVelocityAtHomeTime(double t) => _fourVelocity;

    public double ProperTimeAtHomeTime(double t) => StartProperTime + (t - Start.T) / _gamma;

    public double HomeTimeAtProperTime(double tau) => Start.T + (tau - StartProperTime) * _gamma;

    public LorentzFrame RestFrameAtHomeTime(double t) => Frame;
}
