using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;

namespace Lightward.Scenarios.Tests;

/// <summary>The task kinds the shipped scenarios do not cover, solved by the autopilot.</summary>
public class AutopilotTests
{
    private const string BeaconTask = "[task]\nkind = \"stop\"\ntarget = \"Lantern Nine\"\ndistance = \"0.2 lh\"\nrelative_speed = \"100 km/s\"";

    [Fact]
    public void Arrive_by_a_deadline_is_flown_without_braking()
    {
        Scenario scenario = Flights.Variant("beacon-stop.toml", text => text.Replace(BeaconTask,
            "[task]\nkind = \"arrive_by\"\npoint = [\"2.5 ly\", \"0 ly\", \"0 ly\"]\ndistance = \"1 lh\"\ndeadline = \"4 yr\""));
        FlightReport report = Drill.Reference(scenario);
        Assert.True(report.Success, report.Reason);
        // Reaching 2.5 ly takes more than 2.5 yr of home time at any speed below c.
        Assert.InRange(report.HomeTime / Spacetime.Units.JulianYear, 2.5, 4);
    }

    [Fact]
    public void Stop_at_a_point_off_the_nose_is_reached_with_corrections()
    {
        Scenario scenario = Flights.Variant("beacon-stop.toml", text => text.Replace(BeaconTask,
            "[task]\nkind = \"stop\"\npoint = [\"0.3 ly\", \"0.4 ly\", \"-0.2 ly\"]\ndistance = \"0.2 lh\"\nrelative_speed = \"100 km/s\""));
        FlightReport report = Drill.Reference(scenario);
        Assert.True(report.Success, report.Reason);
    }
}
