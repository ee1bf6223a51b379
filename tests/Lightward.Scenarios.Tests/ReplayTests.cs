using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Tests;

public sealed class ReplayTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lw-replay-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    private (Flight Flight, string Log) Record(Scenario scenario, IPilot pilot)
    {
        string log = Path.Combine(_folder, $"{Guid.NewGuid():N}{FlightLogFormat.Extension}");
        using FlightRecorder recorder = FlightRecorder.Create(log, scenario, "test");
        return (Drill.Fly(scenario, pilot, recorder), log);
    }

    [Fact]
    public void A_recorded_plan_flight_replays_bit_identically()
    {
        Scenario scenario = Flights.Load("beacon-stop.toml");
        (Flight flown, string log) = Record(scenario, new PlanPilot(PlanFile.Load(Flights.ScenarioPath("beacon-stop.plan.toml"), scenario.Ship)));
        FlightLog read = FlightLog.Read(log);
        Assert.Equal(flown.StateHash(), read.FinalStateHash);
        Flight replayed = Drill.Replay(read, Drill.ScenarioFor(read));
        Assert.Equal(flown.StateHash(), replayed.StateHash());
        Assert.Equal(flown.Verdict, replayed.Verdict);
    }

    [Fact]
    public void A_recorded_autopilot_flight_replays_bit_identically()
    {
        Scenario scenario = Flights.Load("twin-drill.toml");
        (Flight flown, string log) = Record(scenario, new Autopilot());
        FlightLog read = FlightLog.Read(log);
        Assert.Equal(flown.StateHash(), Drill.Replay(read, Drill.ScenarioFor(read)).StateHash());
        Assert.True(new FileInfo(log).Length < flown.Steps * 80, "a log costs at most one record per step");
    }

    [Fact]
    public void A_log_whose_scenario_changed_is_refused_with_a_clear_message()
    {
        string copy = Path.Combine(_folder, "free-flight.toml");
        File.Copy(Flights.ScenarioPath("free-flight.toml"), copy);
        (_, string log) = Record(ScenarioFile.Load(copy), new Autopilot());
        File.AppendAllText(copy, "\n# edited after the flight\n");
        var error = Assert.Throws<UserInputException>(() => Drill.ScenarioFor(FlightLog.Read(log)));
        Assert.Contains("hash", error.Message);
        Assert.Contains(copy, error.Message);
    }

    [Fact]
    public void A_log_cut_short_by_a_crash_still_replays_up_to_its_last_whole_record()
    {
        Scenario scenario = Flights.Load("twin-drill.toml");
        (Flight flown, string log) = Record(scenario, new PlanPilot(PlanFile.Load(Flights.ScenarioPath("twin-drill.plan.toml"), null)));
        byte[] bytes = File.ReadAllBytes(log);
        File.WriteAllBytes(log, bytes[..^40]);
        FlightLog read = FlightLog.Read(log);
        Assert.Null(read.FinalStateHash);
        Assert.True(read.Truncated);
        Flight replayed = Drill.Replay(read, Drill.ScenarioFor(read));
        Assert.True(replayed.Steps < flown.Steps);
    }

    [Fact]
    public void Damaged_logs_are_user_errors()
    {
        string log = Path.Combine(_folder, "not-a-log.flightlog");
        File.WriteAllText(log, "hello");
        Assert.Throws<UserInputException>(() => FlightLog.Read(log));
        File.WriteAllBytes(log, [.. FlightLogFormat.Magic, 1, 0, 7]);
        Assert.Throws<UserInputException>(() => FlightLog.Read(log));
    }

    [Fact]
    public void The_recorder_flushes_within_a_second_while_a_live_flight_is_paused()
    {
        Scenario scenario = Flights.Load("free-flight.toml");
        string log = Path.Combine(_folder, "live.flightlog");
        using FlightRecorder recorder = FlightRecorder.Create(log, scenario, "live");
        var flight = new Flight(scenario, recorder);
        for (int i = 0; i < 10; i++) flight.Step(new Controls(new Vec3(0, 0, Units.G), Vec3.Zero), 1.0 / 60);
        long header = new FileInfo(log).Length;
        Thread.Sleep(1500);
        // Read while the recorder still has the file open, as after a crash.
        FlightLog read = FlightLog.Read(log);
        Assert.Equal(10, read.Runs.Sum(r => r.Count));
        Assert.True(new FileInfo(log).Length > header);
    }
}
