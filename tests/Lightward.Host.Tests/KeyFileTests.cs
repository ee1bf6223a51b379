using Lightward.Host.Input;

namespace Lightward.Host.Tests;

public class KeyFileTests
{
    [Fact]
    public void The_printed_defaults_are_a_valid_key_file_that_gives_every_action_a_key()
    {
        InputBindings defaults = KeyFile.Parse(KeyFile.DefaultText, "defaults.toml", baseline: null);
        foreach (PilotAction action in PilotActionNames.AllActions)
            Assert.NotEmpty(defaults.Keys[action]);
        Assert.Equal(PilotAction.ThrottleFull, defaults.ActionForKey(PhysicalInputNames.Keys["Z"]));
    }

    [Fact]
    public void A_user_file_overrides_only_what_it_names()
    {
        InputBindings bindings = KeyFile.Parse("[keyboard]\nthrottle-full = [\"F\", \"Home\"]\n", "mine.toml", KeyFile.Defaults);
        Assert.Equal(PilotAction.ThrottleFull, bindings.ActionForKey(PhysicalInputNames.Keys["F"]));
        Assert.Equal(PilotAction.ThrottleFull, bindings.ActionForKey(PhysicalInputNames.Keys["Home"]));
        Assert.Null(bindings.ActionForKey(PhysicalInputNames.Keys["Z"]));
        Assert.Equal(PilotAction.Pause, bindings.ActionForKey(PhysicalInputNames.Keys["P"]));
    }

    [Fact]
    public void Every_problem_is_reported_at_once_with_file_line_column_and_key_path()
    {
        const string text = """
            [keyboard]
            throttle-upp = ["A"]
            pitch-up = ["NoSuchKey"]

            [gamepad-axes]
            dead-zone = 1.5
            yaw = "Sideways"

            [mouse]
            look-per-pixel = "3 furlongs"

            [colours]
            sky = "blue"
            """;
        var error = Assert.Throws<KeyFileException>(() => KeyFile.Parse(text, "keys.toml", KeyFile.Defaults));
        string message = error.Message;
        Assert.Contains("keys.toml:2:1: keyboard.throttle-upp: unknown action (allowed: throttle-up,", message);
        Assert.Contains("keys.toml:3:13: keyboard.pitch-up: unknown key 'NoSuchKey' (allowed: A, B,", message);
        Assert.Contains("keys.toml:6:13: gamepad-axes.dead-zone: expected a number from 0 up to (not including) 1", message);
        Assert.Contains("keys.toml:7:7: gamepad-axes.yaw: unknown stick axis 'Sideways'", message);
        Assert.Contains("keys.toml:10:18: mouse.look-per-pixel: unknown unit 'furlongs'", message);
        Assert.Contains("keys.toml:12:1: [colours]: unknown section", message);
    }

    [Fact]
    public void A_key_bound_to_two_actions_is_an_error_naming_both()
    {
        var error = Assert.Throws<KeyFileException>(() => KeyFile.Parse("[keyboard]\npause = [\"Z\"]\n", "keys.toml", KeyFile.Defaults));
        Assert.Contains("key 'Z' is bound to both", error.Message);
        Assert.Contains("keyboard.throttle-full", error.Message);
        Assert.Contains("keyboard.pause", error.Message);
    }

    [Fact]
    public void Toml_syntax_errors_carry_their_position()
    {
        var error = Assert.Throws<KeyFileException>(() => KeyFile.Parse("[keyboard]\npause = [\"P\"\n", "broken.toml", KeyFile.Defaults));
        Assert.StartsWith("broken.toml:", error.Message);
    }

    [Fact]
    public void A_missing_key_file_is_a_user_error_naming_the_flag()
    {
        var error = Assert.Throws<KeyFileException>(() => KeyFile.Load("/nonexistent/keys.toml"));
        Assert.StartsWith("--keys-file: cannot read '/nonexistent/keys.toml'", error.Message);
    }
}
