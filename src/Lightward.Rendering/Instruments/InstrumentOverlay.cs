using Lightward.Spacetime;
using SkiaSharp;

namespace Lightward.Rendering.Instruments;

/// <summary>
/// Draws the instruments over a finished (tone-mapped) RGBA frame: a readout column on the left and a live
/// home-frame spacetime diagram in the lower right. Colours: cool labels, warm values, so the numbers stand out
/// against a star field without looking like a star.
/// </summary>
public sealed class InstrumentOverlay : IDisposable
{
    private static readonly SKColor PanelShade = new(6, 10, 18, 205);
    private static readonly SKColor LabelColour = new(120, 190, 200);
    private static readonly SKColor ValueColour = new(255, 206, 130);
    private static readonly SKColor AlertColour = new(255, 110, 90);
    private static readonly SKColor WorldlineColour = new(255, 206, 130);
    private static readonly SKColor LightConeColour = new(250, 250, 210, 150);
    private static readonly SKColor HomeColour = new(120, 190, 200);
    private static readonly SKColor TargetColour = new(200, 140, 255);

    private const int TargetSamples = 64;

    private readonly SKTypeface _typeface;
    private readonly SKPaint _fill = new() { IsAntialias = true, Style = SKPaintStyle.Fill };
    private readonly SKPaint _stroke = new() { IsAntialias = true, Style = SKPaintStyle.Stroke };
    private readonly SKPath _path = new();
    private SKFont? _font, _smallFont;

    /// <summary>Uses the bundled monospace font, so columns of digits line up.</summary>
    public InstrumentOverlay() => _typeface = BundledFonts.Load(BundledFonts.MonoFileName);

    public unsafe void Draw(Span<byte> rgba, int width, int height, FlightReadings readings, WorldlineTrace trace)
    {
        if (rgba.Length < width * height * 4) throw new ArgumentException("frame buffer smaller than width × height × 4", nameof(rgba));
        var info = new SKImageInfo(width, height, SKColorType.Rgba8888, SKAlphaType.Premul);
        fixed (byte* pixels = rgba)
        {
            using SKSurface surface = SKSurface.Create(info, (IntPtr)pixels, width * 4)
                ?? throw new InvalidOperationException("could not wrap the frame for drawing");
            SKCanvas canvas = surface.Canvas;
            float unit = Math.Clamp(height / 42f, 10f, 30f);
            if (_font?.Size != unit)
            {
                _font?.Dispose();
                _smallFont?.Dispose();
                _font = new SKFont(_typeface, unit);
                _smallFont = new SKFont(_typeface, unit * 0.75f);
            }
            SKFont font = _font!;
            DrawReadout(canvas, font, unit, readings);
            float side = Math.Min(width, height) * 0.34f;
            DrawSpacetimeDiagram(canvas, _smallFont!, new SKRect(width - side - unit, height - side - unit, width - unit, height - unit), readings, trace);
            canvas.Flush();
        }
    }

    private void DrawReadout(SKCanvas canvas, SKFont font, float unit, FlightReadings r)
    {
        var rows = new List<(string Label, string Value, bool Alert)>
        {
            ("beta", Readout.Beta(r.Beta, r.OneMinusBeta), false),
            ("gamma", Readout.Number(r.Gamma), false),
            ("rapidity", Readout.Number(r.Rapidity), false),
            ("ship clock", Readout.Clock(r.Ship.ShipTime), false),
            ("home clock", Readout.Clock(r.Ship.HomeTime), false),
            ("doppler ahead", Readout.Number(r.DopplerAhead), false),
            ("doppler behind", Readout.Number(r.DopplerBehind), false),
            ("thrust", $"{Readout.Acceleration(r.ProperAcceleration)}  throttle {Readout.Percent(r.Throttle)}", false),
            ("rapidity left", Readout.Number(Math.Max(0, r.RapidityLeft)), r.RapidityLeft <= 0),
            ("hold", r.Hold, false),
            ("time", r.Paused ? $"{r.Compression}  PAUSED" : r.Compression, r.Paused),
        };
        if (r.Target is { } target && r.Sighting is { } sighting)
        {
            rows.Add(("target", target.Name, false));
            rows.Add(("distance", Readout.Distance(sighting.Distance), false));
            rows.Add(("bearing", $"{Readout.Degrees(sighting.Azimuth)} {Readout.Degrees(sighting.Elevation)}", false));
            rows.Add(("rel. rapidity", Readout.Number(sighting.RelativeRapidity), false));
        }
        if (r.TaskStatus.Length > 0) rows.Add(("task", r.TaskStatus, false));

        float lineHeight = unit * 1.3f, labelWidth = unit * 0.8f, valueWidth = 0;
        foreach ((string label, string value, _) in rows)
        {
            labelWidth = Math.Max(labelWidth, font.MeasureText(label) + unit * 0.8f);
            valueWidth = Math.Max(valueWidth, font.MeasureText(value));
        }
        var panel = new SKRect(unit * 0.6f, unit * 0.6f, unit * 1.4f + labelWidth + valueWidth, unit * 1.2f + lineHeight * rows.Count);
        _fill.Color = PanelShade;
        canvas.DrawRoundRect(panel, unit * 0.4f, unit * 0.4f, _fill);
        float y = panel.Top + unit * 0.3f + lineHeight * 0.8f;
        foreach ((string label, string value, bool alert) in rows)
        {
            _fill.Color = LabelColour;
            canvas.DrawText(label, panel.Left + unit * 0.4f, y, font, _fill);
            _fill.Color = alert ? AlertColour : ValueColour;
            canvas.DrawText(value, panel.Left + unit * 0.4f + labelWidth, y, font, _fill);
            y += lineHeight;
        }
    }

    /// <summary>
    /// Home-frame t–x diagram, x along the line from home toward the target (or toward the ship when there is no
    /// target), equal scales on both axes so light rays run at 45°.
    /// </summary>
    private void DrawSpacetimeDiagram(SKCanvas canvas, SKFont small, SKRect box, FlightReadings r, WorldlineTrace trace)
    {
        _fill.Color = PanelShade;
        canvas.DrawRoundRect(box, 8, 8, _fill);
        FourVector now = r.Ship.Position;
        Vec3 axis = (r.Target is { } aim ? aim.Worldline.EventAtHomeTime(now.T).Space : now.Space).NormalizedOr(Vec3.UnitX);
        double X(FourVector e) => Vec3.Dot(e.Space, axis);

        // Fit the flight so far, the home worldline and a margin for the light cone.
        double tMin = 0, tMax = Math.Max(now.T, 1e-9), xMin = 0, xMax = 0;
        foreach (FourVector e in trace.Events) { xMin = Math.Min(xMin, X(e)); xMax = Math.Max(xMax, X(e)); tMin = Math.Min(tMin, e.T); }
        xMin = Math.Min(xMin, X(now)); xMax = Math.Max(xMax, X(now));
        if (r.Target is { } seen)
        {
            double targetX = X(seen.Worldline.EventAtHomeTime(now.T));
            xMin = Math.Min(xMin, targetX); xMax = Math.Max(xMax, targetX);
        }
        double span = Math.Max(Math.Max(tMax - tMin, xMax - xMin), 1e-9) * 1.25;
        double tMid = (tMin + tMax) / 2, xMid = (xMin + xMax) / 2;
        float inner = box.Width * 0.84f, cx = box.MidX, cy = box.MidY;
        SKPoint P(double t, double x) => new(cx + (float)((x - xMid) / span * inner), cy - (float)((t - tMid) / span * inner));

        canvas.Save();
        canvas.ClipRect(box);
        _stroke.StrokeWidth = 1.5f;
        _stroke.Color = HomeColour;
        canvas.DrawLine(P(tMid - span, 0), P(tMid + span, 0), _stroke);
        if (r.Target is { } target)
        {
            _stroke.Color = TargetColour;
            _path.Reset();
            for (int i = 0; i <= TargetSamples; i++)
            {
                FourVector e = target.Worldline.EventAtHomeTime(tMid - span + 2 * span * i / TargetSamples);
                if (i == 0) _path.MoveTo(P(e.T, X(e))); else _path.LineTo(P(e.T, X(e)));
            }
            canvas.DrawPath(_path, _stroke);
        }
        _stroke.Color = LightConeColour;
        _stroke.StrokeWidth = 1f;
        canvas.DrawLine(P(now.T - span, X(now) - span), P(now.T + span, X(now) + span), _stroke);
        canvas.DrawLine(P(now.T - span, X(now) + span), P(now.T + span, X(now) - span), _stroke);

        _path.Reset();
        foreach (FourVector e in trace.Events)
        {
            if (_path.IsEmpty) _path.MoveTo(P(e.T, X(e))); else _path.LineTo(P(e.T, X(e)));
        }
        if (_path.IsEmpty) _path.MoveTo(P(now.T, X(now))); else _path.LineTo(P(now.T, X(now)));
        _stroke.Color = WorldlineColour;
        _stroke.StrokeWidth = 2.5f;
        canvas.DrawPath(_path, _stroke);
        _fill.Color = WorldlineColour;
        canvas.DrawCircle(P(now.T, X(now)), 4, _fill);
        canvas.Restore();

        _fill.Color = LabelColour;
        canvas.DrawText("home t-x", box.Left + 6, box.Top + small.Size + 4, small, _fill);
        canvas.DrawText($"span {Readout.Clock(span)}", box.Left + 6, box.Bottom - 6, small, _fill);
    }

    public void Dispose()
    {
        _path.Dispose();
        _font?.Dispose();
        _smallFont?.Dispose();
        _fill.Dispose();
        _stroke.Dispose();
        _typeface.Dispose();
    }
}
