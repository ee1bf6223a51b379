using Lightward.Host.Shows;
using Lightward.Rendering;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;
using SkiaSharp;

namespace Lightward.Host.Tests.Shows;

/// <summary>The operator screen drawn without a window: the cue list follows the show, with the current and standing-by cues marked.</summary>
public class OperatorScreenTests
{
    /// <summary>Thirty cues a second apart, so the list has to scroll.</summary>
    private static ShowOperator Operator() => new(new ShowScript("/shows/long.show.toml", "Long", 40, Vec3.UnitX, ShowCautions.Default,
        Enumerable.Range(1, 30).Select(n => new ShowCue(n, $"Cue {n}", n, 0, Easing.Smooth)).ToArray()));

    private static (byte R, byte G, byte B) RowColour(OperatorScreen screen, int row) =>
        screen.Image[OperatorScreen.CueListRight - 8, OperatorScreen.RowTop(row) + OperatorScreen.RowHeight / 2];

    private static (byte, byte, byte) Rgb(SKColor colour) => (colour.Red, colour.Green, colour.Blue);

    [Fact]
    public void The_list_scrolls_to_keep_the_current_cue_in_view_and_marks_it_and_the_next()
    {
        ShowOperator show = Operator();
        for (int i = 0; i < 10; i++) show.Go();
        Assert.Equal(9, show.CurrentCue);
        using var screen = new OperatorScreen();
        screen.Draw(show, null, new RgbaImage(64, 64), "silent");

        int row = OperatorScreen.RowOf(show.CurrentCue, show);
        Assert.Equal(2, row);
        Assert.Equal(-1, OperatorScreen.RowOf(0, show));
        Assert.Equal(Rgb(OperatorScreen.CurrentRow), RowColour(screen, row));
        Assert.Equal(Rgb(OperatorScreen.StandbyRow), RowColour(screen, row + 1));
        Assert.NotEqual(Rgb(OperatorScreen.CurrentRow), RowColour(screen, row - 1));
    }

    [Fact]
    public void The_dome_preview_shows_the_dome_picture()
    {
        var dome = new RgbaImage(64, 64);
        dome.Pixels.Fill(255);
        using var screen = new OperatorScreen();
        screen.Draw(Operator(), null, dome, "silent");
        SKRectI area = OperatorScreen.PreviewArea;
        Assert.Equal(((byte)255, (byte)255, (byte)255), screen.Image[area.MidX, area.MidY]);
    }

    [Fact]
    public void Each_cue_lists_what_it_changes()
    {
        var cue = new ShowCue(1, "Burn", 0, 1, Easing.Smooth) { Hold = true, TimeCompression = 1e6, Caption = "Go" };
        Assert.Equal("hold, time, caption", OperatorScreen.Changes(cue));
    }
}
