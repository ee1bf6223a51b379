using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>Flies a flight to its end: a burn plan, the autopilot, or a recorded log.</summary>
public interface IPilot
{
    void Fly(Flight flight);
}

/// <summary>One step of a burn plan, announced just before the flight flies it.</summary>
/// <param name="Segment">Index of the plan segment the step belongs to.</param>
/// <param name="Requested">The controls the plan asks for (the flight applies its ship's limits to them).</param>
public readonly record struct PlanStep(int Segment, Controls Requested);

/// <summary>
/// Flies a burn plan segment by segment at the scenario's fixed step. A segment given as a duration ends with a last
/// partial step on the exact ship time; an "until" segment ends on the exact crossing, found by bisection within the
/// step in which it happens (the motion is exact, so only the crossing is searched); a "face" turn that would end
/// within a step ends there, with a partial step at the ship's turn rate, rather than being spread over the step.
/// Each segment starts a new run of the flight, so a plan's segments end on the same bits whatever the step.
/// After the last segment the ship coasts, or hands over to <paramref name="afterwards"/>, until the task is decided.
/// </summary>
public sealed class PlanPilot(BurnPlan plan, IPilot? afterwards = null) : IPilot
{
    /// <summary>A "face" turn smaller than this (rad) is a hold correction, spread over the step.</summary>
    private const double HoldCorrection = 1e-6;

    public void Fly(Flight flight)
    {
        foreach (PlanStep _ in Schedule(plan, flight)) { }
        flight.BeginRun();
        if (afterwards is not null) afterwards.Fly(flight);
        else while (!flight.IsOver) flight.Step(Controls.Coast);
    }

    /// <summary>
    /// The plan's control schedule as it is flown: enumerating flies the segments through <paramref name="flight"/>,
    /// announcing each step just before it is taken, so a caller can follow the ship between steps (a dome show puts
    /// the ship anywhere along a plan). Ends after the last segment, or earlier when the flight is over.
    /// </summary>
    public static IEnumerable<PlanStep> Schedule(BurnPlan plan, Flight flight)
    {
        for (int index = 0; index < plan.Segments.Count && !flight.IsOver; index++)
            foreach (PlanStep step in FlySegment(flight, plan.Segments[index], index))
                yield return step;
    }

    private static IEnumerable<PlanStep> FlySegment(Flight flight, PlanSegment segment, int index)
    {
        Vec3 start = flight.Scenario.Ship.Start.Space;
        double Measure(in ShipState ship) => segment.End switch
        {
            SegmentEnd.Speed => ship.Velocity.Rapidity,
            SegmentEnd.Distance => ship.Event.RelativeTo(new FourVector(0, start)).Space.Length,
            _ => ship.HomeTime,
        };
        double target = segment.End == SegmentEnd.Speed ? Math.Atanh(segment.Value) : segment.Value;
        // An "until" crossing can be met from either side; a segment whose condition already holds is skipped.
        bool rising = Measure(flight.Ship) < target;
        bool Reached(in ShipState ship) => rising ? Measure(ship) >= target : Measure(ship) <= target;
        if (segment.End != SegmentEnd.Duration && (Reached(flight.Ship) || (segment.End == SegmentEnd.HomeTime && !rising))) yield break;

        flight.BeginRun();
        double elapsed = 0;
        while (!flight.IsOver)
        {
            double step = StepFor(flight, segment);
            if (segment.End == SegmentEnd.Duration)
            {
                double remaining = segment.Value - elapsed;
                if (remaining <= step)
                {
                    Controls last = ControlsFor(flight, segment, remaining);
                    yield return new PlanStep(index, last);
                    flight.Step(last, remaining);
                    yield break;
                }
                Controls whole = ControlsFor(flight, segment, step);
                yield return new PlanStep(index, whole);
                flight.Step(whole, step);
                elapsed += step;
                continue;
            }
            Controls controls = ControlsFor(flight, segment, step);
            yield return new PlanStep(index, controls);
            if (Reached(flight.Preview(controls, step)))
            {
                flight.StepUntil(controls, step, Reached);
                yield break;
            }
            flight.Step(controls, step);
        }
    }

    /// <summary>
    /// The fixed step, or less when a "face" turn would end within it: then the step ends where the turn at the ship's
    /// turn rate reaches the direction, so the turn takes the same ship time whatever the step.
    /// </summary>
    private static double StepFor(Flight flight, PlanSegment segment)
    {
        double step = flight.StepDuration;
        if (segment.Face is not { } face) return step;
        double angle = Vec3.AngleBetween(Vec3.UnitZ, flight.Ship.Frame.Orientation.Inverse.Rotate(face));
        double turn = angle / flight.Scenario.Ship.MaxTurnRate;
        return angle > HoldCorrection && turn < step ? turn : step;
    }

    /// <summary>The segment's thrust and turn rate; "face" turns the forward axis toward a home direction at the ship's turn rate.</summary>
    private static Controls ControlsFor(Flight flight, PlanSegment segment, double duration)
    {
        if (segment.Face is not { } face) return new Controls(segment.Thrust, segment.AttitudeRate);
        return new Controls(segment.Thrust, TurnToward(flight, flight.Ship.Frame.Orientation.Inverse.Rotate(face), duration));
    }

    /// <summary>Turn rate (ship axes) bringing the forward axis onto <paramref name="shipAxesDirection"/> over <paramref name="duration"/>, capped by the ship's turn rate.</summary>
    public static Vec3 TurnToward(Flight flight, Vec3 shipAxesDirection, double duration)
    {
        double angle = Vec3.AngleBetween(Vec3.UnitZ, shipAxesDirection);
        if (angle < 1e-12) return Vec3.Zero;
        Vec3 axis = Vec3.Cross(Vec3.UnitZ, shipAxesDirection).NormalizedOr(Vec3.UnitX);
        return axis * Math.Min(flight.Scenario.Ship.MaxTurnRate, angle / duration);
    }
}
