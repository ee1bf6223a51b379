using System.Numerics;
using System.Runtime.CompilerServices;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Draws anti-aliased lines one pixel wide into the HDR frame: along each segment's major axis, every column (or
/// row) whose centre falls in the half-open span [start, end) lays the colour over the two or three pixels across,
/// with a coverage given by a tent of the perpendicular distance (so a line looks the same at any slope and
/// consecutive segments never paint a joint twice). Lines are laid over what is there rather than added to it, so
/// where many cross — a lattice crowded ahead of a fast ship — the picture takes the lines' colour instead of
/// piling up to white. A line point farther than the surface drawn in a pixel is hidden by it; pixels that show no
/// sky (outside a dome's disc) stay dark. Segments are first sorted into row bands (in their fixed order); the bands
/// are drawn in parallel, each by one thread, so the result does not depend on scheduling. Every pixel written is
/// marked touched in the frame. Keeps its band lists between frames.
/// </summary>
public sealed class LineDrawer
{
    private const int BandRows = 32;
    /// <summary>Rows beyond a segment's ends that its tent can reach.</summary>
    private const int Reach = 2;

    private readonly List<List<int>> _bands = [];

    /// <summary>
    /// Draws <paramref name="segments"/> into <paramref name="frame"/>, behind or in front of the surfaces in
    /// <paramref name="surfaces"/>, with their colours multiplied by <paramref name="colourScale"/>.
    /// </summary>
    public void Draw(List<PixelSegment> segments, HdrFrame frame, SkyRasterizer surfaces, float colourScale, ParallelOptions parallel)
    {
        if (frame.Width != surfaces.Width || frame.Height != surfaces.Height) throw new ArgumentException("frame and surface layer differ in size", nameof(surfaces));
        int bandCount = (frame.Height + BandRows - 1) / BandRows;
        while (_bands.Count < bandCount) _bands.Add([]);
        for (int band = 0; band < bandCount; band++) _bands[band].Clear();
        for (int s = 0; s < segments.Count; s++)
        {
            PixelSegment segment = segments[s];
            float low = MathF.Min(segment.Y0, segment.Y1) - Reach, high = MathF.Max(segment.Y0, segment.Y1) + Reach;
            if (!(high >= 0 && low < frame.Height)) continue;
            int first = Math.Max(0, (int)low / BandRows), last = Math.Min(bandCount - 1, (int)high / BandRows);
            for (int band = first; band <= last; band++) _bands[band].Add(s);
        }
        Parallel.For(0, bandCount, parallel, band =>
        {
            int top = band * BandRows, bottom = Math.Min(frame.Height, top + BandRows);
            foreach (int s in _bands[band]) DrawSegment(segments[s], colourScale, frame, surfaces, top, bottom);
        });
    }

    private static void DrawSegment(in PixelSegment s, float colourScale, HdrFrame frame, SkyRasterizer surfaces, int top, int bottom)
    {
        float dx = s.X1 - s.X0, dy = s.Y1 - s.Y0;
        float length = MathF.Sqrt(dx * dx + dy * dy);
        if (!(length > 0)) return;
        bool alongX = MathF.Abs(dx) >= MathF.Abs(dy);
        // Major-axis coordinate of the ends, minor-axis offset, and the factor turning a minor-axis offset into a perpendicular distance.
        float start = alongX ? s.X0 : s.Y0, end = alongX ? s.X1 : s.Y1;
        float minorStart = alongX ? s.Y0 : s.X0, minorChange = alongX ? dy : dx;
        float perpendicular = (alongX ? MathF.Abs(dx) : MathF.Abs(dy)) / length;
        float low = MathF.Min(start, end), high = MathF.Max(start, end);
        int majorLimit = alongX ? frame.Width : frame.Height;
        int first = Math.Max(0, (int)MathF.Ceiling(low - 0.5f)), last = Math.Min(majorLimit - 1, (int)MathF.Ceiling(high - 0.5f) - 1);
        if (!alongX)
        {
            first = Math.Max(first, top);
            last = Math.Min(last, bottom - 1);
        }
        else if (minorChange != 0)
        {
            // Only the columns where the line is within reach of this band's rows.
            float majorAtTop = start + (top - Reach - minorStart) / minorChange * (end - start);
            float majorAtBottom = start + (bottom + Reach - minorStart) / minorChange * (end - start);
            first = Math.Max(first, (int)MathF.Floor(MathF.Min(majorAtTop, majorAtBottom)));
            last = Math.Min(last, (int)MathF.Ceiling(MathF.Max(majorAtTop, majorAtBottom)));
        }
        if (first > last) return;
        float inverseSpan = 1 / (end - start);
        Vector3 colour0 = colourScale * s.Colour0, colourChange = colourScale * (s.Colour1 - s.Colour0);
        float depthChange = s.Depth1 - s.Depth0;
        // Most segments pass no surface and cross only pixels that show sky: those skip the per-pixel depth and sky
        // tests, which keeps a pixel's memory traffic to its three colour planes.
        var pixels = new LinePixels(frame, surfaces, alongX, top, bottom,
            surfaces.MayHaveSurfaceIn(s.X0, s.Y0, s.X1, s.Y1, Reach), surfaces.Directions.HasBlankPixels);
        for (int major = first; major <= last; major++)
        {
            float t = (major + 0.5f - start) * inverseSpan;
            float minor = minorStart + t * minorChange;
            Vector3 colour = colour0 + t * colourChange;
            float lineDepth = s.Depth0 + t * depthChange;
            // The pixel whose centre lies just below the line, and the line's offset from that centre (0 … 1): the
            // tent reaches the pixels either side, and one more on each side when the line is steep enough.
            int nearest = (int)MathF.Floor(minor - 0.5f);
            float offset = minor - (nearest + 0.5f);
            pixels.Add(major, nearest - 1, 1 - (1 + offset) * perpendicular, colour, lineDepth);
            pixels.Add(major, nearest, 1 - offset * perpendicular, colour, lineDepth);
            pixels.Add(major, nearest + 1, 1 - (1 - offset) * perpendicular, colour, lineDepth);
            pixels.Add(major, nearest + 2, 1 - (2 - offset) * perpendicular, colour, lineDepth);
        }
    }

    /// <summary>Lays tent-weighted colour over the pixels of one band, by major and minor coordinate.</summary>
    private readonly ref struct LinePixels(HdrFrame frame, SkyRasterizer surfaces, bool alongX, int top, int bottom, bool testDepth, bool testSky)
    {
        private readonly float[] _red = frame.Red, _green = frame.Green, _blue = frame.Blue, _skyX = surfaces.Directions.X;
        private readonly byte[] _touched = frame.Touched;
        private readonly int _width = frame.Width, _groupsPerRow = frame.GroupsPerRow;

        /// <summary>One pixel across the line, if covered, inside the band and the image, not behind a surface and showing sky.</summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public void Add(int major, int minor, float weight, Vector3 colour, float lineDepth)
        {
            if (weight <= 0) return;
            int x = alongX ? major : minor, y = alongX ? minor : major;
            if (y < top || y >= bottom || (uint)x >= (uint)_width) return;
            int i = y * _width + x;
            if ((testDepth && lineDepth > surfaces.DepthAt(i)) || (testSky && float.IsNaN(_skyX[i]))) return;
            _red[i] += weight * (colour.X - _red[i]);
            _green[i] += weight * (colour.Y - _green[i]);
            _blue[i] += weight * (colour.Z - _blue[i]);
            _touched[y * _groupsPerRow + x / HdrFrame.GroupWidth] = 1;
        }
    }
}
