using System.Text.Json;

namespace Lightward.Cli.Tests;

/// <summary>Bodies and the grid of space from the command line: render and observe with a scenario, and the --grid flag.</summary>
public class NearFieldCliTests
{
    [Fact]
    public void RenderDrawsAScenarioWithItsBodiesGridAndClockDial()
    {
        string output = Path.Combine(Path.GetTempPath(), $"lw-nearfield-{Guid.NewGuid():N}.png");
        try
        {
            var result = CliRunner.Run("render", ShippedScenarios.File("dock-tessaly.toml"), "--size", "320x200", "--fov", "0.5", "--look", "Tessaly Ring", "--out", output);
            Assert.True(result.ExitCode == 0, result.Stderr);
            Assert.True(new FileInfo(output).Length > 0);
        }
        finally
        {
            File.Delete(output);
        }
    }

    [Theory]
    [InlineData("0 ls", "--grid: '0 ls' must be a positive length")]
    [InlineData("2 parsecs", "--grid: unknown unit")]
    public void BadGridSpacingIsAUserError(string spacing, string expected)
    {
        var result = CliRunner.Run("render", "--grid", spacing, "--size", "64x64", "--out", Path.Combine(Path.GetTempPath(), "never.png"));
        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"lightward: error: {expected}", result.Stderr);
    }

    [Fact]
    public void ObserveListsBodiesWithTheirClocks()
    {
        var result = CliRunner.Run("observe", ShippedScenarios.File("dock-tessaly.toml"), "--limit", "1", "--json");
        Assert.True(result.ExitCode == 0, result.Stderr);
        using JsonDocument json = JsonDocument.Parse(result.Stdout);
        JsonElement ring = json.RootElement.GetProperty("bodies").EnumerateArray().Single(b => b.GetProperty("name").GetString() == "Tessaly Ring");
        // At home time 0 the Ring is 2 ls away, so its clock is seen 2 s behind (light travel time; Einstein 1905, §1).
        Assert.Equal(-2.0, ring.GetProperty("clock_s").GetDouble(), 1e-3);
        Assert.Equal(2.0, ring.GetProperty("light_path_ls").GetDouble(), 1e-3);
    }
}
