
namespace Lightward.Cli.Tests;

/// <summary>The shipped scenarios folder.</summary>
internal static class ShippedScenarios
{
    public static string Folder { get; } = Path.Combine(CliRunner.RepositoryRoot, "scenarios");

    public static string File(string name) => Path.Combine(Folder, name);
}

public sealed class CheckCommandTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lw-check-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    [Fact]
    public void Shipped_scenarios_and_plans_pass()
    {
        string[] files = Directory.GetFiles(ShippedScenarios.Folder, "*.toml").Where(f => !f.EndsWith(".show.toml")).ToArray();
        var result = CliRunner.Run(["check", .. files]);
        Assert.True(result.ExitCode == 0, result.Stderr);
        Assert.Contains("(burn plan)", result.Stdout);
        Assert.Contains("(scenario)", result.Stdout);
    }

    [Fact]
    public void Every_problem_is_printed_located_and_the_exit_code_is_2()
    {
        string bad = Path.Combine(_folder, "bad.toml");
        File.WriteAllText(bad, File.ReadAllText(ShippedScenarios.File("dock-tessaly.toml"))
            .Replace("max_acceleration = \"3 g\"", "max_acceleration = \"3 furlongs\"")
            .Replace("mass_ratio = 2.0", "mass_ratio = 0.5")
            .Replace("relative_speed = \"10 m/s\"", "relative_speed = \"1 c\""));
        var result = CliRunner.Run("check", bad);
        Assert.Equal(2, result.ExitCode);
        string[] lines = result.Stderr.Split('\n', StringSplitOptions.RemoveEmptyEntries);
        Assert.Contains(lines, l => l.StartsWith($"lightward: error: {bad}:") && l.Contains(": ship.max_acceleration: unknown unit 'furlongs'"));
        Assert.Contains(lines, l => l.Contains(": ship.mass_ratio: 0.5 is out of range (a number above 1"));
        Assert.Contains(lines, l => l.Contains(": task.relative_speed: ") && l.Contains("below 1 c"));
        Assert.DoesNotContain("   at ", result.Stderr);
    }

    [Fact]
    public void A_missing_file_is_a_user_error()
    {
        var result = CliRunner.Run("check", Path.Combine(_folder, "none.toml"));
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("not found", result.Stderr);
    }
}
