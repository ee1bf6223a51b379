namespace Lightward.Cli.Tests;

public class ExitCodeTests
{
    [Fact]
    public void Unknown_command_is_a_user_error_with_exit_code_2_and_no_stack_trace()
    {
        var result = CliRunner.Run("no-such-verb");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("no-such-verb", result.Stderr);
        Assert.DoesNotContain("   at ", result.Stderr);
    }

    [Fact]
    public void Unknown_flag_is_a_user_error_naming_the_flag()
    {
        var result = CliRunner.Run("version", "--no-such-flag");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("no-such-flag", result.Stderr);
    }
}
