using Lightward.Spacetime;

namespace Lightward.Scenarios.Shows;

/// <summary>
/// The ship's worldline over show time for a velocity profile: rapidity φ(t) and time compression κ(t) as functions of
/// show time. Each fixed show-time step applies the exact constant-acceleration motion a = Δφ/Δτ with Δτ = κ̄·Δt
/// (<see cref="FlightIntegrator"/>), from a checkpoint every second, so any show time is reproduced bit for bit
/// whichever frames are asked for and in whatever order (shards, resumed renders).
/// </summary>
public sealed class ShowFlight
{
    /// <summary>Steps per second of show time: fine enough that a one-second transition is followed smoothly.</summary>
    public const int StepsPerSecond = 240;
    private const double Step = 1.0 / StepsPerSecond;

    private readonly Func<double, double> _rapidity;
    private readonly Func<double, double> _compression;
    private readonly ShipState[] _checkpoints;
    private readonly FlightIntegrator _integrator = new(1);

    public ShowFlight(ShipState start, double length, Func<double, double> rapidityAt, Func<double, double> compressionAt)
    {
        _rapidity = rapidityAt;
        _compression = compressionAt;
        int seconds = (int)Math.Ceiling(length) + 1;
        _checkpoints = new ShipState[seconds + 1];
        _checkpoints[0] = start;
        for (int second = 1; second <= seconds; second++)
            _checkpoints[second] = Advance(_checkpoints[second - 1], (second - 1) * StepsPerSecond, StepsPerSecond, 0);
    }

    /// <summary>The ship at every whole second of show time up to <paramref name="showTime"/>: cheap samples of the worldline so far.</summary>
    public IEnumerable<ShipState> WholeSecondsUpTo(double showTime) =>
        _checkpoints.Take(Math.Min(_checkpoints.Length, (int)Math.Floor(Math.Max(0, showTime)) + 1));

    /// <summary>The ship at <paramref name="showTime"/> (clamped to the show's start).</summary>
    public ShipState At(double showTime)
    {
        showTime = Math.Max(0, showTime);
        int second = Math.Min((int)Math.Floor(showTime), _checkpoints.Length - 1);
        double withinSecond = showTime - second;
        int wholeSteps = (int)Math.Floor(withinSecond * StepsPerSecond);
        double lastFraction = withinSecond * StepsPerSecond - wholeSteps;
        return Advance(_checkpoints[second], second * StepsPerSecond, wholeSteps, lastFraction);
    }

    /// <summary>Takes <paramref name="steps"/> whole steps from step index <paramref name="firstStep"/>, then a fraction of one more.</summary>
    private ShipState Advance(ShipState ship, long firstStep, int steps, double lastFraction)
    {
        for (int i = 0; i < steps; i++) ship = TakeStep(ship, firstStep + i, 1.0);
        return lastFraction > 0 ? TakeStep(ship, firstStep + steps, lastFraction) : ship;
    }

    private ShipState TakeStep(ShipState ship, long stepIndex, double fraction)
    {
        double start = stepIndex * Step, end = (stepIndex + 1) * Step;
        double properDuration = 0.5 * (_compression(start) + _compression(end)) * Step;
        double acceleration = (_rapidity(end) - _rapidity(start)) / properDuration;
        var controls = new Controls(new Vec3(0, 0, acceleration), Vec3.Zero);
        return _integrator.Step(ship, controls, properDuration * fraction);
    }

    /// <summary>Ship axes → home axes with +Z along <paramref name="course"/> and +Y as close to celestial north as it can be.</summary>
    public static Rotation OrientationAlong(Vec3 course)
    {
        Vec3 forward = course.NormalizedOr(Vec3.UnitZ);
        Vec3 north = Math.Abs(forward.Z) > 0.999 ? Vec3.UnitX : Vec3.UnitZ;
        Vec3 up = (north - Vec3.Dot(north, forward) * forward).NormalizedOr(forward.AnyPerpendicular());
        Vec3 right = Vec3.Cross(up, forward);
        return Rotation.FromMatrix(new[,] { { right.X, up.X, forward.X }, { right.Y, up.Y, forward.Y }, { right.Z, up.Z, forward.Z } });
    }
}
