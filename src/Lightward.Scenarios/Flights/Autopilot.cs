using Lightward.Scenarios.Model;
using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>
/// The reference pilot: one guidance law per task kind, flown at the scenario's fixed step. It proves a scenario
/// solvable and sets the reference score a trainee's flight is compared with.
/// <list type="bullet">
/// <item>Stop, rendezvous: relativistic flip-and-burn as a feedback law in the target's rest frame. The wanted proper
/// velocity points at the target with the rapidity from which braking at part of the engine's acceleration stops
/// exactly there, acosh(1 + a·d), capped by the propellant; near the target it turns linear so the last metres
/// converge instead of chattering. Each step the engine makes up part of the difference (the corrections).</item>
/// <item>Arrive by: the same law without braking. Flyby: pursuit of a point beside the body at full cruise
/// rapidity, nose prograde so aberration keeps the body near the nose as it passes.</item>
/// <item>Return home at a date: the twin's closed-form out-and-back program (accelerate, brake, accelerate home,
/// brake; coasting in between when the propellant demands), then the stop law for any residue.</item>
/// </list>
/// </summary>
public sealed class Autopilot : IPilot
{
    /// <summary>Share of the engine's acceleration the braking curve assumes; the rest is margin for corrections.</summary>
    private const double BrakingShare = 0.5;
    /// <summary>Steps over which a velocity error is made up, and over which the last approach closes.</summary>
    private const double VelocitySteps = 2, PositionSteps = 8;

    public void Fly(Flight flight)
    {
        Scenario scenario = flight.Scenario;
        switch (scenario.Task.Kind)
        {
            case TaskKind.Free:
                while (!flight.IsOver) flight.Step(Controls.Coast);
                break;
            case TaskKind.ReturnHome:
                new PlanPilot(TwinProgram(scenario), new Guidance(GuidanceMode.Stop)).Fly(flight);
                break;
            default:
                new Guidance(scenario.Task.Kind switch
                {
                    TaskKind.ArriveBy => GuidanceMode.PassThrough,
                    TaskKind.Flyby => GuidanceMode.Flyby,
                    _ => GuidanceMode.Stop,
                }).Fly(flight);
                break;
        }
    }

    /// <summary>
    /// Out and back along the ship's nose, at rest at home again when the home clock reads the task's date. With
    /// a = the engine's acceleration and T the home time available, each of the four burns lasts τ = asinh(aT/4)/a
    /// of ship time (four hyperbolic arcs of home time sinh(aτ)/a each). If that needs more rapidity than the
    /// propellant holds, each burn stops at φ = budget/4 and the remaining home time is coasted, half out, half back.
    /// </summary>
    public static BurnPlan TwinProgram(Scenario scenario)
    {
        ShipStart ship = scenario.Ship;
        double a = ship.MaxAcceleration, available = scenario.Task.HomeTime - ship.Start.T;
        double burn = Math.Asinh(a * available / 4) / a;
        double coast = 0;
        double maxBurn = 0.999 * ship.RapidityBudget / 4 / a;
        if (burn > maxBurn)
        {
            burn = maxBurn;
            double phi = a * burn;
            coast = (available - 4 * Math.Sinh(phi) / a) / 2 / Math.Cosh(phi);
        }
        var forward = new Vec3(0, 0, a);
        var location = new Files.SourceLocation(scenario.SourcePath, 1, 1);
        var segments = new List<PlanSegment>
        {
            new("accelerate out", forward, Vec3.Zero, null, SegmentEnd.Duration, burn, location),
            new("brake out", -forward, Vec3.Zero, null, SegmentEnd.Duration, burn, location),
            new("accelerate home", -forward, Vec3.Zero, null, SegmentEnd.Duration, burn, location),
            new("brake home", forward, Vec3.Zero, null, SegmentEnd.Duration, burn, location),
        };
        if (coast > 0)
        {
            segments.Insert(3, new PlanSegment("coast home", Vec3.Zero, Vec3.Zero, null, SegmentEnd.Duration, coast, location));
            segments.Insert(1, new PlanSegment("coast out", Vec3.Zero, Vec3.Zero, null, SegmentEnd.Duration, coast, location));
        }
        return new BurnPlan(scenario.SourcePath, scenario.ContentHash, segments);
    }

    private enum GuidanceMode { Stop, PassThrough, Flyby }

    private sealed class Guidance(GuidanceMode mode) : IPilot
    {
        public void Fly(Flight flight)
        {
            Scenario scenario = flight.Scenario;
            IWorldline target = scenario.Task.Target is { } name ? scenario.FindBody(name)!.Path : InertialWorldline.AtRest(scenario.Task.Point);
            Vec3 aside = Vec3.Zero;
            if (mode == GuidanceMode.Flyby)
            {
                // Aim half the allowed distance to one side of the body, across the line of approach.
                (Vec3 separation, _) = TaskMonitor.RelativeToBody(target, flight.Ship);
                aside = 0.5 * scenario.Task.Distance * separation.AnyPerpendicular();
            }
            double startRapidity = Velocity.FromProperVelocity(TaskMonitor.RelativeToBody(target, flight.Ship).RelativeProperVelocity).Rapidity;
            double spendable = Math.Max(0, flight.RapidityLeft - startRapidity);
            double cruise = Math.Max(1e-6, mode == GuidanceMode.Stop ? 0.45 * spendable : 0.9 * spendable);
            while (!flight.IsOver) flight.Step(ControlsFor(flight, target, aside, cruise));
        }

        private Controls ControlsFor(Flight flight, IWorldline target, Vec3 aside, double cruise)
        {
            ShipState ship = flight.Ship;
            ShipStart capabilities = flight.Scenario.Ship;
            double step = flight.StepDuration, a = capabilities.MaxAcceleration;
            LorentzFrame rest = target.RestFrameAtHomeTime(ship.HomeTime);
            (Vec3 offset, Vec3 u) = TaskMonitor.RelativeToBody(target, ship);
            Vec3 toGo = aside - offset;
            double distance = toGo.Length;
            double rapidity = mode == GuidanceMode.Stop
                ? Math.Min(cruise, Math.Min(2 * Math.Asinh(Math.Sqrt(BrakingShare * a * distance / 2)), Math.Asinh(distance / (PositionSteps * step))))
                : cruise;
            Vec3 wanted = toGo.NormalizedOr(Vec3.Zero) * Math.Sinh(rapidity);
            // du/dτ in the target frame, then the four-acceleration (A·u/γ, A), which is orthogonal to the four-velocity.
            Vec3 push = (wanted - u) / (VelocitySteps * step);
            double gamma = Math.Sqrt(1 + u.LengthSquared);
            var fourAcceleration = new FourVector(Vec3.Dot(push, u) / gamma, push);
            Vec3 thrust = ship.Frame.FromHome(rest.ToHome(fourAcceleration)).Space;
            if (thrust.Length > a) thrust *= a / thrust.Length;
            // Nose prograde on a flyby: at speed, aberration crowds the body forward, so at the closest pass
            // (90° off the line of flight in the body's frame) it appears only 2·atan(e^−φ) from the nose.
            Vec3 turn = mode == GuidanceMode.Flyby && ship.Velocity.Rapidity > 0
                ? PlanPilot.TurnToward(flight, ship.Frame.Orientation.Inverse.Rotate(ship.Velocity.Direction), step)
                : Vec3.Zero;
            return new Controls(thrust, turn);
        }
    }
}
