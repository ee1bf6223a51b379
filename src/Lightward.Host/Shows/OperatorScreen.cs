using System.Globalization;
using Lightward.Rendering;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;
using SkiaSharp;

namespace Lightward.Host.Shows;

/// <summary>
/// The live show's operator screen, drawn on the CPU: the show's state (running, hold, waiting for go, manual
/// control), the show, ship and home clocks, a small preview of the dome, and the cue list with the current cue and
/// the one standing by marked, above the keys. The same picture goes to the operator window and to tests.
/// </summary>
public sealed class OperatorScreen : IDisposable
{
    public const int Width = 1024, Height = 640;
    /// <summary>Cue rows shown at once; the list scrolls to keep the current cue near the top.</summary>
    public const int VisibleRows = 14;
    public const int RowHeight = 30;
    /// <summary>The dome preview's square, and the cue list's left edge and first row's top, in pixels.</summary>
    public static readonly SKRectI PreviewArea = SKRectI.Create(24, 130, 300, 300);
    public const int CueListLeft = 348, CueListRight = Width - 24, FirstRowTop = 160;
    /// <summary>Backgrounds of the current cue's row and of the row standing by.</summary>
    public static readonly SKColor CurrentRow = new(0x1f, 0x6b, 0x38), StandbyRow = new(0x8a, 0x62, 0x0c);

    private static readonly SKColor Background = new(0x12, 0x14, 0x18), Text = new(0xe8, 0xe8, 0xe8), Dim = new(0x90, 0x96, 0xa0);
    private readonly SKTypeface _sans = BundledFonts.Load(BundledFonts.SansFileName), _mono = BundledFonts.Load(BundledFonts.MonoFileName);

    public RgbaImage Image { get; } = new(Width, Height);

    /// <summary>The row (0 = top of the list) where cue <paramref name="cueIndex"/> is drawn, or −1 when it is scrolled out of view.</summary>
    public static int RowOf(int cueIndex, ShowOperator show)
    {
        int row = cueIndex - FirstShownCue(show);
        return row is >= 0 and < VisibleRows ? row : -1;
    }

    /// <summary>Top edge of list row <paramref name="row"/>, pixels.</summary>
    public static int RowTop(int row) => FirstRowTop + row * RowHeight;

    /// <param name="moment">The moment on the dome (null before the first frame).</param>
    /// <param name="dome">The dome picture for the preview (null before the first frame).</param>
    /// <param name="soundStatus">Where the live sound goes, or why it is silent.</param>
    public unsafe void Draw(ShowOperator show, ShowMoment? moment, RgbaImage? dome, string soundStatus)
    {
        var info = new SKImageInfo(Width, Height, SKColorType.Rgba8888, SKAlphaType.Premul);
        fixed (byte* pixels = Image.Pixels)
        {
            using SKSurface surface = SKSurface.Create(info, (IntPtr)pixels, info.RowBytes);
            SKCanvas canvas = surface.Canvas;
            canvas.Clear(Background);
            using var title = new SKFont(_sans, 26);
            using var body = new SKFont(_sans, 17);
            using var mono = new SKFont(_mono, 17);
            using var paint = new SKPaint { IsAntialias = true, Color = Text };

            canvas.DrawText(Fit(show.Script.Title, title, 560), 24, 44, SKTextAlign.Left, title, paint);
            DrawState(canvas, show, body);
            paint.Color = Text;
            canvas.DrawText(Clocks(show, moment), 24, 98, SKTextAlign.Left, mono, paint);
            DrawPreview(canvas, dome, body);
            DrawCueList(canvas, show, body, mono);
            paint.Color = Dim;
            canvas.DrawText("Space/G go   H hold/resume   B back   M manual control (right-drag turns the camera)   Q/Esc end", 24, Height - 44, SKTextAlign.Left, body, paint);
            canvas.DrawText(Fit($"sound: {soundStatus}", body, Width - 48), 24, Height - 18, SKTextAlign.Left, body, paint);
            canvas.Flush();
        }
    }

    /// <summary>The stage state as a coloured badge at the top right; manual control gets a second badge.</summary>
    private static void DrawState(SKCanvas canvas, ShowOperator show, SKFont font)
    {
        (string word, SKColor colour) = show.Finished ? ("END OF SHOW", new SKColor(0x55, 0x5a, 0x66))
            : show.WaitingForGo ? ("WAITING FOR GO", StandbyRow)
            : show.Held ? ("HOLD", new SKColor(0xa8, 0x24, 0x24))
            : ("RUNNING", CurrentRow);
        float right = Width - 24;
        right = Badge(canvas, word, colour, right, font) - 12;
        if (show.ManualControl) Badge(canvas, "MANUAL CONTROL", new SKColor(0x1c, 0x6e, 0x8c), right, font);
    }

    /// <summary>Draws a badge whose right edge is at <paramref name="right"/>; returns its left edge.</summary>
    private static float Badge(SKCanvas canvas, string word, SKColor colour, float right, SKFont font)
    {
        float width = font.MeasureText(word) + 24;
        using var fill = new SKPaint { Color = colour, IsAntialias = true };
        canvas.DrawRoundRect(new SKRect(right - width, 18, right, 52), 6, 6, fill);
        using var text = new SKPaint { Color = SKColors.White, IsAntialias = true };
        canvas.DrawText(word, right - width / 2, 41, SKTextAlign.Center, font, text);
        return right - width;
    }

    private static unsafe void DrawPreview(SKCanvas canvas, RgbaImage? dome, SKFont font)
    {
        using var frame = new SKPaint { Color = Dim, Style = SKPaintStyle.Stroke, StrokeWidth = 1 };
        SKRect area = PreviewArea;
        canvas.DrawRect(area, frame);
        using var label = new SKPaint { Color = Dim, IsAntialias = true };
        canvas.DrawText("dome", area.Left, area.Bottom + 22, SKTextAlign.Left, font, label);
        if (dome is null) return;
        var info = new SKImageInfo(dome.Width, dome.Height, SKColorType.Rgba8888, SKAlphaType.Opaque);
        // Letterboxed inside the square, so a wide perspective or panorama picture keeps its shape; mipmapped, so
        // single-pixel stars shrink to dimmer points instead of flickering away.
        float scale = Math.Min(area.Width / (float)dome.Width, area.Height / (float)dome.Height);
        float width = dome.Width * scale, height = dome.Height * scale;
        var target = SKRect.Create(area.MidX - width / 2, area.MidY - height / 2, width, height);
        fixed (byte* pixels = dome.Pixels)
        {
            using var pixmap = new SKPixmap(info, (IntPtr)pixels, info.RowBytes);
            using SKImage picture = SKImage.FromPixels(pixmap);
            canvas.DrawImage(picture, target, new SKSamplingOptions(SKFilterMode.Linear, SKMipmapMode.Linear));
        }
    }

    private static void DrawCueList(SKCanvas canvas, ShowOperator show, SKFont font, SKFont mono)
    {
        using var paint = new SKPaint { IsAntialias = true, Color = Dim };
        float numberRight = CueListLeft + 130, atRight = CueListLeft + 210, labelLeft = CueListLeft + 230, changesLeft = CueListLeft + 475;
        canvas.DrawText("cue", numberRight, FirstRowTop - 10, SKTextAlign.Right, font, paint);
        canvas.DrawText("at", atRight, FirstRowTop - 10, SKTextAlign.Right, font, paint);
        canvas.DrawText("label", labelLeft, FirstRowTop - 10, SKTextAlign.Left, font, paint);
        canvas.DrawText("changes", changesLeft, FirstRowTop - 10, SKTextAlign.Left, font, paint);
        int first = FirstShownCue(show);
        for (int row = 0; row < VisibleRows && first + row < show.Script.Cues.Count; row++)
        {
            int index = first + row;
            ShowCue cue = show.Script.Cues[index];
            float top = RowTop(row), baseline = top + RowHeight - 9;
            string state = "";
            if (index == show.CurrentCue || index == show.StandbyCue)
            {
                bool current = index == show.CurrentCue;
                using var band = new SKPaint { Color = current ? CurrentRow : StandbyRow };
                canvas.DrawRect(new SKRect(CueListLeft, top + 1, CueListRight, top + RowHeight - 1), band);
                state = current ? "NOW" : "STANDBY";
            }
            paint.Color = Text;
            canvas.DrawText(state, CueListLeft + 6, baseline, SKTextAlign.Left, font, paint);
            canvas.DrawText(cue.Number.ToString(CultureInfo.InvariantCulture), numberRight, baseline, SKTextAlign.Right, mono, paint);
            canvas.DrawText(Clock(cue.At), atRight, baseline, SKTextAlign.Right, mono, paint);
            canvas.DrawText(Fit(cue.Label, font, changesLeft - labelLeft - 12), labelLeft, baseline, SKTextAlign.Left, font, paint);
            canvas.DrawText(Fit(Changes(cue), font, CueListRight - changesLeft - 6), changesLeft, baseline, SKTextAlign.Left, font, paint);
        }
    }

    /// <summary>The first cue shown: the list scrolls so that two cues before the current one stay in view.</summary>
    private static int FirstShownCue(ShowOperator show) =>
        Math.Max(0, Math.Min(show.CurrentCue - 2, show.Script.Cues.Count - VisibleRows));

    private static string Clocks(ShowOperator show, ShowMoment? moment)
    {
        string clock = $"show {Clock(show.ShowTime)} / {Clock(show.Script.Length)}";
        if (moment is not { } m) return clock;
        return string.Create(CultureInfo.InvariantCulture,
            $"{clock}    ship {Span(m.Ship.ShipTime)}    home {Span(m.Ship.HomeTime)}    rapidity {m.Ship.Velocity.Rapidity:0.000}    x{m.TimeCompression:G3}");
    }

    /// <summary>What a cue changes, in a few words.</summary>
    public static string Changes(ShowCue cue) => string.Join(", ", new[]
    {
        cue.Hold ? "hold" : null, cue.BurnPlan is not null ? "plan" : null, cue.Rapidity is not null ? "speed" : null,
        cue.TimeCompression is not null ? "time" : null, cue.Look is not null ? "look" : null, cue.FieldOfView is not null ? "field" : null,
        cue.Fade is not null ? "fade" : null, cue.Grid is not null ? "grid" : null, cue.Bodies is not null ? "bodies" : null,
        cue.Instruments is not null ? "instruments" : null, cue.Sound is not null ? "sound" : null, cue.Caption is not null ? "caption" : null,
    }.Where(change => change is not null));

    /// <summary>Show time as minutes:seconds.tenths.</summary>
    public static string Clock(double seconds) => string.Create(CultureInfo.InvariantCulture, $"{(int)(seconds / 60)}:{seconds % 60:00.0}");

    /// <summary>A long time in the unit that reads best.</summary>
    private static string Span(double seconds) => Math.Abs(seconds) switch
    {
        < 120 => string.Create(CultureInfo.InvariantCulture, $"{seconds:0.0} s"),
        < 2 * Units.Day => string.Create(CultureInfo.InvariantCulture, $"{seconds / 3600:0.00} h"),
        < 2 * Units.JulianYear => string.Create(CultureInfo.InvariantCulture, $"{seconds / Units.Day:0.00} d"),
        _ => string.Create(CultureInfo.InvariantCulture, $"{seconds / Units.JulianYear:0.000} yr"),
    };

    /// <summary><paramref name="text"/> cut with an ellipsis to fit <paramref name="width"/> pixels.</summary>
    private static string Fit(string text, SKFont font, float width)
    {
        if (font.MeasureText(text) <= width) return text;
        int length = text.Length;
        while (length > 0 && font.MeasureText(text[..length] + "…") > width) length--;
        return text[..length] + "…";
    }

    public void Dispose()
    {
        _sans.Dispose();
        _mono.Dispose();
    }
}
