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
/// may use <see cref="Parallel"/> with their own row bands, and must not keep the context past the call.
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
    /// <summary>Display value = HDR × this (known once metering has run: layers and overlays see the final value).</summary>
    public float ExposureScale { get; internal set; }
    public double ExposureStops => Math.Log2(ExposureScale);
    public ParallelOptions Parallel { get; internal set; } = new();
}

/// <summary>A stage that draws into the HDR frame after the stars and before tone mapping (bodies, the grid of space).</summary>
public interface IFrameLayer
{
    void Draw(FrameContext frame);
}

/// <summary>A stage that draws onto the tone-mapped RGBA image (instrument overlays, labels).</summary>
public interface IOverlay
{
    void Draw(FrameContext frame);
}
