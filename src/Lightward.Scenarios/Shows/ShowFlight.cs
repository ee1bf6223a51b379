using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Shows;

/// <summary>A cue that hands the ship to a burn plan.</summary>
/// <param name="At">Show time the plan begins (it starts on the first show step at or after it).</param>
/// <param name="FastestCompression">The most ship seconds per show second from the cue to the end of the show.</param>
public sealed record ShowPlanCue(double At, BurnPlan Plan, double FastestCompression);

/// <summary>
/// The ship's worldline over show time. Until the first burn-plan cue it follows the velocity profile: rapidity φ(t)
/// and time compression κ(t) as functions of show time, each fixed show-time step applying the exact
/// constant-acceleration motion a = Δφ/Δτ with Δτ = κ̄·Δt (<see cref="FlightIntegrator"/>). From a plan cue on, the
/// ship flies the plan (<see cref="PlanTrajectory"/>) and show time only advances the ship time elapsed on it, by the
/// same Δτ per step. Everything starts from a checkpoint every second, so any show time is reproduced bit for bit
/// whichever frames are asked for and in whatever order (shards, resumed renders).
/// </summary>
public sealed class ShowFlight
{
    /// <summary>Steps per second of show time: fine enough that a one-second transition is followed smoothly.</summary>
    public const int StepsPerSecond = 240;
    private const double Step = 1.0 / StepsPerSecond;

    /// <summary>Where the flight stands after a step: the ship on the velocity profile (<paramref name="Plan"/> −1), or the ship time elapsed on a plan.</summary>
    private readonly record struct Point(ShipState Ship, int Plan, double Elapsed);

    private sealed record Phase(long StartStep, ShowPlanCue Cue)
    {
        public PlanTrajectory? Trajectory { get; set; }
    }

    private readonly Func<double, double> _rapidity;
    private readonly Func<double, double> _compression;
    private readonly Phase[] _plans;
    private readonly Point[] _checkpoints;
    private readonly FlightIntegrator _integrator = new(1);

    /// <param name="plans">The burn-plan cues in time order; the velocity profile is flown only before the first.</param>
    /// <param name="turnRate">Fastest turn of the ship on a plan, rad/s of ship time.</param>
    public ShowFlight(ShipState start, double length, Func<double, double> rapidityAt, Func<double, double> compressionAt,
        IReadOnlyList<ShowPlanCue> plans, double turnRate)
    {
        _rapidity = rapidityAt;
        _compression = compressionAt;
        _plans = plans.Select(cue => new Phase((long)Math.Ceiling(cue.At * StepsPerSecond), cue)).ToArray();
        int seconds = (int)Math.Ceiling(length) + 1;
        _checkpoints = new Point[seconds + 1];
        _checkpoints[0] = new Point(start, -1, 0);
        for (int second = 1; second <= seconds; second++)
        {
            long first = (long)(second - 1) * StepsPerSecond;
            foreach (Phase phase in _plans.Where(p => p.Trajectory is null && p.StartStep < first + StepsPerSecond))
            {
                // The plan takes the ship as it is where the plan begins; its step is one show step at the fastest compression to come.
                ShipState from = ShipOf(Advance(_checkpoints[second - 1], first, (int)(phase.StartStep - first), 0));
                double fastest = phase.Cue.FastestCompression;
                double visible = fastest * (length - phase.StartStep * Step + 2 * Step);
                phase.Trajectory = new PlanTrajectory(phase.Cue.Plan, from, turnRate, fastest * Step, Math.Max(visible, fastest * Step));
            }
            Point next = Advance(_checkpoints[second - 1], first, StepsPerSecond, 0);
            _checkpoints[second] = next with { Ship = ShipOf(next) };
        }
    }

    /// <summary>The ship at every whole second of show time up to <paramref name="showTime"/>: cheap samples of the worldline so far.</summary>
    public IEnumerable<ShipState> WholeSecondsUpTo(double showTime) =>
        _checkpoints.Take(Math.Min(_checkpoints.Length, (int)Math.Floor(Math.Max(0, showTime)) + 1)).Select(point => point.Ship);

    /// <summary>The ship at <paramref name="showTime"/> (clamped to the show's start).</summary>
    public ShipState At(double showTime) => ShipOf(PointAt(showTime));

    /// <summary>
    /// What the engine and thrusters do at <paramref name="showTime"/>, ship axes: on a plan, its controls; on the velocity
    /// profile, the thrust along the nose dφ/dτ = (dφ/dt) / κ, by a central difference.
    /// </summary>
    public Controls ControlsAt(double showTime)
    {
        if (OnPlan(showTime) is { } point) return _plans[point.Plan].Trajectory!.ControlsAt(point.Elapsed);
        const double half = 0.5 * Step;
        double before = Math.Max(0, showTime - half), after = showTime + half;
        double acceleration = (_rapidity(after) - _rapidity(before)) / ((after - before) * _compression(showTime));
        return new Controls(new Vec3(0, 0, acceleration), Vec3.Zero);
    }

    /// <summary>
    /// Rapidity still to gain or shed: on a plan, what its segments still burn; on the velocity profile, the way to its
    /// last speed target.
    /// </summary>
    public double RapidityToGo(double showTime)
    {
        if (OnPlan(showTime) is { } point) return _plans[point.Plan].Trajectory!.BurnLeft(point.Elapsed);
        return Math.Abs(_rapidity(double.PositiveInfinity) - _rapidity(showTime));
    }

    /// <summary>Where the flight stands at <paramref name="showTime"/> when a plan flies the ship, else null (without stepping before the first plan).</summary>
    private Point? OnPlan(double showTime)
    {
        if (_plans.Length == 0 || showTime < _plans[0].StartStep * Step - Step) return null;
        Point point = PointAt(showTime);
        return point.Plan >= 0 ? point : null;
    }

    private Point PointAt(double showTime)
    {
        showTime = Math.Max(0, showTime);
        int second = Math.Min((int)Math.Floor(showTime), _checkpoints.Length - 1);
        double withinSecond = showTime - second;
        int wholeSteps = (int)Math.Floor(withinSecond * StepsPerSecond);
        double lastFraction = withinSecond * StepsPerSecond - wholeSteps;
        return Advance(_checkpoints[second], (long)second * StepsPerSecond, wholeSteps, lastFraction);
    }

    private ShipState ShipOf(in Point point) => point.Plan < 0 ? point.Ship : _plans[point.Plan].Trajectory!.At(point.Elapsed);

    /// <summary>Takes <paramref name="steps"/> whole steps from step index <paramref name="firstStep"/>, then a fraction of one more.</summary>
    private Point Advance(Point point, long firstStep, int steps, double lastFraction)
    {
        for (int i = 0; i < steps; i++) point = TakeStep(Enter(point, firstStep + i), firstStep + i, 1.0);
        point = Enter(point, firstStep + steps);
        return lastFraction > 0 ? TakeStep(point, firstStep + steps, lastFraction) : point;
    }

    /// <summary>
    /// Hands the ship to a plan that begins at step <paramref name="stepIndex"/>; the plan was flown from the ship as it
    /// stands there. (A plan not flown yet is being flown from this very point, while the checkpoints are made.)
    /// </summary>
    private Point Enter(Point point, long stepIndex)
    {
        while (point.Plan + 1 < _plans.Length && _plans[point.Plan + 1].StartStep == stepIndex && _plans[point.Plan + 1].Trajectory is { } next)
            point = new Point(next.Start, point.Plan + 1, 0);
        return point;
    }

    private Point TakeStep(Point point, long stepIndex, double fraction)
    {
        double start = stepIndex * Step, end = (stepIndex + 1) * Step;
        double properDuration = 0.5 * (_compression(start) + _compression(end)) * Step;
        if (point.Plan >= 0) return point with { Elapsed = point.Elapsed + properDuration * fraction };
        double acceleration = (_rapidity(end) - _rapidity(start)) / properDuration;
        var controls = new Controls(new Vec3(0, 0, acceleration), Vec3.Zero);
        return point with { Ship = _integrator.Step(point.Ship, controls, properDuration * fraction) };
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
