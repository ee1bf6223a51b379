using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Tests;

public class TwinDrillTests
{
    [Fact]
    public void Four_leg_plan_matches_the_closed_form_of_the_relativistic_rocket()
    {
        Scenario scenario = Flights.Load("twin-drill.toml");
        Flight flight = Drill.Fly(scenario, new PlanPilot(PlanFile.Load(Flights.ScenarioPath("twin-drill.plan.toml"), scenario.Ship)));
        Assert.True(flight.Verdict!.Success, flight.Verdict.Reason);

        double a = 0.5 * Units.G, homeTime = 12 * Units.JulianYear;
        // Usenet Physics FAQ, "The Relativistic Rocket" (P. Gibbs, D. Koks): from rest under proper acceleration a,
        // home time t = (c/a) sinh(aτ/c). Each of the four legs lasts t = T/4 of home time, so the ship clock reads
        // τ = 4 (c/a) asinh(aT/(4c)) on return.
        double shipTime = 4 * Math.Asinh(a * homeTime / 4) / a;
        Assert.Equal(homeTime, flight.HomeTimeFlown, homeTime * 1e-12);
        Assert.Equal(shipTime, flight.ShipTimeFlown, shipTime * 1e-9);
        // Same source: distance d = (c²/a)(cosh(aτ/c) − 1) per leg, and back at rest: speed ~ 0, home ~ 0.
        Assert.True(flight.Ship.Velocity.Beta < 1e-9, $"β = {flight.Ship.Velocity.Beta}");
        Assert.True(flight.Ship.Position.Space.Length < Units.Kilometre, $"{flight.Ship.Position.Space.Length / Units.Kilometre} km from home");
        // Same source: the farthest point is two accelerated legs out, 2 (c²/a)(cosh(aτ/c) − 1).
        double farthest = 2 * (Math.Cosh(a * shipTime / 4) - 1) / a;
        Assert.Equal(farthest, flight.Track.Max(e => e.Space.Length), farthest * 2e-3);
    }

    [Fact]
    public void Autopilot_program_has_the_same_closed_form()
    {
        Scenario scenario = Flights.Load("twin-drill.toml");
        FlightReport report = Drill.Reference(scenario);
        double a = 0.5 * Units.G, homeTime = 12 * Units.JulianYear;
        // Usenet Physics FAQ, "The Relativistic Rocket": τ = 4 (c/a) asinh(aT/(4c)) for the four-leg trip.
        Assert.True(report.Success, report.Reason);
        Assert.Equal(4 * Math.Asinh(a * homeTime / 4) / a, report.ShipTime, report.ShipTime * 1e-9);
    }
}
