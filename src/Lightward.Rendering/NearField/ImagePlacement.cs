using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Pixel positions that may lie outside the image, for clipping: <see cref="Projection.TryProject"/> says whether a
/// direction lands on the image, but a triangle or line reaching in from outside needs its off-image corners too.
/// Those positions are continuous in the direction everywhere except across a seam: behind a flat screen (no
/// position at all), the equirectangular wrap and a dome's nadir (positions jump). Seams are found by callers from
/// positions that are implausibly far apart for the angle between their directions.
/// </summary>
internal static class ImagePlacement
{
    /// <summary>Smallest forward component a flat screen can place; anything nearer the eye plane is treated as behind.</summary>
    private const double PerspectiveNearLimit = 1e-6;

    public static bool TryPlace(Projection projection, Vec3 direction, out double x, out double y)
    {
        projection.TryProject(direction, out x, out y);
        bool placed = projection is not PerspectiveProjection || direction.Z > PerspectiveNearLimit;
        return placed && double.IsFinite(x) && double.IsFinite(y);
    }

    /// <summary>True when all three positions lie beyond the same edge of the image (nothing between them can show).</summary>
    public static bool BeyondOneEdge(Projection projection, double x0, double y0, double x1, double y1, double x2, double y2) =>
        (x0 < 0 && x1 < 0 && x2 < 0) || (y0 < 0 && y1 < 0 && y2 < 0)
        || (x0 > projection.Width && x1 > projection.Width && x2 > projection.Width)
        || (y0 > projection.Height && y1 > projection.Height && y2 > projection.Height);
}
