namespace Lightward.Cli.Tests;

public sealed class ReplayCommandTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lw-replay-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    [Fact]
    public void A_log_whose_scenario_changed_is_refused_and_one_that_is_damaged_too()
    {
        string scenario = Path.Combine(_folder, "free-flight.toml"), log = Path.Combine(_folder, "flight.flightlog");
        File.Copy(ShippedScenarios.File("free-flight.toml"), scenario);
        var flown = CliRunner.RunIn(_folder, "drill", scenario, "--autopilot", "--record", log);
        Assert.True(flown.ExitCode == 0, flown.Stderr);

        var json = CliRunner.Run("replay", log, "--json");
        Assert.True(json.ExitCode == 0, json.Stderr);
        Assert.Contains("\"state_hash\"", json.Stdout);

        File.WriteAllText(scenario, File.ReadAllText(scenario).Replace("2 g", "3 g"));
        var changed = CliRunner.Run("replay", log);
        Assert.Equal(2, changed.ExitCode);
        Assert.Contains("needs the scenario exactly as it was flown", changed.Stderr);

        File.WriteAllText(log, "not a log");
        var damaged = CliRunner.Run("replay", log);
        Assert.Equal(2, damaged.ExitCode);
        Assert.Contains("not a flight log", damaged.Stderr);
    }
}
