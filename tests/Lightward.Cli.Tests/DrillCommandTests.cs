using System.Text.Json;

namespace Lightward.Cli.Tests;

public sealed class DrillCommandTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lw-drill-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    [Fact]
    public void A_plan_is_flown_scored_recorded_and_written_as_json_markdown_and_plot()
    {
        string log = Path.Combine(_folder, "twin.flightlog"), markdown = Path.Combine(_folder, "record.md"), plot = Path.Combine(_folder, "worldlines.png");
        var result = CliRunner.RunIn(_folder, "drill", ShippedScenarios.File("twin-drill.toml"), "--plan", ShippedScenarios.File("twin-drill.plan.toml"),
            "--json", "--record", log, "--markdown", markdown, "--plot", plot);
        Assert.True(result.ExitCode == 0, result.Stderr);
        using var json = JsonDocument.Parse(result.Stdout);
        JsonElement root = json.RootElement;
        foreach (string key in new[] { "scenario", "success", "reason", "miss_distance_km", "relative_speed_kms", "ship_time_s", "home_time_s", "rapidity_used", "score", "reference_score" })
            Assert.True(root.TryGetProperty(key, out _), $"missing key {key}");
        Assert.True(root.GetProperty("success").GetBoolean());
        Assert.Equal("twin-drill", root.GetProperty("scenario").GetString());
        // Usenet Physics FAQ, "The Relativistic Rocket": four legs of T/4 home time each at a = 0.5 g give
        // τ = 4 (c/a) asinh(aT/(4c)); T = 12 Julian years (IAU), 1 g = 9.80665 m/s² (CGPM 1901).
        double a = 0.5 * 9.80665 / 299_792_458.0, homeTime = 12 * 365.25 * 86_400;
        Assert.Equal(4 * Math.Asinh(a * homeTime / 4) / a, root.GetProperty("ship_time_s").GetDouble(), 1e-3);
        Assert.Equal(homeTime, root.GetProperty("home_time_s").GetDouble(), 1e-3);

        Assert.StartsWith("# Training record", File.ReadAllText(markdown));
        Assert.Equal("\x89PNG", System.Text.Encoding.Latin1.GetString(File.ReadAllBytes(plot), 0, 4));
        Assert.Empty(Directory.GetFiles(_folder, "*.tmp"));

        var replay = CliRunner.Run("replay", log);
        Assert.True(replay.ExitCode == 0, replay.Stderr);
        Assert.Contains($"final state hash: {root.GetProperty("state_hash").GetString()}", replay.Stdout);
        Assert.Contains("equal to the recorded one", replay.Stdout);
    }

    [Fact]
    public void Recorded_flights_are_scored_in_batches_and_shards_split_them_without_overlap()
    {
        string logs = Directory.CreateDirectory(Path.Combine(_folder, "logs")).FullName;
        for (int i = 0; i < 3; i++)
        {
            var flown = CliRunner.RunIn(_folder, "drill", ShippedScenarios.File("free-flight.toml"), "--autopilot", "--json", "--record", Path.Combine(logs, $"flight{i}.flightlog"));
            Assert.True(flown.ExitCode == 0, flown.Stderr);
        }
        string[] Scored(string shard)
        {
            var result = CliRunner.Run("drill", ShippedScenarios.File("free-flight.toml"), "--logs", logs, "--shard", shard, "--json");
            Assert.True(result.ExitCode == 0, result.Stderr);
            using var json = JsonDocument.Parse(result.Stdout);
            return json.RootElement.EnumerateArray().Select(e => Path.GetFileName(e.GetProperty("flight_log").GetString()!)).ToArray();
        }
        string[] first = Scored("0/2"), second = Scored("1/2");
        Assert.Equal(["flight0.flightlog", "flight1.flightlog", "flight2.flightlog"], first.Concat(second).Order());
        Assert.Empty(first.Intersect(second));
    }

    [Theory]
    [InlineData(new[] { "--json" }, "--plan, --autopilot, --logs")]
    [InlineData(new[] { "--autopilot", "--shard", "1/2" }, "--shard")]
    [InlineData(new[] { "--logs", ".", "--shard", "2/2" }, "--shard")]
    [InlineData(new[] { "--autopilot", "--record", "x", "--no-record" }, "--record")]
    public void Bad_flag_combinations_name_the_flags(string[] flags, string named)
    {
        var result = CliRunner.Run(["drill", ShippedScenarios.File("free-flight.toml"), .. flags]);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains(named, result.Stderr);
    }

    [Fact]
    public void A_plan_asking_more_than_the_engine_gives_is_refused_with_its_location()
    {
        string plan = Path.Combine(_folder, "hard.plan.toml");
        File.WriteAllText(plan, "[[segment]]\nthrust = [\"0 g\", \"0 g\", \"5 g\"]\nduration = \"1 h\"\n");
        var result = CliRunner.Run("drill", ShippedScenarios.File("twin-drill.toml"), "--plan", plan, "--no-record");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains($"{plan}:2:10: segment[0].thrust: 5 g is more than the ship's engine gives (at most ship.max_acceleration = 0.5 g)", result.Stderr);
    }
}
