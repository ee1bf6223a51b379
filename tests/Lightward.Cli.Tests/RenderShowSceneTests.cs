namespace Lightward.Cli.Tests;

/// <summary>`lightward render-show` with a scene file: its bodies are drawn, a cue can hide them, and the scene pins the delivery folder.</summary>
public sealed class RenderShowSceneTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lightward-show-scene-").FullName;

    // An invented scene: one glowing sphere 20 light-seconds out, 60° above the course, big enough to cover many pixels.
    private const string Scene = """
        title = "Test scene"
        briefing = "A sphere to look at."
        [flight]
        step = "1 s"
        ship_time_limit = "1 min"
        home_time_limit = "2 min"
        [ship]
        forward = [1, 0, 0]
        max_acceleration = "1 g"
        max_turn_rate = "5 deg/s"
        exhaust_speed = "1 c"
        mass_ratio = 2.0
        [[body]]
        name = "Test sphere"
        shape = "sphere"
        radius = "5 ls"
        temperature = "6000 K"
        [body.worldline]
        kind = "at_rest"
        position = ["10 ls", "0 ls", "17.32 ls"]
        [task]
        kind = "free"
        """;

    private string WriteShow(string name, string extra)
    {
        File.WriteAllText(Path.Combine(_folder, "scene.toml"), Scene);
        string path = Path.Combine(_folder, name + ".show.toml");
        File.WriteAllText(path, $"title = \"Scene test\"\nlength = \"1 s\"\n{extra}\n[[cue]]\nat = \"0 s\"\n");
        return path;
    }

    private byte[] FirstFrame(string name, string extra)
    {
        string output = Path.Combine(_folder, name);
        var result = CliRunner.Run("render-show", WriteShow(name, extra), "--size", "32", "--fps", "24", "--threads", "1", "--frames", "1..1", "--out", output);
        Assert.True(result.ExitCode == 0, result.Stderr);
        return File.ReadAllBytes(Path.Combine(output, "frames", name + "_000001.png"));
    }

    [Fact]
    public void The_scene_bodies_are_drawn_unless_a_cue_hides_them()
    {
        byte[] openSpace = FirstFrame("open", "");
        byte[] withBody = FirstFrame("body", "scene = \"scene.toml\"");
        byte[] hidden = FirstFrame("hidden", "scene = \"scene.toml\"\n[[cue]]\nat = \"0 s\"\nbodies = false");
        Assert.False(openSpace.AsSpan().SequenceEqual(withBody), "the body changed nothing");
        Assert.True(openSpace.AsSpan().SequenceEqual(hidden), "the hidden body still shows");
        Assert.Contains("scene_sha256 = ", File.ReadAllText(Path.Combine(_folder, "body", "extras", "body.render.toml")));
    }

    [Fact]
    public void A_missing_scene_is_a_located_user_error()
    {
        var result = CliRunner.Run("render-show", WriteShow("missing", "scene = \"nowhere.toml\""), "--out", Path.Combine(_folder, "x"));
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("missing.show.toml:3:9: scene: no such file \"nowhere.toml\"", result.Stderr);
        Assert.DoesNotContain("   at ", result.Stderr);
    }

    public void Dispose()
    {
        try { Directory.Delete(_folder, recursive: true); }
        catch (IOException) { }
    }
}
