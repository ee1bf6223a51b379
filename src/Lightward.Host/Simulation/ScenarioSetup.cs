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

    public static FlightSetup From(Scenario scenario)
    {
        ShipStart ship = scenario.Ship;
        var capabilities = new ShipCapabilities(ship.MaxAcceleration, ThrusterFraction * ship.MaxAcceleration, ship.MaxTurnRate, ship.RapidityBudget);
        TargetTrack? target = scenario.Task.Target is { } name && scenario.FindBody(name) is { } body ? new TargetTrack(body.Name, body.Path) : null;
        Beacon[] beacons = scenario.Bodies.Where(b => b.BeaconRate is > 0).Select(b => new Beacon(b.Name, b.Path, b.BeaconRate!.Value)).ToArray();
        return new FlightSetup(scenario.Title, ship.State, capabilities, target, beacons, new ScenarioTaskWatch(scenario));
    }

    public static Scene SceneOf(Scenario scenario) => new(scenario.Sky.Source switch
    {
        SkySource.Procedural => StarCatalog.Procedural(scenario.Sky.StarCount, unchecked((int)scenario.Sky.Seed)),
        _ => scenario.Sky.CataloguePath is { } path ? StarCatalog.Load(path) : StarCatalog.LoadHipparcos(),
    });

    /// <summary>The scenario's task monitor and time limits, judged frame by frame while flying.</summary>
    private sealed class ScenarioTaskWatch(Scenario scenario) : ITaskWatch
    {
        private readonly TaskMonitor _monitor = TaskMonitor.For(scenario);
        private TaskVerdict? _verdict;

        /// <summary>Fraction of a time limit left below which the time-short alert sounds (common practice, no published source).</summary>
        private const double ShortFraction = 0.1;
        private bool _timeShort;

        public bool IsDecided => _verdict is not null;
        public bool Succeeded => _verdict is { Success: true };
        public bool TimeShort => _timeShort && _verdict is null;

        public string Status => _verdict is { } verdict
            ? $"{(verdict.Success ? "done" : "failed")}: {verdict.Reason}"
            : $"{scenario.Task.KindName.Replace('_', ' ')}{(scenario.Task.Target is { } target ? " " + target : "")}: flying";

        public void Observe(in ShipState before, in ShipState after)
        {
            _verdict = _monitor.Observe(before, after);
            if (_verdict is not null) return;
            double homeFlown = after.HomeTime - scenario.Ship.Start.T;
            _timeShort = after.ShipTime >= (1 - ShortFraction) * scenario.Flight.ShipTimeLimit
                || homeFlown >= (1 - ShortFraction) * scenario.Flight.HomeTimeLimit;
            if (after.ShipTime >= scenario.Flight.ShipTimeLimit) _verdict = _monitor.TimeUp("ship time limit");
            else if (homeFlown >= scenario.Flight.HomeTimeLimit) _verdict = _monitor.TimeUp("home time limit");
        }
    }
}
