using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>Flies a flight to its end: a burn plan, the autopilot, or a recorded log.</summary>
public interface IPilot
{
    void Fly(Flight flight);
}

/// <summary>
/// Flies a burn plan segment by segment at the scenario's fixed step. A segment given as a duration ends with a last
/// partial step on the exact ship time; an "until" segment ends on the exact crossing, found by bisection within the
/// step in which it happens (the motion is exact, so only the crossing is searched). Each segment starts a new run
/// of the flight, so a plan's segments end on the same bits whatever the step.
/// After the last segment the ship coasts, or hands over to <paramref name="afterwards"/>, until the task is decided.
/// </summary>
public sealed class PlanPilot(BurnPlan plan, IPilot? afterwards = null) : IPilot
{
    public void Fly(Flight flight)
    {
        foreach (PlanSegment segment in plan.Segments)
        {
            if (flight.IsOver) return;
            FlySegment(flight, segment);
        }
        flight.BeginRun();
        if (afterwards is not null) afterwards.Fly(flight);
        else while (!flight.IsOver) flight.Step(Controls.Coast);
    }

    private static void FlySegment(Flight flight, PlanSegment segment)
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
        if (segment.End != SegmentEnd.Duration && (Reached(flight.Ship) || (segment.End == SegmentEnd.HomeTime && !rising))) return;

        flight.BeginRun();
        double elapsed = 0;
        while (!flight.IsOver)
        {
            double step = flight.StepDuration;
            if (segment.End == SegmentEnd.Duration)
            {
                double remaining = segment.Value - elapsed;
                if (remaining <= step)
                {
                    flight.Step(ControlsFor(flight, segment, remaining), remaining);
                    return;
                }
                flight.Step(ControlsFor(flight, segment, step));
                elapsed += step;
                continue;
            }
            Controls controls = ControlsFor(flight, segment, step);
            if (Reached(flight.Preview(controls, step)))
            {
                flight.StepUntil(controls, step, Reached);
                return;
            }
            flight.Step(controls);
        }
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
