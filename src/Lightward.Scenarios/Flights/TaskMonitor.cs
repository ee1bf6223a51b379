using Lightward.Optics;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>How a flight ended: success or failure and the reason, in words a trainee reads.</summary>
/// <param name="AtPreviousStep">The task was done best at the state before the last step, where the flight ends.</param>
public sealed record TaskVerdict(bool Success, string Reason, bool AtPreviousStep = false);

/// <summary>
/// Watches a flight step by step and decides when its task succeeded or failed, keeping the measures a score is
/// built from: the miss distance and relative speed that count for this task.
/// </summary>
public abstract class TaskMonitor(Scenario scenario)
{
    protected Scenario Scenario { get; } = scenario;
    protected TaskSpec Task => Scenario.Task;

    /// <summary>Distance that counts for the score, light-seconds (the task's own measure).</summary>
    public double MissDistance { get; protected set; } = double.PositiveInfinity;
    /// <summary>Relative speed that counts for the score, β.</summary>
    public double RelativeSpeed { get; protected set; }
    /// <summary>Whether the task limits the relative speed (so the score charges for it).</summary>
    public virtual bool ChargesRelativeSpeed => true;

    /// <summary>The verdict after a step from <paramref name="before"/> to <paramref name="after"/>, or null to fly on.</summary>
    public abstract TaskVerdict? Observe(in ShipState before, in ShipState after);

    /// <summary>The verdict when a time limit ends the flight: a flight settling within its tolerances has succeeded.</summary>
    public TaskVerdict TimeUp(string limit) => _settling ? new TaskVerdict(true, _bestReason) : OnTimeLimit(limit);

    /// <summary>The verdict when a time limit ends the flight before the task was done.</summary>
    protected virtual TaskVerdict OnTimeLimit(string limit) => new(false, $"{limit} reached before the task was done");

    public static TaskMonitor For(Scenario scenario) => scenario.Task.Kind switch
    {
        TaskKind.Rendezvous => new RendezvousMonitor(scenario),
        TaskKind.Stop => new StopMonitor(scenario),
        TaskKind.ArriveBy => new ArriveByMonitor(scenario),
        TaskKind.ReturnHome => new ReturnHomeMonitor(scenario),
        TaskKind.Flyby => new FlybyMonitor(scenario),
        _ => new FreeFlightMonitor(scenario),
    };

    private bool _settling;
    private double _bestBadness;
    private string _bestReason = "";

    /// <summary>
    /// For tasks that end at rest: once every tolerance is met the flight goes on while it keeps getting better
    /// (smaller <paramref name="badness"/>), and succeeds with the best measures, so a trainee who settles gently
    /// is scored on the settled state rather than the moment the tolerances were first crossed.
    /// Outside the tolerances the closest approach so far is kept for the report.
    /// </summary>
    protected TaskVerdict? Settle(bool withinTolerances, double badness, double distance, double speed, Func<string> describe)
    {
        if (withinTolerances && (!_settling || badness < _bestBadness))
        {
            _settling = true;
            _bestBadness = badness;
            MissDistance = distance;
            RelativeSpeed = speed;
            _bestReason = describe();
            return null;
        }
        if (_settling) return new TaskVerdict(true, _bestReason, AtPreviousStep: true);
        if (distance < MissDistance)
        {
            MissDistance = distance;
            RelativeSpeed = speed;
        }
        return null;
    }

    /// <summary>The ship relative to a body, measured in the body's rest frame at the ship's home time.</summary>
    public static (Vec3 Separation, Vec3 RelativeProperVelocity) RelativeToBody(IWorldline body, in ShipState ship)
    {
        double t = ship.HomeTime;
        LorentzFrame rest = body.RestFrameAtHomeTime(t);
        FourVector offset = rest.FromHome(ship.Event.RelativeTo(body.EventAtHomeTime(t)));
        FourVector velocity = rest.FromHome(ship.Velocity.FourVelocity);
        // The body sits at its own origin, so the ship's place in its frame is the offset's spatial part.
        return (offset.Space, velocity.Space);
    }

    /// <summary>β from a proper speed |u| = γβ without cancellation.</summary>
    public static double SpeedOf(Vec3 properVelocity) => Math.Tanh(Math.Asinh(properVelocity.Length));

    /// <summary>Closest distance to the origin along the straight segment from <paramref name="a"/> to <paramref name="b"/>, and where (0 at a, 1 at b).</summary>
    public static (double Distance, double Fraction) ClosestOnSegment(Vec3 a, Vec3 b)
    {
        Vec3 d = b - a;
        double lengthSquared = d.LengthSquared;
        double s = lengthSquared > 0 ? Math.Clamp(-Vec3.Dot(a, d) / lengthSquared, 0, 1) : 0;
        return ((a + s * d).Length, s);
    }

    /// <summary>
    /// Where <paramref name="body"/> appears from the ship, in ship axes: the direction of the light arriving now
    /// (from the body's retarded event), aberrated by the ship's velocity; null when no light has arrived yet.
    /// </summary>
    public static Vec3? ApparentDirection(IWorldline body, FourVector observer, LorentzFrame frame)
    {
        LightConeEvent seen = LightCone.Retarded(observer, body);
        if (!seen.IsMet) return null;
        Vec3 towards = (seen.Event.Space - observer.Space).NormalizedOr(Vec3.UnitZ);
        return Aberration.ApparentInShipAxes(towards, frame);
    }

    public static string Km(double lightSeconds) => $"{lightSeconds / Units.Kilometre:G4} km";
    public static string Kms(double beta) => $"{beta / Units.Kilometre:G4} km/s";
}

internal sealed class FreeFlightMonitor(Scenario scenario) : TaskMonitor(scenario)
{
    public override bool ChargesRelativeSpeed => false;
    public override TaskVerdict? Observe(in ShipState before, in ShipState after)
    {
        MissDistance = 0;
        return null;
    }

    protected override TaskVerdict OnTimeLimit(string limit) => new(true, $"free flight flown until the {limit}");
}

internal sealed class RendezvousMonitor(Scenario scenario) : TaskMonitor(scenario)
{
    private readonly IWorldline _body = scenario.FindBody(scenario.Task.Target!)!.Path;

    public override TaskVerdict? Observe(in ShipState before, in ShipState after)
    {
        (Vec3 separation, Vec3 velocity) = RelativeToBody(_body, after);
        double distance = separation.Length, speed = SpeedOf(velocity);
        return Settle(distance <= Task.Distance && speed <= Task.RelativeSpeed, distance / Task.Distance + speed / Task.RelativeSpeed, distance, speed,
            () => $"met {Task.Target} at {Km(distance)} and {Kms(speed)} in its rest frame");
    }

    protected override TaskVerdict OnTimeLimit(string limit) => new(false,
        $"{limit} reached; closest approach to {Task.Target} was {Km(MissDistance)} at {Kms(RelativeSpeed)} (needed {Km(Task.Distance)} and {Kms(Task.RelativeSpeed)})");
}

internal sealed class StopMonitor(Scenario scenario) : TaskMonitor(scenario)
{
    public override TaskVerdict? Observe(in ShipState before, in ShipState after)
    {
        double distance = after.Event.RelativeTo(new FourVector(0, Task.Point)).Space.Length, speed = after.Velocity.Beta;
        return Settle(distance <= Task.Distance && speed <= Task.RelativeSpeed, distance / Task.Distance + speed / Task.RelativeSpeed, distance, speed,
            () => $"at rest {Km(distance)} from {Task.Target ?? "the point"} at {Kms(speed)}");
    }

    protected override TaskVerdict OnTimeLimit(string limit) => new(false,
        $"{limit} reached; closest was {Km(MissDistance)} at {Kms(RelativeSpeed)} (needed {Km(Task.Distance)} and below {Kms(Task.RelativeSpeed)})");
}

internal sealed class ArriveByMonitor(Scenario scenario) : TaskMonitor(scenario)
{
    public override bool ChargesRelativeSpeed => false;

    public override TaskVerdict? Observe(in ShipState before, in ShipState after)
    {
        var point = new FourVector(0, Task.Point);
        double distance = ClosestOnSegment(before.Event.RelativeTo(point).Space, after.Event.RelativeTo(point).Space).Distance;
        if (distance < MissDistance)
        {
            MissDistance = distance;
            RelativeSpeed = after.Velocity.Beta;
        }
        if (distance <= Task.Distance)
            return after.HomeTime <= Task.HomeTime
                ? new TaskVerdict(true, $"reached {Task.Target ?? "the point"} ({Km(distance)}) with {Days(Task.HomeTime - after.HomeTime)} to spare on the home clock")
                : new TaskVerdict(false, $"reached {Task.Target ?? "the point"} {Days(after.HomeTime - Task.HomeTime)} after the deadline");
        return after.HomeTime > Task.HomeTime
            ? new TaskVerdict(false, $"the home-clock deadline passed {Km(distance)} short of {Task.Target ?? "the point"}")
            : null;
    }

    internal static string Days(double seconds) => $"{seconds / Units.Day:G4} d";
}

internal sealed class ReturnHomeMonitor(Scenario scenario) : TaskMonitor(scenario)
{
    private bool _leftHome;

    public override TaskVerdict? Observe(in ShipState before, in ShipState after)
    {
        double distance = after.Event.RelativeTo(new FourVector(0, Task.Point)).Space.Length, speed = after.Velocity.Beta;
        // The ship starts at home: only a return after leaving the tolerance sphere counts.
        _leftHome |= distance > Task.Distance;
        double early = Task.HomeTime - after.HomeTime;
        bool within = _leftHome && distance <= Task.Distance && speed <= Task.RelativeSpeed && Math.Abs(early) <= Task.DateTolerance;
        double badness = distance / Task.Distance + speed / Task.RelativeSpeed + Math.Abs(early) / Task.DateTolerance;
        TaskVerdict? verdict = Settle(within, badness, _leftHome ? distance : double.PositiveInfinity, speed,
            () => $"home at rest ({Km(distance)}, {Kms(speed)}) {ArriveByMonitor.Days(Math.Abs(early))} {(early >= 0 ? "before" : "after")} the date");
        if (verdict is not null || within) return verdict;
        if (after.HomeTime > Task.HomeTime + Task.DateTolerance)
            return new TaskVerdict(false, $"the home clock passed the date (+{ArriveByMonitor.Days(Task.DateTolerance)}) with the ship {Km(distance)} from home at {Kms(speed)}");
        return null;
    }
}

internal sealed class FlybyMonitor(Scenario scenario) : TaskMonitor(scenario)
{
    private readonly IWorldline _body = scenario.FindBody(scenario.Task.Target!)!.Path;
    private double _previousDistance = double.PositiveInfinity;
    private bool _approaching;
    public override bool ChargesRelativeSpeed => false;

    public override TaskVerdict? Observe(in ShipState before, in ShipState after)
    {
        Vec3 from = RelativeToBody(_body, before).Separation;
        (Vec3 to, Vec3 velocity) = RelativeToBody(_body, after);
        (double closest, double fraction) = ClosestOnSegment(from, to);
        double distance = to.Length;
        if (closest < MissDistance)
        {
            MissDistance = closest;
            RelativeSpeed = SpeedOf(velocity);
        }
        // A pass is over once the range, having shrunk, grows again.
        bool passed = _approaching && distance > _previousDistance;
        _approaching |= distance < _previousDistance;
        _previousDistance = distance;
        if (closest > Task.Distance)
            return passed ? new TaskVerdict(false, $"passed {Task.Target} at {Km(MissDistance)}, farther than {Km(Task.Distance)}") : null;
        // Judge the view where the pass is closest: a fast ship may be far beyond the body by the end of the step.
        FourVector where = before.Position + fraction * (after.Position - before.Position);
        double offNose = AngleOffNose(_body, where, (fraction < 0.5 ? before : after).Frame);
        return offNose <= Task.ViewAngle
            ? new TaskVerdict(true, $"passed {Task.Target} at {Km(closest)} with it {offNose * 180 / Math.PI:F1}° off the nose")
            : new TaskVerdict(false, $"passed {Task.Target} at {Km(closest)} but it appeared {offNose * 180 / Math.PI:F1}° off the nose (allowed {Task.ViewAngle * 180 / Math.PI:F1}°)");
    }

    /// <summary>Angle between the forward axis and where the body appears (π when its light has not reached the ship).</summary>
    public static double AngleOffNose(IWorldline body, FourVector observer, LorentzFrame frame) =>
        ApparentDirection(body, observer, frame) is { } seen ? Vec3.AngleBetween(seen, Vec3.UnitZ) : Math.PI;
}
