using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>Headless flights: fly a scenario with a pilot (recording it when asked), and replay recorded flights.</summary>
public static class Drill
{
    public static Flight Fly(Scenario scenario, IPilot pilot, FlightRecorder? recorder = null)
    {
        var flight = new Flight(scenario, recorder);
        pilot.Fly(flight);
        recorder?.Finish(flight.StateHash(), flight.Verdict?.Success ?? false);
        return flight;
    }

    /// <summary>The autopilot's flight of the scenario: the reference a trainee is compared with.</summary>
    public static FlightReport Reference(Scenario scenario) => FlightReport.From(Fly(scenario, new Autopilot()));

    /// <summary>
    /// The scenario a log was flown in: the file it names (or <paramref name="scenarioOverride"/>), refused when its
    /// content is no longer exactly what was flown.
    /// </summary>
    public static Scenario ScenarioFor(FlightLog log, Scenario? scenarioOverride = null)
    {
        Scenario scenario = scenarioOverride ?? Files.ScenarioFile.Load(log.ScenarioPath);
        if (scenario.ContentHash != log.ScenarioHash)
            throw new UserInputException(
                $"{log.Path}: was recorded in scenario {log.ScenarioPath} (content hash {log.ScenarioHash[..12]}…), but {scenario.SourcePath} now has hash " +
                $"{scenario.ContentHash[..12]}…; a replay needs the scenario exactly as it was flown (restore that version)");
        if (scenario.Flight.Step != log.Step)
            throw new UserInputException($"{log.Path}: recorded with a step of {log.Step} s, but the scenario's step is {scenario.Flight.Step} s");
        return scenario;
    }

    /// <summary>Flies the recorded controls again; the flight is bit-identical to the one recorded.</summary>
    public static Flight Replay(FlightLog log, Scenario scenario) => Fly(scenario, new LogPilot(log));

    private sealed class LogPilot(FlightLog log) : IPilot
    {
        public void Fly(Flight flight)
        {
            foreach (StepRun run in log.Runs)
            {
                if (run == StepRun.NewRun) flight.BeginRun();
                for (long i = 0; i < run.Count; i++)
                    flight.Step(run.Controls, run.Duration);
            }
        }
    }
}
