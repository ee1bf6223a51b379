
namespace Lightward.Cli.Tests;

/// <summary>`lightward show` without a display (the test runner removes DISPLAY): one line, exit 2, no stack trace.</summary>
public class ShowCommandTests
{
    [Fact]
    public void Without_a_display_the_live_show_says_so_in_one_line()
    {
        var result = CliRunner.Run("show", DemoShow());
        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith("lightward: error: show:", result.Stderr);
        Assert.Contains("render-show", result.Stderr);
        Assert.Single(result.Stderr.Trim().Split('\n'));
    }

    /// <summary>The shipped demo show, found from this source file so any artifacts path works.</summary>
    private static string DemoShow() => ShippedScenarios.File("outbound.show.toml");

    [Fact]
    public void A_missing_show_file_is_a_user_error()
    {
        var result = CliRunner.Run("show", "no-such.show.toml");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("no-such.show.toml", result.Stderr);
        Assert.DoesNotContain("   at ", result.Stderr);
    }
}
