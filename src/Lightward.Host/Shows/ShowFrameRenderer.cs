using Lightward.Audio;
using Lightward.Rendering;
using Lightward.Rendering.Instruments;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;
using SkiaSharp;

namespace Lightward.Host.Shows;

/// <summary>How a show is rendered: the camera (projection, size, dome aperture and tilt, exposure), the frame rate and mirror flips.</summary>
/// <param name="FlipHorizontal">Mirror left ↔ right (for projectors or dome masters that expect it).</param>
/// <param name="FlipVertical">Mirror top ↔ bottom.</param>
/// <param name="Threads">Threads to render with; −1 for all cores. The pictures do not depend on it.</param>
public sealed record ShowRenderSettings(Camera Camera, FrameRate FrameRate, bool FlipHorizontal, bool FlipVertical, int Threads = -1);

/// <summary>
/// Draws one frame of a show: the sky from the ship at that show time (<see cref="FrameRenderer"/>), the instruments
/// eased in and out, the caption, the fade, then the flips. A frame depends only on its number, never on which frames
/// were drawn before, so shards and resumed renders give the same bytes.
/// </summary>
public sealed class ShowFrameRenderer : IDisposable
{
    private readonly ShowTimeline _timeline;
    private readonly Scene _scene;
    private readonly ShowRenderSettings _settings;
    private readonly FrameRenderer _renderer;
    private readonly InstrumentOverlay _instruments = new();
    private readonly NearFieldLayer _sceneNearField;
    private readonly SpaceGrid _grid;
    private NearFieldLayer? _gridOnly;
    private readonly SKTypeface _captionFace = BundledFonts.Load(BundledFonts.SansFileName);
    private readonly byte[] _fadeTable = new byte[256];
    /// <summary>The picture without what is fading in or out, for cross-fades.</summary>
    private byte[] _without = [];

    /// <param name="sceneNearField">The bodies (and grid, if any) of the show's scene; empty for a show in open space.</param>
    public ShowFrameRenderer(ShowTimeline timeline, Scene scene, NearFieldLayer sceneNearField, ShowRenderSettings settings)
    {
        _timeline = timeline;
        _scene = scene;
        _settings = settings;
        _renderer = new FrameRenderer(settings.Threads);
        _sceneNearField = sceneNearField;
        // The scene's own grid, else ten spacings around the camera of the lattice at rest in the home frame the ship leaves.
        _grid = sceneNearField.Grid ?? SpaceGrid.AtRestInHome(timeline.Script.GridSpacing, 10 * timeline.Script.GridSpacing);
    }

    /// <summary>Show time of frame <paramref name="frame"/> (1-based): (frame − 1) / fps, as an exact fraction.</summary>
    public double TimeOf(int frame) => (double)(frame - 1) * _settings.FrameRate.Denominator / _settings.FrameRate.Numerator;

    public void Render(int frame, RgbaImage image) => RenderAt(TimeOf(frame), image);

    /// <summary>The picture at any show time; <paramref name="manualLook"/> (camera → ship axes) replaces the cues' look when the operator flies the camera.</summary>
    public ShowMoment RenderAt(double showTime, RgbaImage image, Rotation? manualLook = null)
    {
        ShowMoment moment = _timeline.At(showTime);
        if (manualLook is { } look) moment = moment with { Look = look };
        Camera camera = _settings.Camera.Kind == ProjectionKind.Perspective ? _settings.Camera with { FieldOfView = moment.FieldOfView } : _settings.Camera;
        if (camera.Width != image.Width || camera.Height != image.Height) camera = camera with { Width = image.Width, Height = image.Height };
        DrawSky(moment, camera, image);
        if (moment.InstrumentsOpacity > 0) DrawInstruments(moment, image);
        if (moment.CaptionOpacity > 0 && moment.Caption.Length > 0) DrawCaption(moment.Caption, moment.CaptionOpacity, image);
        if (moment.Fade < 1) Fade(moment.Fade, image);
        if (_settings.FlipHorizontal || _settings.FlipVertical) Flip(image, _settings.FlipHorizontal, _settings.FlipVertical);
        return moment;
    }

    /// <summary>
    /// The sky with the grid and bodies. While either is coming or going, the pictures without and with it are
    /// cross-faded after tone mapping: scaling its light instead would be undone by the automatic exposure, and solid
    /// bodies cannot be blended in the HDR frame.
    /// </summary>
    private void DrawSky(ShowMoment moment, Camera camera, RgbaImage image)
    {
        var observer = new Observer(moment.Ship, moment.Look);
        double[] changing = new[] { moment.GridOpacity, moment.BodiesOpacity }.Where(o => o is > 0 and < 1).ToArray();
        if (changing.Length > 0)
        {
            DrawSky(observer, camera, image, moment.GridOpacity >= 1, moment.BodiesOpacity >= 1);
            _without = CopyOf(image, _without);
        }
        DrawSky(observer, camera, image, moment.GridOpacity > 0, moment.BodiesOpacity > 0);
        if (changing.Length > 0) CrossFade(_without, image.Pixels, (float)changing.Average());
    }

    private void DrawSky(Observer observer, Camera camera, RgbaImage image, bool grid, bool bodies)
    {
        NearFieldLayer? layer = bodies ? _sceneNearField : grid ? _gridOnly ??= new NearFieldLayer([], null) : null;
        if (layer is not null) layer.Grid = grid ? _grid : null;
        _renderer.Layers.Clear();
        if (layer is not null) _renderer.Layers.Add(layer);
        _renderer.Render(_scene, observer, camera, image);
    }

    private static byte[] CopyOf(RgbaImage image, byte[] buffer)
    {
        if (buffer.Length != image.ReadOnlyPixels.Length) buffer = new byte[image.ReadOnlyPixels.Length];
        image.ReadOnlyPixels.CopyTo(buffer);
        return buffer;
    }

    /// <summary><paramref name="with"/> becomes the mix of the two pictures, <paramref name="weight"/> 0 (without) … 1 (with).</summary>
    private static void CrossFade(byte[] without, Span<byte> with, float weight)
    {
        for (int i = 0; i < with.Length; i++)
            with[i] = (byte)(without[i] + (with[i] - without[i]) * weight + 0.5f);
    }

    private void DrawInstruments(ShowMoment moment, RgbaImage image)
    {
        var trace = new WorldlineTrace();
        foreach (ShipState sample in _timeline.WorldlineUpTo(moment.ShowTime)) trace.Record(sample.Position);
        trace.Record(moment.Ship.Position);
        Controls controls = _timeline.ControlsAt(moment.ShowTime);
        string compression = FormattableString.Invariant($"x{moment.TimeCompression:G3}");
        double throttle = controls.ProperAcceleration == Vec3.Zero ? 0 : 1;
        var readings = FlightReadings.Of(moment.Ship, null, throttle, controls, _timeline.RapidityToGo(moment.ShowTime), compression, false, "", "");
        if (moment.InstrumentsOpacity >= 1)
        {
            _instruments.Draw(image.Pixels, image.Width, image.Height, readings, trace);
            return;
        }
        // Eased in or out: blend the drawn instruments over the picture without them.
        _without = CopyOf(image, _without);
        _instruments.Draw(image.Pixels, image.Width, image.Height, readings, trace);
        CrossFade(_without, image.Pixels, (float)moment.InstrumentsOpacity);
    }

    /// <summary>
    /// White text with a dark halo, centred. On a dome master the bottom edge is the front of the dome, so the caption
    /// sits 30% of the radius in from the bottom edge, about 36° above the front springline of a level dome.
    /// </summary>
    private unsafe void DrawCaption(string caption, double opacity, RgbaImage image)
    {
        var info = new SKImageInfo(image.Width, image.Height, SKColorType.Rgba8888, SKAlphaType.Premul);
        fixed (byte* pixels = image.Pixels)
        {
            using SKSurface surface = SKSurface.Create(info, (IntPtr)pixels, info.RowBytes);
            SKCanvas canvas = surface.Canvas;
            float size = Math.Max(8, image.Height / 24f);
            using var font = new SKFont(_captionFace, size);
            float width = font.MeasureText(caption);
            float scale = Math.Min(1, image.Width * 0.8f / Math.Max(1, width));
            font.Size = size * scale;
            float baseline = _settings.Camera.Kind == ProjectionKind.Domemaster ? image.Height * 0.85f : image.Height * 0.9f;
            byte alpha = (byte)Math.Round(255 * Math.Clamp(opacity, 0, 1));
            using var halo = new SKPaint { Color = new SKColor(0, 0, 0, alpha), IsAntialias = true, Style = SKPaintStyle.Stroke, StrokeWidth = font.Size / 6 };
            using var fill = new SKPaint { Color = new SKColor(255, 255, 255, alpha), IsAntialias = true };
            canvas.DrawText(caption, image.Width / 2f, baseline, SKTextAlign.Center, font, halo);
            canvas.DrawText(caption, image.Width / 2f, baseline, SKTextAlign.Center, font, fill);
            canvas.Flush();
        }
    }

    /// <summary>Scales the light itself (linear values, IEC 61966-2-1 decoding and encoding), so a fade looks even on the dome.</summary>
    private void Fade(double level, RgbaImage image)
    {
        for (int i = 0; i < 256; i++)
            _fadeTable[i] = (byte)Math.Round(255 * SrgbTransfer.Encode(SrgbTransfer.Decode(i / 255.0) * level));
        Span<byte> pixels = image.Pixels;
        for (int i = 0; i < pixels.Length; i += 4)
        {
            pixels[i] = _fadeTable[pixels[i]];
            pixels[i + 1] = _fadeTable[pixels[i + 1]];
            pixels[i + 2] = _fadeTable[pixels[i + 2]];
        }
    }

    private static void Flip(RgbaImage image, bool horizontal, bool vertical)
    {
        Span<uint> pixels = System.Runtime.InteropServices.MemoryMarshal.Cast<byte, uint>(image.Pixels);
        int width = image.Width, height = image.Height;
        if (horizontal)
            for (int y = 0; y < height; y++) pixels.Slice(y * width, width).Reverse();
        if (vertical)
            for (int top = 0, bottom = height - 1; top < bottom; top++, bottom--)
            {
                Span<uint> a = pixels.Slice(top * width, width), b = pixels.Slice(bottom * width, width);
                for (int x = 0; x < width; x++) (a[x], b[x]) = (b[x], a[x]);
            }
    }

    public void Dispose()
    {
        _instruments.Dispose();
        _captionFace.Dispose();
    }
}
