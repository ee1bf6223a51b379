using Lightward.Optics;
using Lightward.Rendering.Projections;

namespace Lightward.Rendering;

/// <summary>
/// Renders one frame, CPU only: observer → optics → projection → background → exposure → stars → layers → tone map
/// → overlays (see <see cref="Render(Scene, Observer, Camera, RgbaImage)"/>). Keeps its buffers between frames, so a
/// steady stream of same-sized frames does not allocate; not safe to call from two threads at once (use one renderer
/// per thread). Output is identical for any thread count: every parallel stage gives each thread its own rows or
/// its own stars.
/// </summary>
public sealed class FrameRenderer
{
    private readonly SkyTransform _skyTransform = new();
    private readonly ApparentStars _apparentStars = new();
    private readonly StarSplatter _splatter = new();
    private readonly CosmicBackgroundPainter _background = new();
    private readonly ExposureMeter _meter = new();
    private readonly ParallelOptions _parallel;
    private readonly Action<int> _toneMapBand;
    private FrameContext? _frame;
    private Camera? _projectionCamera;
    private Projection? _projection;
    private bool _backgroundPainted;
    /// <summary>True while the HDR buffer is known to be all zeros: new, or zeroed by the last tone map.</summary>
    private bool _hdrIsZero;

    /// <param name="maxThreads">Threads to use; −1 for all cores. The image does not depend on it.</param>
    public FrameRenderer(int maxThreads = -1)
    {
        _parallel = new ParallelOptions { MaxDegreeOfParallelism = maxThreads };
        _toneMapBand = ToneMapBand;
    }

    /// <summary>HDR layers drawn in order after the stars (bodies, the grid of space).</summary>
    public List<IFrameLayer> Layers { get; } = [];

    /// <summary>Overlays drawn in order onto the tone-mapped image (instruments).</summary>
    public List<IOverlay> Overlays { get; } = [];

    /// <summary>The exposure the last frame used, in stops (display = HDR × 2^stops).</summary>
    public double LastExposureStops => _frame?.ExposureStops ?? double.NaN;

    /// <summary>The apparent stars of the last frame (ship axes, linear sRGB irradiance).</summary>
    public ApparentStars LastApparentStars => _apparentStars;

    /// <summary>Renders into a new image of the camera's size.</summary>
    public RgbaImage Render(Scene scene, Observer observer, Camera camera)
    {
        var image = new RgbaImage(camera.Width, camera.Height);
        Render(scene, observer, camera, image);
        return image;
    }

    /// <summary>The frame pipeline: each line is one stage, top to bottom.</summary>
    public void Render(Scene scene, Observer observer, Camera camera, RgbaImage image)
    {
        FrameContext frame = Prepare(scene, observer, camera, image);
        ApplyOptics(frame);
        ProjectStars(frame);
        PaintBackground(frame);
        MeterExposure(frame);
        SplatStars(frame);
        foreach (IFrameLayer layer in Layers) layer.Draw(frame);
        ToneMap(frame);
        foreach (IOverlay overlay in Overlays) overlay.Draw(frame);
    }

    private FrameContext Prepare(Scene scene, Observer observer, Camera camera, RgbaImage image)
    {
        if (image.Width != camera.Width || image.Height != camera.Height)
            throw new ArgumentException($"image is {image.Width}×{image.Height} but the camera is {camera.Width}×{camera.Height}", nameof(image));
        // Keep the HDR buffer while the size holds; a new output image only needs a new context around it.
        bool sameSize = _frame is not null && _frame.Hdr.Width == camera.Width && _frame.Hdr.Height == camera.Height;
        if (!sameSize || _frame!.Image != image)
        {
            _frame = new FrameContext(sameSize ? _frame!.Hdr : new HdrFrame(camera.Width, camera.Height), image);
            _hdrIsZero |= !sameSize;
        }
        if (_projectionCamera != camera)
        {
            _projection = camera.CreateProjection();
            _projectionCamera = camera;
        }
        _frame.Projection = _projection!;
        _frame.Scene = scene;
        _frame.Observer = observer;
        _frame.Camera = camera;
        _frame.CameraToShip = observer.CameraToShip(camera);
        _frame.ShipToCamera = new AxesTransform(_frame.CameraToShip.Inverse);
        _frame.Parallel = _parallel;
        return _frame;
    }

    /// <summary>Optics: every star's apparent direction (ship axes), colour and brightness for this ship frame.</summary>
    private void ApplyOptics(FrameContext frame) =>
        _skyTransform.Apply(frame.Scene.Sky, frame.Observer.Ship.Frame, _apparentStars);

    /// <summary>Projection: apparent directions → camera axes → pixels.</summary>
    private void ProjectStars(FrameContext frame) =>
        _splatter.Project(_apparentStars, frame.ShipToCamera, frame.Projection, _parallel);

    /// <summary>
    /// Background: the CMB per pixel from its Doppler factor. When it cannot show, the frame only needs clearing —
    /// and usually not even that, since the tone map zeroes each pixel as it reads it.
    /// </summary>
    private void PaintBackground(FrameContext frame)
    {
        bool alreadyZero = _hdrIsZero;
        _hdrIsZero = false; // stays false if this frame fails half way
        _backgroundPainted = frame.Scene.ShowCosmicBackground
            && _background.Paint(frame.Hdr, frame.Projection, frame.Observer.Ship.Frame, frame.ShipToCamera, _parallel);
        if (!_backgroundPainted && !alreadyZero) _background.Clear(frame.Hdr, _parallel);
    }

    /// <summary>Exposure: the camera's manual setting, or metered from the stars and the background.</summary>
    private void MeterExposure(FrameContext frame) =>
        frame.ExposureScale = _meter.Meter(frame.Camera.Exposure, frame.Hdr, _backgroundPainted, _apparentStars, _splatter.X, _splatter.Y, _splatter.RadianceScale);

    /// <summary>Stars: point-spread splats into the HDR frame, footprints sized by exposed flux.</summary>
    private void SplatStars(FrameContext frame) => _splatter.Splat(frame.Hdr, frame.ExposureScale, _parallel);

    /// <summary>Tone map: HDR → tone curve → sRGB bytes, written straight into the output image; leaves the HDR buffer zeroed for the next frame.</summary>
    private void ToneMap(FrameContext frame)
    {
        Parallel.For(0, (frame.Hdr.Height + StarSplatter.BandHeight - 1) / StarSplatter.BandHeight, _parallel, _toneMapBand);
        _hdrIsZero = true;
    }

    private unsafe void ToneMapBand(int band)
    {
        FrameContext frame = _frame!;
        int firstRow = band * StarSplatter.BandHeight, endRow = Math.Min(frame.Hdr.Height, firstRow + StarSplatter.BandHeight);
        fixed (byte* pixels = frame.Image.Pixels)
            ToneMapper.MapAndClearRows(frame.Hdr, frame.ExposureScale, (uint*)pixels, firstRow, endRow);
    }
}
