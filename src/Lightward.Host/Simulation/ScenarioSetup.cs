using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.Instruments;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Host.Simulation;

/// <summary>Turns a loaded scenario into what a piloted flight needs: start, ship, target, beacons, task and sky.</summary>
public static class ScenarioSetup
{
    /// <summary>Side thrusters push with this fraction of the main engine (our design choice for the demo ships).</summary>
    public const double ThrusterFraction = 0.05;

    /// <param name="recorder">Where the flight's controls are logged, step by step; null for an unrecorded flight.</param>
    public static FlightSetup From(Scenario scenario, FlightRecorder? recorder = null)
    {
        var flight = new Flight(scenario, recorder);
        ShipStart ship = scenario.Ship;
        var capabilities = new ShipCapabilities(ship.MaxAcceleration, ThrusterFraction * ship.MaxAcceleration, ship.MaxTurnRate, ship.RapidityBudget);
        TargetTrack? target = scenario.Task.Target is { } name && scenario.FindBody(name) is { } body ? new TargetTrack(body.Name, body.Path) : null;
        Beacon[] beacons = scenario.Bodies.Where(b => b.BeaconRate is > 0).Select(b => new Beacon(b.Name, b.Path, b.BeaconRate!.Value)).ToArray();
        return new FlightSetup(scenario.Title, ship.State, capabilities, target, beacons, new ScenarioTaskWatch(flight), flight);
    }

    public static Scene SceneOf(Scenario scenario) => new(scenario.Sky.Source switch
    {
        SkySource.Procedural => StarCatalog.Procedural(scenario.Sky.StarCount, unchecked((int)scenario.Sky.Seed)),
        _ => scenario.Sky.CataloguePath is { } path ? StarCatalog.Load(path) : StarCatalog.LoadHipparcos(),
    });

    /// <summary>The verdict of the scenario's flight (task and time limits, judged as in a drill), shown while flying.</summary>
    private sealed class ScenarioTaskWatch(Flight flight) : ITaskWatch
    {
        /// <summary>Fraction of a time limit left below which the time-short alert sounds (common practice, no published source).</summary>
        private const double ShortFraction = 0.1;
        private bool _timeShort;

        public bool IsDecided => flight.Verdict is not null;
        public bool Succeeded => flight.Verdict is { Success: true };
        public bool TimeShort => _timeShort && flight.Verdict is null;

        public string Status => flight.Verdict is { } verdict
            ? $"{(verdict.Success ? "done" : "failed")}: {verdict.Reason}"
            : $"{flight.Scenario.Task.KindName.Replace('_', ' ')}{(flight.Scenario.Task.Target is { } target ? " " + target : "")}: flying";

        public void Observe(in ShipState before, in ShipState after)
        {
            double homeFlown = after.HomeTime - flight.Scenario.Ship.Start.T;
            _timeShort = after.ShipTime >= (1 - ShortFraction) * flight.Scenario.Flight.ShipTimeLimit
                || homeFlown >= (1 - ShortFraction) * flight.Scenario.Flight.HomeTimeLimit;
        }
    }
}
