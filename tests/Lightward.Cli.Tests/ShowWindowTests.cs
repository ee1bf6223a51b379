using Lightward.Host.Shows;
using Lightward.Rendering;
using SkiaSharp;

namespace Lightward.Cli.Tests;

/// <summary>`lightward show` under a private X server: the operator window opens with the dome window, takes the go key and shows the cue list.</summary>
public sealed class ShowWindowTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lightward-show-window-").FullName;

    // An invented show that waits at its first cue; the second and third are far apart, so only go moves the show to the second.
    private const string Show = """
        title = "Window test"
        length = "60 s"
        [[cue]]
        at = "0 s"
        label = "Preset: black"
        fade = "out"
        hold = true
        [[cue]]
        at = "20 s"
        label = "Lights up"
        transition = "2 s"
        fade = "in"
        [[cue]]
        at = "50 s"
        label = "Burn"
        transition = "5 s"
        rapidity = 1
        time_compression = 1e6
        """;

    [FlyWindowFact]
    public void Go_in_the_operator_window_advances_the_cue_and_the_window_shows_the_cue_list()
    {
        using var display = FlyDisplay.Start();
        File.WriteAllText(Path.Combine(_folder, "window.show.toml"), Show);
        var environment = new Dictionary<string, string> { ["DISPLAY"] = display.Name };
        Task<CliRunner.Result> show = Task.Run(() => CliRunner.RunWith(_folder, environment,
            "show", "window.show.toml", "--size", "64", "--operator-screenshot", "operator.png"));

        // Clear of the small dome window.
        display.ParkPointerOn("Lightward operator", 600, 400);
        display.XDoTool("key", "g");      // go: release the hold at the first cue
        Thread.Sleep(500);
        display.XDoTool("key", "g");      // go: fire the cue standing by
        Thread.Sleep(1000);
        display.XDoTool("key", "q");

        CliRunner.Result result = show.Result;
        Assert.True(result.ExitCode == 0, result.Stderr);
        Assert.Contains("cue 2 of 3 \"Lights up\" current, cue 3 of 3 \"Burn\" standing by", result.Stdout);

        RgbaImage screen = PngWriter.Read(Path.Combine(_folder, "operator.png"));
        Assert.Equal((OperatorScreen.Width, OperatorScreen.Height), (screen.Width, screen.Height));
        int x = OperatorScreen.CueListRight - 8;
        AssertColour(OperatorScreen.CurrentRow, screen[x, RowMiddle(1)], "the second cue is not marked current");
        AssertColour(OperatorScreen.StandbyRow, screen[x, RowMiddle(2)], "the third cue is not standing by");
        for (int row = 0; row < 3; row++)
            Assert.True(TextPixels(screen, row) > 30, $"no label drawn in cue row {row}");
        Assert.Equal(0, TextPixels(screen, 3));
    }

    private static int RowMiddle(int row) => OperatorScreen.RowTop(row) + OperatorScreen.RowHeight / 2;

    /// <summary>Light pixels in the label column of a cue row: the label's text.</summary>
    private static int TextPixels(RgbaImage screen, int row)
    {
        int count = 0;
        for (int y = OperatorScreen.RowTop(row) + 4; y < OperatorScreen.RowTop(row) + OperatorScreen.RowHeight - 4; y++)
            for (int x = OperatorScreen.CueListLeft + 232; x < OperatorScreen.CueListLeft + 420; x++)
                if (screen[x, y].R > 200 && screen[x, y].G > 200) count++;
        return count;
    }

    private static void AssertColour(SKColor expected, (byte R, byte G, byte B) actual, string message) =>
        Assert.True(Math.Abs(expected.Red - actual.R) <= 2 && Math.Abs(expected.Green - actual.G) <= 2 && Math.Abs(expected.Blue - actual.B) <= 2,
            $"{message}: expected {expected}, found ({actual.R}, {actual.G}, {actual.B})");

    public void Dispose()
    {
        try { Directory.Delete(_folder, recursive: true); }
        catch (IOException) { }
    }
}
