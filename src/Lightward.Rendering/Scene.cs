using Lightward.Optics;
using Lightward.Rendering.Projections;

namespace Lightward.Rendering;

/// <summary>What there is to see, independent of where it is seen from: the star sky (directions, magnitudes and
/// temperatures in the home frame) and whether the cosmic background is drawn. Bodies and the grid of space join the
/// frame as <see cref="IFrameLayer"/>s.</summary>
public sealed record Scene(StarCatalog Sky, bool ShowCosmicBackground = true);

/// <summary>
/// Everything a layer needs to draw into one frame. Layers draw radiance in the HDR frame's units (a V = 0 star on
/// the reference pixel sums to 1; an extended source adds radiance per steradian × <c>Projection.ReferencePixelSolidAngle</c>),
/// may use <see cref="Parallel"/> with their own row bands while rasterising, and must not keep the context past the call.
/// </summary>
public sealed class FrameContext
{
    internal FrameContext(HdrFrame hdr, RgbaImage image) { Hdr = hdr; Image = image; }

    public Scene Scene { get; internal set; } = null!;
    public Observer Observer { get; internal set; }
    public Camera Camera { get; internal set; } = null!;
    public Projection Projection { get; internal set; } = null!;
    /// <summary>Camera axes → ship axes.</summary>
    public Spacetime.Rotation CameraToShip { get; internal set; }
    /// <summary>Ship axes → camera axes, single precision, for per-point loops.</summary>
    public AxesTransform ShipToCamera { get; internal set; }
    public HdrFrame Hdr { get; }
    /// <summary>The tone-mapped output; overlays draw here.</summary>
    public RgbaImage Image { get; }
    /// <summary>Display value = HDR × this (known once metering has run: layers' composites and overlays see the final value).</summary>
    public float ExposureScale { get; internal set; }
    /// <summary>Brightness (HDR units) of the surfaces the layers will lay over the frame, filled as they rasterise, for the exposure meter.</summary>
    public LevelHistogram SurfaceLevels { get; } = new();
    public double ExposureStops => Math.Log2(ExposureScale);
    public ParallelOptions Parallel { get; internal set; } = new();
}

/// <summary>
/// A stage that adds to the HDR frame in two passes (bodies, the grid of space). <see cref="Rasterize"/> runs before
/// the exposure is metered: the layer works out what it shows, draws it into buffers of its own and adds the
/// brightness of its surfaces to <see cref="FrameContext.SurfaceLevels"/>, so that what it shows is exposed for.
/// <see cref="Composite"/> runs after the stars are splatted, with the exposure known, once per row band: the layer
/// lays its buffers over the band's rows, which hold the frame's light so far, and marks every pixel group it
/// changes (<see cref="HdrBand.MarkTouched"/>), and may draw guides into the band's display overlay; the band is
/// tone-mapped, with the overlay laid over it, while it is still in cache.
/// </summary>
public interface IFrameLayer
{
    void Rasterize(FrameContext frame);

    /// <summary>
    /// Lays the layer over the rows of <paramref name="band"/>, writing no other row and only through the band (it
    /// may be a buffer of its own, not <see cref="FrameContext.Hdr"/>). Bands are composited in parallel, each by one
    /// thread, so a pixel's value must not depend on how the rows are split into bands.
    /// </summary>
    void Composite(FrameContext frame, HdrBand band);
}

/// <summary>
/// Rows [<see cref="FirstRow"/>, <see cref="EndRow"/>) of the HDR frame, held in <see cref="Buffer"/> (the whole
/// frame, or a band-sized buffer that stays in cache) whose row 0 is frame row <see cref="Origin"/>, and the same rows
/// of the guides drawn over the picture, held in <see cref="Overlay"/> whose row 0 is frame row <see cref="OverlayOrigin"/>.
/// </summary>
public readonly record struct HdrBand(HdrFrame Buffer, int Origin, int FirstRow, int EndRow, DisplayOverlay Overlay, int OverlayOrigin)
{
    /// <summary>Index in <see cref="Buffer"/>'s planes of the first pixel of frame row <paramref name="row"/>.</summary>
    public int RowStart(int row) => (row - Origin) * Buffer.Width;

    /// <summary>Marks columns [<paramref name="firstColumn"/>, <paramref name="endColumn"/>) of frame row <paramref name="row"/> (non-empty, inside the band) as touched.</summary>
    public void MarkTouched(int row, int firstColumn, int endColumn) => Buffer.MarkTouched(row - Origin, firstColumn, endColumn);
}

/// <summary>A stage that draws onto the tone-mapped RGBA image (instrument overlays, labels).</summary>
public interface IOverlay
{
    void Draw(FrameContext frame);
}
