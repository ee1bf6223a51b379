using System.Numerics;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Draws anti-aliased lines one pixel wide into the HDR frame: along each segment's major axis, every column (or
/// row) whose centre falls in the half-open span [start, end) adds the colour to the two or three pixels across,
/// weighted by a tent of the perpendicular distance (so a line's light per unit length is the same at any slope and
/// consecutive segments never paint a joint twice). A line point farther than the surface drawn in a pixel is
/// hidden by it; pixels that show no sky (outside a dome's disc) stay dark. Row bands are drawn in parallel, each
/// band by one thread over the segments in their fixed order, so the result does not depend on scheduling.
/// </summary>
public static class LineDrawer
{
    private const int BandRows = 32;

    /// <summary>Draws <paramref name="segments"/> into <paramref name="frame"/>, behind or in front of the surfaces in <paramref name="surfaces"/>.</summary>
    public static void Draw(IReadOnlyList<PixelSegment> segments, HdrFrame frame, SkyRasterizer surfaces, ParallelOptions parallel)
    {
        if (frame.Width != surfaces.Width || frame.Height != surfaces.Height) throw new ArgumentException("frame and surface layer differ in size", nameof(surfaces));
        float[] depth = surfaces.DepthBuffer, skyX = surfaces.Directions.X;
        int bands = (frame.Height + BandRows - 1) / BandRows;
        Parallel.For(0, bands, parallel, band =>
        {
            int top = band * BandRows, bottom = Math.Min(frame.Height, top + BandRows);
            for (int s = 0; s < segments.Count; s++)
            {
                PixelSegment segment = segments[s];
                if (MathF.Max(segment.Y0, segment.Y1) + 2 < top || MathF.Min(segment.Y0, segment.Y1) - 2 > bottom) continue;
                DrawSegment(segment, frame, depth, skyX, top, bottom);
            }
        });
    }

    private static void DrawSegment(in PixelSegment s, HdrFrame frame, float[] depth, float[] skyX, int top, int bottom)
    {
        float dx = s.X1 - s.X0, dy = s.Y1 - s.Y0;
        float length = MathF.Sqrt(dx * dx + dy * dy);
        if (!(length > 0)) return;
        bool alongX = MathF.Abs(dx) >= MathF.Abs(dy);
        // Major-axis coordinate of the ends, minor-axis slope, and the factor turning a minor-axis offset into a perpendicular distance.
        float start = alongX ? s.X0 : s.Y0, end = alongX ? s.X1 : s.Y1;
        float minorStart = alongX ? s.Y0 : s.X0;
        float perpendicular = (alongX ? MathF.Abs(dx) : MathF.Abs(dy)) / length;
        float low = MathF.Min(start, end), high = MathF.Max(start, end);
        int majorLimit = alongX ? frame.Width : frame.Height;
        int first = Math.Max(0, (int)MathF.Ceiling(low - 0.5f)), last = Math.Min(majorLimit - 1, (int)MathF.Ceiling(high - 0.5f) - 1);
        for (int major = first; major <= last; major++)
        {
            float centre = major + 0.5f;
            float t = (centre - start) / (end - start);
            float minor = minorStart + t * (alongX ? dy : dx);
            Vector3 colour = s.Colour0 + t * (s.Colour1 - s.Colour0);
            float lineDepth = s.Depth0 + t * (s.Depth1 - s.Depth0);
            int nearest = (int)MathF.Floor(minor - 0.5f);
            for (int m = nearest - 1; m <= nearest + 2; m++)
            {
                float weight = 1 - MathF.Abs(m + 0.5f - minor) * perpendicular;
                if (weight <= 0) continue;
                int x = alongX ? major : m, y = alongX ? m : major;
                if (y < top || y >= bottom || x < 0 || x >= frame.Width) continue;
                int i = y * frame.Width + x;
                if (lineDepth > depth[i] || float.IsNaN(skyX[i])) continue;
                frame.Red[i] += weight * colour.X;
                frame.Green[i] += weight * colour.Y;
                frame.Blue[i] += weight * colour.Z;
            }
        }
    }
}
