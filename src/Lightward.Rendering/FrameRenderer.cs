using Lightward.Optics;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering;

/// <summary>
/// Renders one frame, CPU only: observer → optics → projection → background → layers rasterised → exposure → stars →
/// layers composited (light into HDR, guides into a display overlay) → tone map, overlay laid over → overlays (see <see cref="Render(Scene, Observer, Camera, RgbaImage)"/>); a frame of
/// stars alone is splatted and tone-mapped in one pass, and a frame with layers is splatted, composited and
/// tone-mapped band by band in one. Keeps its buffers between frames, so a steady stream of same-sized frames does
/// not allocate; not safe to call from two threads at once (use one renderer per thread).
/// Output is identical for any thread count: every parallel stage gives each thread its own rows or its own stars.
/// </summary>
public sealed class FrameRenderer
{
    private readonly SkyTransform _skyTransform = new();
    private readonly ApparentStars _apparentStars = new();
    private readonly StarSplatter _splatter = new();
    private readonly CosmicBackgroundPainter _background = new();
    private readonly ExposureMeter _meter = new();
    private readonly ParallelOptions _parallel;
    private readonly Func<int, BandBuffers, BandBuffers> _compositeAndToneMapBand;
    /// <summary>Band-sized buffers of the frame's width, one pair per thread of the composite-and-tone-map pass: all zero and unmarked between bands.</summary>
    private readonly ScratchPool<BandBuffers> _bandBuffers;
    private FrameContext? _frame;
    private Camera? _projectionCamera;
    private Projection? _projection;
    private bool _backgroundPainted;
    private Vec3[] _edgePlanes = [];
    /// <summary>True while the HDR buffer is known to be all zeros: new, or zeroed by the last tone map.</summary>
    private bool _hdrIsZero;
    /// <summary>Whether the output image's note of lit groups held when this frame's composite-and-tone-map pass began.</summary>
    private bool _litKnown;

    /// <param name="maxThreads">Threads to use; −1 for all cores. The image does not depend on it.</param>
    public FrameRenderer(int maxThreads = -1)
    {
        _parallel = new ParallelOptions { MaxDegreeOfParallelism = maxThreads };
        _bandBuffers = new ScratchPool<BandBuffers>(() => new BandBuffers(_frame!.Hdr.Width), buffers => buffers.Hdr.Width == _frame!.Hdr.Width);
        _compositeAndToneMapBand = CompositeAndToneMapBand;
    }

    /// <summary>HDR layers drawn in order after the stars (bodies, the grid of space).</summary>
    public List<IFrameLayer> Layers { get; } = [];

    /// <summary>Overlays drawn in order onto the tone-mapped image (instruments).</summary>
    public List<IOverlay> Overlays { get; } = [];

    /// <summary>The exposure the last frame used, in stops (display = HDR × 2^stops).</summary>
    public double LastExposureStops => _frame?.ExposureStops ?? double.NaN;

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
        RasterizeLayers(frame);
        MeterExposure(frame);
        if (StarsAlone) SplatStarsToDisplay(frame);
        else
        {
            SplatStars(frame);
            CompositeLayersAndToneMap(frame);
        }
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

    /// <summary>Optics: apparent direction (ship axes), colour and brightness of every star that can appear in the view.</summary>
    private void ApplyOptics(FrameContext frame) =>
        _skyTransform.Apply(frame.Scene.Sky, frame.Observer.Ship.Frame, _apparentStars,
            new ViewCone(frame.CameraToShip.Rotate(Vec3.UnitZ), frame.Projection.EnclosingHalfAngle, EdgePlanesInShipAxes(frame)), _parallel);

    /// <summary>The projection's edge planes turned from camera into ship axes (into a buffer kept between frames).</summary>
    private ReadOnlyMemory<Vec3> EdgePlanesInShipAxes(FrameContext frame)
    {
        ReadOnlySpan<Vec3> planes = frame.Projection.EdgePlanes.Span;
        if (_edgePlanes.Length < planes.Length) _edgePlanes = new Vec3[planes.Length];
        for (int i = 0; i < planes.Length; i++) _edgePlanes[i] = frame.CameraToShip.Rotate(planes[i]);
        return _edgePlanes.AsMemory(0, planes.Length);
    }

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
        frame.Hdr.WhollyTouched |= _backgroundPainted;
        if (!_backgroundPainted && !alreadyZero) _background.Clear(frame.Hdr, _parallel);
    }

    /// <summary>Layers, first pass: bodies and the grid work out what they show and draw it into buffers of their own, reporting how bright their surfaces are.</summary>
    private void RasterizeLayers(FrameContext frame)
    {
        frame.SurfaceLevels.Clear();
        foreach (IFrameLayer layer in Layers) layer.Rasterize(frame);
    }

    /// <summary>Exposure: the camera's manual setting, or metered from the stars, the background and the layers' surfaces.</summary>
    private void MeterExposure(FrameContext frame) =>
        frame.ExposureScale = _meter.Meter(frame.Camera.Exposure, frame.Hdr, _backgroundPainted, _splatter.StarLevels, frame.SurfaceLevels);

    /// <summary>Nothing but stars to draw: no background glow, no layers.</summary>
    private bool StarsAlone => !_backgroundPainted && Layers.Count == 0;

    /// <summary>
    /// Stars: point-spread splats, footprints sized by exposed flux — into the HDR frame when the background lit all
    /// of it, else binned here and splatted band by band into the composite pass's band buffers.
    /// </summary>
    private void SplatStars(FrameContext frame)
    {
        if (frame.Hdr.WhollyTouched) _splatter.Splat(frame.Hdr, frame.ExposureScale, _parallel);
        else _splatter.BinForBands(frame.Hdr.Width, frame.Hdr.Height, frame.ExposureScale, _parallel);
    }

    /// <summary>Stars alone: splatted tile by tile in cache and tone-mapped from there; the HDR frame stays zero.</summary>
    private void SplatStarsToDisplay(FrameContext frame)
    {
        _splatter.SplatAndToneMap(frame.Image, frame.ExposureScale, _parallel);
        _hdrIsZero = true;
    }

    /// <summary>
    /// Layers, second pass, then tone map, one row band at a time so that the band stays in cache between them: the
    /// band's stars are splatted into a band-sized buffer, the layers are laid over them in order, each marking the
    /// pixels it changes so the tone map need not read the rest, and drawing guides into a band-sized display overlay;
    /// the tone map turns HDR → tone curve → sRGB bytes, lays the overlay over them, and writes them straight into the
    /// output image. A frame the background lit everywhere is streamed through in place instead. Leaves the HDR frame
    /// and the band buffers zeroed for the next frame.
    /// </summary>
    private void CompositeLayersAndToneMap(FrameContext frame)
    {
        // A frame the background lit everywhere is written everywhere; a frame of marked groups keeps the image's note of lit groups.
        bool markedOnly = !frame.Hdr.WhollyTouched;
        _litKnown = frame.Image.LitGroupsKnown && markedOnly;
        frame.Image.LitGroupsKnown = false; // until every band is written
        try
        {
            ParallelItems.For(0, (frame.Hdr.Height + StarSplatter.BandHeight - 1) / StarSplatter.BandHeight, _parallel,
                _bandBuffers.Rent, _compositeAndToneMapBand, _bandBuffers.Return);
        }
        catch
        {
            // A band that failed half way may have left light in its buffer.
            _bandBuffers.Clear();
            throw;
        }
        frame.Hdr.WhollyTouched = false;
        _hdrIsZero = true;
        frame.Image.LitGroupsKnown = markedOnly;
    }

    private unsafe BandBuffers CompositeAndToneMapBand(int band, BandBuffers buffers)
    {
        FrameContext frame = _frame!;
        HdrFrame hdr = frame.Hdr;
        int firstRow = band * StarSplatter.BandHeight, endRow = Math.Min(hdr.Height, firstRow + StarSplatter.BandHeight);
        bool inPlace = hdr.WhollyTouched;
        HdrBand rows = new(inPlace ? hdr : buffers.Hdr, inPlace ? 0 : firstRow, firstRow, endRow, buffers.Overlay, firstRow);
        if (!inPlace) _splatter.SplatBand(buffers.Hdr, band);
        foreach (IFrameLayer layer in Layers) layer.Composite(frame, rows);
        RgbaImage image = frame.Image;
        fixed (byte* pixels = image.RendererPixels)
        fixed (ushort* lit = image.LitGroups)
            ToneMapper.MapAndClearRows(rows.Buffer, frame.ExposureScale, (uint*)pixels + (long)rows.Origin * hdr.Width, lit + image.LitEntry(rows.Origin, 0),
                _litKnown, firstRow - rows.Origin, endRow - rows.Origin, Layers.Count > 0 ? buffers.Overlay : null, 0);
        return buffers;
    }

    /// <summary>One thread's buffers for a band: its HDR rows and the guides drawn over them.</summary>
    private sealed class BandBuffers(int width)
    {
        public readonly HdrFrame Hdr = new(width, StarSplatter.BandHeight);
        public readonly DisplayOverlay Overlay = new(width, StarSplatter.BandHeight);
    }
}
