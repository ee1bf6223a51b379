using Lightward.Rendering.Instruments;
using SkiaSharp;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Marks every body that carries a clock with a dial and a label showing the reading its light brings: the body's
/// own time when the light left it. The dial's hand turns once per minute of that time, so a clock coming closer is
/// seen to run fast and one going away slow (by the Doppler factor). Drawn after tone mapping, beside the body.
/// </summary>
public sealed class ClockMarkers(NearFieldLayer nearField) : IOverlay, IDisposable
{
    private static readonly SKColor DialColour = new(255, 214, 120);
    private static readonly SKColor LabelShade = new(0, 0, 0, 150);
    private SKTypeface? _typeface;

    public unsafe void Draw(FrameContext frame)
    {
        _typeface ??= BundledFonts.Load(BundledFonts.MonoFileName);
        var info = new SKImageInfo(frame.Image.Width, frame.Image.Height, SKColorType.Rgba8888, SKAlphaType.Premul);
        fixed (byte* pixels = frame.Image.Pixels)
        {
            using SKSurface surface = SKSurface.Create(info, (IntPtr)pixels, frame.Image.Width * 4)
                ?? throw new InvalidOperationException("could not wrap the frame for drawing");
            float unit = Math.Clamp(frame.Image.Height / 40f, 10f, 32f);
            using var font = new SKFont(_typeface, unit);
            using var stroke = new SKPaint { IsAntialias = true, Style = SKPaintStyle.Stroke, StrokeWidth = Math.Max(1.5f, unit / 8), Color = DialColour };
            using var fill = new SKPaint { IsAntialias = true, Style = SKPaintStyle.Fill };
            foreach (BodyView view in nearField.LastViews)
            {
                if (!view.Body.CarriesClock || view.Appearance is not { } seen) continue;
                if (!frame.Projection.TryProject(seen.Direction, out double x, out double y)) continue;
                DrawDial(surface.Canvas, font, stroke, fill, (float)x, (float)y, unit, view.Body.Name, seen.ClockReading);
            }
            surface.Canvas.Flush();
        }
    }

    private static void DrawDial(SKCanvas canvas, SKFont font, SKPaint stroke, SKPaint fill, float x, float y, float unit, string name, double reading)
    {
        // The dial sits up and to the right of the body so it never hides it.
        float radius = unit * 0.9f, cx = x + 2.5f * unit, cy = y - 2.5f * unit;
        canvas.DrawLine(x + unit * 0.6f, y - unit * 0.6f, cx - radius * 0.7f, cy + radius * 0.7f, stroke);
        canvas.DrawCircle(cx, cy, radius, stroke);
        double turn = 2 * Math.PI * (reading / 60 - Math.Floor(reading / 60));
        canvas.DrawLine(cx, cy, cx + radius * 0.85f * (float)Math.Sin(turn), cy - radius * 0.85f * (float)Math.Cos(turn), stroke);
        string label = $"{name}  {Readout.Clock(reading)}";
        float width = font.MeasureText(label);
        float left = cx + radius + unit * 0.4f, baseline = cy + unit * 0.35f;
        fill.Color = LabelShade;
        canvas.DrawRect(left - unit * 0.2f, baseline - unit, width + unit * 0.4f, unit * 1.3f, fill);
        fill.Color = DialColour;
        canvas.DrawText(label, left, baseline, SKTextAlign.Left, font, fill);
    }

    public void Dispose() => _typeface?.Dispose();
}
