using System.Text.Json;
using Lightward.Rendering;

namespace Lightward.Cli.Tests;

public class FlyCommandTests
{
    [Fact]
    public void Without_a_display_fly_says_so_in_one_line_and_renders_a_png_instead()
    {
        string folder = Directory.CreateTempSubdirectory("lightward-fly-").FullName;
        var result = CliRunner.RunWith(folder, new Dictionary<string, string> { ["WAYLAND_DISPLAY"] = "" }, "fly", "--size", "320x180");
        Assert.True(result.ExitCode == 0, result.Stderr);
        string[] noWindow = result.Stderr.Split('\n').Where(line => line.Contains("no window")).ToArray();
        Assert.Single(noWindow);
        Assert.Contains("apt-get install libglfw3", noWindow[0]);
        string picture = Path.Combine(folder, "lightward-fly.png");
        Assert.Contains(picture, noWindow[0]);
        Assert.Equal(320, PngWriter.Read(picture).Width);
        Assert.Contains("(headless)", result.Stdout);
        Directory.Delete(folder, recursive: true);
    }

    [Fact]
    public void Keys_prints_the_default_key_file()
    {
        var result = CliRunner.Run("fly", "--keys");
        Assert.Equal(0, result.ExitCode);
        Assert.Contains("[keyboard]", result.Stdout);
        Assert.Contains("throttle-full", result.Stdout);
        Assert.Contains("[gamepad-axes]", result.Stdout);
    }

    [Fact]
    public void A_bad_key_file_is_reported_with_its_position_and_exit_code_2()
    {
        string folder = Directory.CreateTempSubdirectory("lightward-keys-").FullName;
        File.WriteAllText(Path.Combine(folder, "keys.toml"), "[keyboard]\npause = [\"Nowhere\"]\n");
        var result = CliRunner.RunIn(folder, "fly", "--headless", "--keys-file", "keys.toml");
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("lightward: error: keys.toml:2:10: keyboard.pause: unknown key 'Nowhere'", result.Stderr);
        Assert.DoesNotContain("   at ", result.Stderr);
        Directory.Delete(folder, recursive: true);
    }

    [Theory]
    [InlineData("--size", "12x9000", "--size")]
    [InlineData("--frames", "0", "--frames")]
    [InlineData("--seconds", "soon", "--seconds")]
    [InlineData("--view", "sideways", "--view")]
    [InlineData("--fov", "200 deg", "--fov")]
    [InlineData("--screenshot", "shot.jpg", "--screenshot")]
    [InlineData("--monitor", "-1", "--monitor")]
    public void Bad_flags_are_user_errors_naming_the_flag(string flag, string value, string named)
    {
        var result = CliRunner.Run("fly", "--headless", flag, value);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains($"lightward: error: {named}", result.Stderr);
    }

    [Fact]
    public void Headless_flight_writes_the_final_state()
    {
        string folder = Directory.CreateTempSubdirectory("lightward-fly-").FullName;
        var result = CliRunner.RunIn(folder, "fly", "--headless", "--frames", "4", "--size", "160x90", "--view", "panorama", "--state-out", "state.json");
        Assert.True(result.ExitCode == 0, result.Stderr);
        using JsonDocument state = JsonDocument.Parse(File.ReadAllText(Path.Combine(folder, "state.json")));
        Assert.Equal(4, state.RootElement.GetProperty("frames").GetInt64());
        // Frame 0 takes no loop time; frames 1…3 take 1/60 s each at the headless fixed clock.
        Assert.Equal(3.0 / 60, state.RootElement.GetProperty("ship_time_s").GetDouble(), 1e-12);
        Directory.Delete(folder, recursive: true);
    }

    [Fact]
    public void Headless_flight_records_its_sound_frame_locked()
    {
        string folder = Directory.CreateTempSubdirectory("lightward-fly-").FullName;
        var result = CliRunner.RunIn(folder, "fly", "--headless", "--frames", "31", "--size", "160x90", "--wav", "flight.wav");
        Assert.True(result.ExitCode == 0, result.Stderr);
        byte[] wav = File.ReadAllBytes(Path.Combine(folder, "flight.wav"));
        Assert.Equal("RIFF", System.Text.Encoding.ASCII.GetString(wav, 0, 4));
        // 30 frame intervals at the fixed 60 fps clock = 0.5 s; 16-bit stereo at 48 kHz = 4 bytes per sample frame.
        int dataChunk = wav.AsSpan().IndexOf("data"u8);
        Assert.Equal(24_000 * 4, BitConverter.ToInt32(wav, dataChunk + 4));
        Directory.Delete(folder, recursive: true);
    }

    [Fact]
    public void A_scenario_flight_is_logged_and_replays_bit_identically()
    {
        string folder = Directory.CreateTempSubdirectory("lightward-fly-log-").FullName;
        string scenario = ShippedScenarios.File("dock-tessaly.toml");
        var flight = CliRunner.RunIn(folder, "fly", scenario, "--headless", "--frames", "20", "--size", "160x90",
            "--screenshot", "shot.png", "--record", "live.flightlog");
        Assert.True(flight.ExitCode == 0, flight.Stderr);
        var replay = CliRunner.RunIn(folder, "replay", "live.flightlog");
        Assert.True(replay.ExitCode == 0, replay.Stderr);
        Assert.Contains("(equal to the recorded one)", replay.Stdout);
        Directory.Delete(folder, recursive: true);
    }
}
