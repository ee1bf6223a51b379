using Lightward.Scenarios.Files;
using Lightward.Scenarios.Shows;

namespace Lightward.Scenarios.Tests.Shows;

public class ShowScriptReaderTests
{
    private static (ShowScript? Script, List<FileProblem> Problems) Parse(string text)
    {
        var problems = new List<FileProblem>();
        ShowScript? script = ShowScriptReader.Parse(text, "test.show.toml", problems);
        return (script, problems);
    }

    private const string Minimal = """
        title = "Test flight"
        length = "20 s"

        [[cue]]
        at = "0 s"
        fade = "out"

        [[cue]]
        at = "1 s"
        label = "Lights up"
        transition = "3 s"
        easing = "decelerate"
        fade = "in"
        speed = "0.6 c"
        time_compression = 1e6
        look = { azimuth = "180 deg", elevation = "10 deg" }
        field_of_view = "100 deg"
        grid = true
        instruments = true
        hold = true
        caption = "Leaving the yard"
        """;

    [Fact]
    public void Reads_every_cue_key()
    {
        var (script, problems) = Parse(Minimal);
        Assert.Empty(problems);
        Assert.NotNull(script);
        Assert.Equal("Test flight", script.Title);
        Assert.Equal(20, script.Length);
        Assert.Equal(2, script.Cues.Count);
        ShowCue cue = script.Cues[1];
        Assert.Equal("Lights up", cue.Label);
        Assert.Equal(Easing.Decelerate, cue.Easing);
        Assert.Equal(3, cue.Transition);
        Assert.Equal(1, cue.Fade);
        // Rapidity φ = atanh β: the definition of rapidity, tanh φ = β (from memory).
        Assert.Equal(Math.Atanh(0.6), cue.Rapidity!.Value, 12);
        Assert.Equal(1e6, cue.TimeCompression);
        Assert.Equal(Math.PI, cue.Look!.Value.Azimuth, 12);
        Assert.Equal(100 * Math.PI / 180, cue.FieldOfView!.Value, 12);
        Assert.True(cue.Grid);
        Assert.True(cue.Hold);
        Assert.Equal("Leaving the yard", cue.Caption);
        Assert.Equal(ShowCautions.Default, script.Cautions);
        Assert.Equal("test", script.DeliveryName);
    }

    [Fact]
    public void Reports_every_problem_with_line_column_and_key_path()
    {
        var (script, problems) = Parse("""
            title = "Broken"
            length = "10 s"

            [cautions]
            dome_peak_luminance = "bright"

            [[cue]]
            at = "12 s"
            easing = "wobbly"
            speed = "1.2 c"
            colour = "red"
            """);
        Assert.Null(script);
        string all = string.Join("\n", problems);
        Assert.Contains("test.show.toml:5:23: cautions.dome_peak_luminance: \"bright\" is not a luminance", all);
        Assert.Contains("test.show.toml:9:10: cue[0].easing: unknown value \"wobbly\"", all);
        Assert.Contains("test.show.toml:10:9: cue[0].speed: \"1.2 c\" is out of range", all);
        Assert.Contains("test.show.toml:11:1: cue[0].colour: unknown key", all);
        Assert.Contains("cue[0].at: cue starts at 12 s, after the show ends at 10 s", all);
    }

    [Fact]
    public void Cues_out_of_order_are_refused()
    {
        var (_, problems) = Parse("""
            title = "Order"
            length = "10 s"
            [[cue]]
            at = "5 s"
            [[cue]]
            at = "2 s"
            """);
        var problem = Assert.Single(problems);
        Assert.Equal("cue[1].at", problem.KeyPath);
        Assert.Contains("before cue 1", problem.What);
    }

    [Fact]
    public void Missing_sound_file_is_named()
    {
        var (_, problems) = Parse("""
            title = "Quiet"
            length = "10 s"
            [[cue]]
            at = "0 s"
            sound = { file = "no-such-chime.wav", gain = "-6 dB", azimuth = "90 deg" }
            """);
        var problem = Assert.Single(problems);
        Assert.Equal("cue[0].sound.file", problem.KeyPath);
        Assert.Contains("no-such-chime.wav", problem.What);
    }

    [Fact]
    public void A_scene_file_is_read_relative_to_the_show_and_its_bodies_can_be_hidden()
    {
        var problems = new List<FileProblem>();
        ShowScript? script = ShowScriptReader.Parse("""
            title = "Scene"
            length = "10 s"
            scene = "flyby-ember.toml"
            [[cue]]
            at = "2 s"
            transition = "1 s"
            bodies = false
            """, Path.Combine(Repository.Scenarios, "scene-test.show.toml"), problems);
        Assert.Empty(problems);
        Assert.Equal("Orrin's Ember", Assert.Single(script!.Scene!.Bodies).Name);
        Assert.False(script.Cues[0].Bodies);
    }

    [Fact]
    public void A_missing_or_broken_scene_is_reported_where_it_is()
    {
        var (_, missing) = Parse("""
            title = "Scene"
            length = "10 s"
            scene = "no-such-scene.toml"
            [[cue]]
            at = "0 s"
            """);
        var problem = Assert.Single(missing);
        Assert.StartsWith("test.show.toml:3:9: scene: no such file \"no-such-scene.toml\"", problem.ToString());

        string folder = Directory.CreateTempSubdirectory("lw-show-scene-").FullName;
        try
        {
            File.WriteAllText(Path.Combine(folder, "broken.toml"), "title = \"Broken\"\n");
            var problems = new List<FileProblem>();
            ShowScriptReader.Parse("title = \"S\"\nlength = \"5 s\"\nscene = \"broken.toml\"\n[[cue]]\nat = \"0 s\"\n", Path.Combine(folder, "s.show.toml"), problems);
            Assert.NotEmpty(problems);
            Assert.All(problems, p => Assert.EndsWith("broken.toml", p.Location.File));
        }
        finally
        {
            Directory.Delete(folder, recursive: true);
        }
    }

    [Fact]
    public void Shipped_demo_show_is_valid()
    {
        string[] shows = Directory.GetFiles(Repository.Scenarios, "*" + ShowScriptReader.Extension);
        Assert.NotEmpty(shows);
        foreach (string show in shows) Assert.Empty(ShowScriptReader.Check(show));
    }
}
