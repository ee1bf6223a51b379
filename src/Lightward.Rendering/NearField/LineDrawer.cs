using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using Lightward.Spacetime;
// Whether a line's pixels are each tested for a surface in front and for showing sky (so that the common untested
// loop carries no trace of the tests), and how a vector's eight lanes sit on the image: eight neighbouring pixels of
// one row, or four of each of two rows (a steep line's window across two consecutive rows, so that its arithmetic and
// its loads serve both at once).
using EveryPixelTested = Lightward.Rendering.FlagSet;
using NoPixelTested = Lightward.Rendering.FlagUnset;
using RowOfEight = Lightward.Rendering.FlagUnset;
using TwoRowsOfFour = Lightward.Rendering.FlagSet;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Draws anti-aliased lines one pixel wide into rows of a display overlay, laid over the tone-mapped picture: along
/// each segment's major axis, every column (or row) whose centre falls in the half-open span [start, end) lays the
/// colour over the two or three pixels across, with a coverage given by a tent of the perpendicular distance (so a
/// line looks the same at any slope and consecutive segments never paint a joint twice). The colour is the display
/// code the tone map gives the segment's exposed colour, interpolated along the segment, so a line shows as bright
/// whatever lies under it and costs the tone map nothing. Lines are laid over what is there rather than added to it,
/// so where many cross — a lattice crowded ahead of a fast ship — the picture takes the lines' colour instead of
/// piling up to white. A line point farther than the surface drawn in a pixel is hidden by it; pixels that show no
/// sky (outside a dome's disc) stay dark. Segments are first sorted into row bands (in their fixed order); any range
/// of rows is then drawn band by band, each pixel by the segments of its own band in that order, so the result does
/// not depend on how the rows are split between threads. Each row is drawn eight neighbouring pixels at a time; a steep
/// line, four pixels wide in a row, two rows at a time.
/// Every group drawn into is marked in the overlay. Keeps its band lists between frames.
/// </summary>
public sealed class LineDrawer
{
    /// <summary>Rows per band: the frame renderer's band, so that each band it composites reads one list.</summary>
    private const int BandRows = StarSplatter.BandHeight;
    /// <summary>Rows beyond a segment's ends that its tent can reach.</summary>
    private const int Reach = 2;

    /// <summary>Segments sorted per work item of <see cref="SortIntoBands"/>; each item sorts its own run of segments, so the order never depends on scheduling.</summary>
    private const int SegmentsPerChunk = 256;

    /// <summary>Per chunk of segments, its strokes and their lists per band; kept between frames.</summary>
    private readonly List<SortedChunk> _chunks = [];
    private int _chunkCount, _bandCount;
    private List<PixelSegment> _segments = [];
    private SkyRasterizer? _surfaces;
    private readonly Action<int> _sortChunk;

    public LineDrawer() => _sortChunk = SortChunk;

    /// <summary>
    /// Sorts <paramref name="segments"/> into row bands, to be drawn behind or in front of the surfaces in
    /// <paramref name="surfaces"/>; they are drawn from there until the next call. Only the size of the surface layer
    /// is read here, so the surfaces may still be being drawn: what they hold is read when the lines are drawn.
    /// Runs of segments are prepared and sorted side by side, each into lists of its own that the drawing reads in
    /// run order, so every band still draws its segments in their given order.
    /// </summary>
    public void SortIntoBands(List<PixelSegment> segments, SkyRasterizer surfaces, ParallelOptions parallel)
    {
        _surfaces = surfaces;
        _segments = segments;
        _bandCount = (surfaces.Height + BandRows - 1) / BandRows;
        _chunkCount = (segments.Count + SegmentsPerChunk - 1) / SegmentsPerChunk;
        while (_chunks.Count < _chunkCount) _chunks.Add(new SortedChunk());
        ParallelItems.For(0, _chunkCount, parallel, _sortChunk);
    }

    /// <summary>Prepares chunk <paramref name="chunk"/>'s segments as strokes and lists each under every band its pixels can reach, in order (a counting sort).</summary>
    private void SortChunk(int chunk)
    {
        SkyRasterizer surfaces = _surfaces!;
        int height = surfaces.Height;
        SortedChunk sorted = _chunks[chunk];
        sorted.Strokes.Clear();
        sorted.Bands.Clear(_bandCount);
        ReadOnlySpan<PixelSegment> segments = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_segments);
        int end = Math.Min(segments.Length, (chunk + 1) * SegmentsPerChunk);
        for (int i = chunk * SegmentsPerChunk; i < end; i++)
        {
            ref readonly PixelSegment segment = ref segments[i];
            float low = MathF.Min(segment.Y0, segment.Y1) - Reach, high = MathF.Max(segment.Y0, segment.Y1) + Reach;
            if (!(high >= 0 && low < height) || !Stroke.TryPrepare(segment, surfaces.Width, height, out Stroke stroke)) continue;
            sorted.Strokes.Add(stroke);
            sorted.Bands.Add(Math.Max(0, (int)low / BandRows), Math.Min(_bandCount - 1, (int)high / BandRows));
        }
        sorted.Bands.Sort();
    }

    /// <summary>One chunk's strokes in order, listed under each row band they reach.</summary>
    private sealed class SortedChunk
    {
        public readonly List<Stroke> Strokes = [];
        public readonly BandLists Bands = new();
    }

    /// <summary>Draws the sorted segments into the overlay rows of <paramref name="rows"/>.</summary>
    public unsafe void Draw(HdrBand rows)
    {
        SkyRasterizer surfaces = _surfaces ?? throw new InvalidOperationException("no segments sorted yet");
        DisplayOverlay overlay = rows.Overlay;
        if (overlay.Width != surfaces.Width || rows.EndRow > surfaces.Height || rows.EndRow - rows.OverlayOrigin > overlay.Height || rows.FirstRow < rows.OverlayOrigin)
            throw new ArgumentException("rows and surface layer differ in size", nameof(rows));
        fixed (uint* codes = overlay.Pixels)
        fixed (float* depth = surfaces.Depths)
        fixed (byte* marks = overlay.Marks)
        for (int band = rows.FirstRow / BandRows; band * BandRows < rows.EndRow; band++)
        {
            int top = Math.Max(rows.FirstRow, band * BandRows), bottom = Math.Min(rows.EndRow, (band + 1) * BandRows);
            // Most bands hold no surface at all: their segments need not be tested one by one.
            bool bandMeetsSurface = surfaces.MayHaveSurfaceIn(0, top, surfaces.Width - 1, bottom - 1, Reach);
            for (int chunk = 0; chunk < _chunkCount; chunk++)
            {
                SortedChunk sorted = _chunks[chunk];
                ReadOnlySpan<Stroke> strokes = System.Runtime.InteropServices.CollectionsMarshal.AsSpan(sorted.Strokes);
                foreach (int k in sorted.Bands.In(band))
                {
                    ref readonly Stroke stroke = ref strokes[k];
                    // Most segments pass no surface and cross only pixels that show sky: those skip the per-pixel depth and
                    // sky tests, which keeps a pixel's memory traffic to its three colour planes.
                    var line = new Line(stroke, new Pixels(codes, marks, depth, surfaces.Sky, overlay, rows.OverlayOrigin),
                        bandMeetsSurface && stroke.MayMeetSurface(surfaces, top, bottom), surfaces.Sky.HasBlankPixels);
                    if (line.TestsPixels) line.Draw<EveryPixelTested>(top, bottom);
                    else line.Draw<NoPixelTested>(top, bottom);
                }
            }
        }
    }

    /// <summary>
    /// A segment ready to draw, parametrised along its major axis (x when it runs more across than down, else y): at
    /// major coordinate u (a pixel centre) the line is at t = (u − start) / (end − start), its minor coordinate,
    /// colour and depth interpolated there. <see cref="First"/>…<see cref="Last"/> are the columns (or rows) whose
    /// centres lie in the half-open span [start, end); <see cref="Perpendicular"/> turns a minor-axis offset into a
    /// perpendicular distance.
    /// </summary>
    private readonly record struct Stroke(PixelSegment Segment, bool AlongX, int First, int Last, float Start, float InverseSpan,
        float MinorStart, float MinorChange, float Perpendicular, Vector3 Code0, Vector3 Code1)
    {
        public static bool TryPrepare(in PixelSegment s, int width, int height, out Stroke stroke)
        {
            stroke = default;
            float dx = s.X1 - s.X0, dy = s.Y1 - s.Y0;
            float length = MathF.Sqrt(dx * dx + dy * dy);
            if (!(length > 0)) return false;
            bool alongX = MathF.Abs(dx) >= MathF.Abs(dy);
            float start = alongX ? s.X0 : s.Y0, end = alongX ? s.X1 : s.Y1;
            float low = MathF.Min(start, end), high = MathF.Max(start, end);
            int majorLimit = alongX ? width : height;
            int first = (int)Math.Max(0, MathF.Ceiling(low - 0.5f)), last = (int)Math.Min(majorLimit - 1, MathF.Ceiling(high - 0.5f) - 1);
            if (first > last) return false;
            stroke = new Stroke(s, alongX, first, last, start, 1 / (end - start), alongX ? s.Y0 : s.X0, alongX ? dy : dx,
                (alongX ? MathF.Abs(dx) : MathF.Abs(dy)) / length, DisplayCodes(s.Colour0), DisplayCodes(s.Colour1));
            return true;
        }

        /// <summary>The tone map's display codes for an exposed colour, as it would write them.</summary>
        private static Vector3 DisplayCodes(Vector3 exposed) => new(ToneMapper.Code(exposed.X), ToneMapper.Code(exposed.Y), ToneMapper.Code(exposed.Z));

        /// <summary>False when no surface was drawn within reach of the part of the segment that rows [<paramref name="top"/>, <paramref name="bottom"/>) show.</summary>
        public bool MayMeetSurface(SkyRasterizer surfaces, int top, int bottom)
        {
            PixelSegment s = Segment;
            float dy = s.Y1 - s.Y0, x0 = s.X0, x1 = s.X1;
            if (dy != 0)
            {
                float t0 = Math.Clamp((top - Reach - s.Y0) / dy, 0, 1), t1 = Math.Clamp((bottom + Reach - s.Y0) / dy, 0, 1);
                x0 = s.X0 + t0 * (s.X1 - s.X0);
                x1 = s.X0 + t1 * (s.X1 - s.X0);
            }
            // The rows the segment itself reaches within the band: its pixels lie there.
            float y0 = MathF.Max(top, MathF.Min(s.Y0, s.Y1) - Reach), y1 = MathF.Min(bottom - 1, MathF.Max(s.Y0, s.Y1) + Reach);
            return surfaces.MayHaveSurfaceIn(x0, y0, x1, y1, Reach);
        }
    }

    /// <summary>The band's pixels as the drawing loops address them: overlay codes and marks from the overlay's first row (frame row <paramref name="origin"/>), surface depths of the whole frame (pinned by the caller), and which pixels show the sky.</summary>
    private readonly unsafe struct Pixels(uint* codes, byte* marks, float* depth, ImageSky sky, DisplayOverlay overlay, int origin)
    {
        public readonly uint* Codes = codes;
        public readonly float* Depth = depth;
        public readonly ImageSky Sky = sky;
        public readonly byte* Marks = marks;
        public readonly int Width = overlay.Width, GroupsPerRow = overlay.GroupsPerRow, Origin = origin;
    }

    /// <summary>Where a vector's lanes lie: lanes 0–7 from column <see cref="X"/> of row <see cref="Y"/>, or lanes 4–7 from column <see cref="NextX"/> of row <see cref="NextY"/> when the shape has two rows.</summary>
    private readonly record struct LanePlace(int Y, int X, int NextY, int NextX);

    /// <summary>A steep line's pixels in one row: the parameter and minor coordinate at the row's centre, and the (at most four) columns [From, To] its tent can reach (To &lt; From when none).</summary>
    private readonly record struct RowWindow(float T, float Minor, int From, int To);

    /// <summary>One stroke being drawn into one band: pixels are laid a row at a time, eight neighbours (or a steep line's four in each of two rows) at once, with a coverage of 1 − (perpendicular distance) where positive.</summary>
    private readonly unsafe ref struct Line(in Stroke stroke, Pixels pixels, bool testDepth, bool testSky)
    {
        private readonly bool _alongX = stroke.AlongX;
        private readonly int _first = stroke.First, _last = stroke.Last;
        private readonly float _start = stroke.Start, _inverseSpan = stroke.InverseSpan, _minorStart = stroke.MinorStart, _minorChange = stroke.MinorChange;
        private readonly float _perpendicular = stroke.Perpendicular;
        private readonly float _lowY = float.MinNative(stroke.Segment.Y0, stroke.Segment.Y1), _highY = float.MaxNative(stroke.Segment.Y0, stroke.Segment.Y1);
        private readonly Vector3 _colour0 = stroke.Code0, _colourChange = stroke.Code1 - stroke.Code0;
        private readonly float _depth0 = stroke.Segment.Depth0, _depthChange = stroke.Segment.Depth1 - stroke.Segment.Depth0;
        private readonly int _width = pixels.Width;

        /// <summary>Whether each pixel must be tested for a surface in front of the line or for showing no sky.</summary>
        public bool TestsPixels => testDepth || testSky;

        /// <summary>The stroke's pixels in rows [<paramref name="top"/>, <paramref name="bottom"/>).</summary>
        public void Draw<TTests>(int top, int bottom) where TTests : struct, ITypeFlag
        {
            if (_alongX) DrawRowsOfColumns<TTests>(top, bottom);
            else DrawRows<TTests>(Math.Max(_first, top), Math.Min(_last, bottom - 1));
        }

        /// <summary>A line along x: rows [<paramref name="top"/>, <paramref name="bottom"/>), each over the columns where the line passes within reach of it.</summary>
        private void DrawRowsOfColumns<TTests>(int top, int bottom) where TTests : struct, ITypeFlag
        {
            int firstRow = ToInt(float.MaxNative(MathF.Floor(_lowY) - Reach, top)), lastRow = ToInt(float.MinNative(MathF.Ceiling(_highY) + Reach, bottom - 1));
            // Major change per unit of minor; the tent reaches 1 / perpendicular (at most √2) pixels across.
            float slope = _minorChange * _inverseSpan, inverseSlope = 1 / slope, reach = 1 / _perpendicular;
            // Added to a row's centre, the minor offsets (from the line's start) where the tent's reach ends on the side
            // of lower and of higher major coordinates: which side is which depends only on the sign of the slope.
            float lowSide = (slope > 0 ? -reach : reach) - _minorStart, highSide = (slope > 0 ? reach : -reach) - _minorStart;
            for (int y = firstRow; y <= lastRow; y++)
            {
                float centre = y + 0.5f;
                int from = _first, to = _last;
                if (slope != 0)
                {
                    // Major coordinates where the line is the tent's reach from this row's centre, widened by a pixel for
                    // rounding and kept within a pixel of the segment's own columns: a nearly level line's reach from a
                    // neighbouring row can lie billions of pixels away, past what converts to an int. The native max and
                    // min are plain instructions (this runs for every row a line crosses); NaN, which finite segments
                    // never give, would fall to the segment's own ends.
                    from = ToInt(float.MinNative(float.MaxNative(MathF.Floor(_start + (centre + lowSide) * inverseSlope) - 1, _first), _last + 1));
                    to = ToInt(float.MaxNative(float.MinNative(MathF.Ceiling(_start + (centre + highSide) * inverseSlope) + 1, _last), _first - 1));
                }
                else if (!(MathF.Abs(centre - _minorStart) < reach)) continue;
                for (int x = from; x <= to; x += VectorLanes.Count)
                {
                    Vector256<float> t = (Vector256.Create((float)x) + VectorLanes.Centres - Vector256.Create(_start)) * Vector256.Create(_inverseSpan);
                    Vector256<float> minor = Vector256.Create(_minorStart) + t * Vector256.Create(_minorChange);
                    Lay<TTests, RowOfEight>(new LanePlace(y, x, y, x), Vector256.Create(to), Vector256.Create(centre) - minor, t);
                }
            }
        }

        /// <summary>
        /// A line along y: rows [<paramref name="first"/>, <paramref name="last"/>], each over the pixels either side of
        /// where the line crosses it, two rows at a time (one vector holds both rows' four pixels) except at the right
        /// edge of the image, where a row's window is laid on its own.
        /// </summary>
        private void DrawRows<TTests>(int first, int last) where TTests : struct, ITypeFlag
        {
            int y = first;
            for (; y < last; y += 2)
            {
                RowWindow upper = Window(y), lower = Window(y + 1);
                if (upper.From + TwoRowLanes > _width || lower.From + TwoRowLanes > _width)
                {
                    LayRow<TTests>(y, upper);
                    LayRow<TTests>(y + 1, lower);
                    continue;
                }
                Vector256<float> from = Vector256.Create(Vector128.Create((float)upper.From), Vector128.Create((float)lower.From));
                Vector256<float> minor = Vector256.Create(Vector128.Create(upper.Minor), Vector128.Create(lower.Minor));
                Lay<TTests, TwoRowsOfFour>(new LanePlace(y, upper.From, y + 1, lower.From), Vector256.Create(Vector128.Create(upper.To), Vector128.Create(lower.To)),
                    from + TwoRowCentres - minor, Vector256.Create(Vector128.Create(upper.T), Vector128.Create(lower.T)));
            }
            if (y == last) LayRow<TTests>(y, Window(y));
        }

        /// <summary>Lanes per row when a vector holds two rows.</summary>
        private const int TwoRowLanes = VectorLanes.Count / 2;

        /// <summary>0.5 … 3.5 for each of two rows: added to each row's first column, the centre of each lane's pixel.</summary>
        private static readonly Vector256<float> TwoRowCentres = Vector256.Create(0.5f, 1.5f, 2.5f, 3.5f, 0.5f, 1.5f, 2.5f, 3.5f);

        /// <summary>The pixel whose centre lies just below the line in row <paramref name="y"/>, and its neighbours: the tent reaches no farther.</summary>
        private RowWindow Window(int y)
        {
            float t = (y + 0.5f - _start) * _inverseSpan;
            float minor = _minorStart + t * _minorChange;
            float nearest = MathF.Floor(minor - 0.5f);
            if (!(nearest + 2 >= 0 && nearest - 1 < _width)) return new RowWindow(t, minor, 0, -1);
            int pixel = ToInt(nearest);
            return new RowWindow(t, minor, Math.Max(0, pixel - 1), Math.Min(_width - 1, pixel + 2));
        }

        /// <summary>A steep line's window in row <paramref name="y"/> on its own.</summary>
        private void LayRow<TTests>(int y, RowWindow window) where TTests : struct, ITypeFlag
        {
            if (window.To < window.From) return;
            Lay<TTests, RowOfEight>(new LanePlace(y, window.From, y, window.From), Vector256.Create(window.To),
                Vector256.Create((float)window.From) + VectorLanes.Centres - Vector256.Create(window.Minor), Vector256.Create(window.T));
        }

        /// <summary>
        /// The pixels of the lanes at <paramref name="place"/> whose columns are at most <paramref name="lastColumns"/>,
        /// each <paramref name="offset"/> pixels across from the line at parameter <paramref name="t"/>.
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private void Lay<TTests, TTwoRows>(LanePlace place, Vector256<int> lastColumns, Vector256<float> offset, Vector256<float> t)
            where TTests : struct, ITypeFlag where TTwoRows : struct, ITypeFlag
        {
            Vector256<float> weight = Vector256<float>.One - Vector256.Abs(offset) * Vector256.Create(_perpendicular);
            Vector256<int> columns = TTwoRows.IsSet
                ? Vector256.Create(Vector128.Create(place.X), Vector128.Create(place.NextX)) + TwoRowIndices
                : Vector256.Create(place.X) + VectorLanes.Indices;
            Vector256<float> covered = Vector256.GreaterThan(weight, Vector256<float>.Zero) & Vector256.LessThanOrEqual(columns, lastColumns).AsSingle();
            // Index of each row's first lane in the frame (depth, sky) and in the band's buffer (colour).
            int pixel = place.Y * _width + place.X, i = pixel - pixels.Origin * _width;
            int nextPixel = place.NextY * _width + place.NextX, nextI = nextPixel - pixels.Origin * _width;
            if (TTests.IsSet) covered &= Visible<TTwoRows>(place, columns, pixel, nextPixel, Vector256.Create(_depth0) + t * Vector256.Create(_depthChange));
            uint lanes = covered.ExtractMostSignificantBits();
            if (lanes == 0) return;
            Vector256<float> red = Vector256.Create(_colour0.X) + t * Vector256.Create(_colourChange.X);
            Vector256<float> green = Vector256.Create(_colour0.Y) + t * Vector256.Create(_colourChange.Y);
            Vector256<float> blue = Vector256.Create(_colour0.Z) + t * Vector256.Create(_colourChange.Z);
            if (TTwoRows.IsSet)
            {
                uint* upper = pixels.Codes + i, lower = pixels.Codes + nextI;
                Vector256<int> laid = Over(Vector256.Create(Vector128.Load((int*)upper), Vector128.Load((int*)lower)), weight, red, green, blue, covered);
                laid.GetLower().Store((int*)upper);
                laid.GetUpper().Store((int*)lower);
                Mark(place.Y, place.X, lanes & ((1u << TwoRowLanes) - 1));
                Mark(place.NextY, place.NextX, lanes >> TwoRowLanes);
                return;
            }
            if (place.X + VectorLanes.Count <= _width) Over(Vector256.Load((int*)(pixels.Codes + i)), weight, red, green, blue, covered).Store((int*)(pixels.Codes + i));
            else
                // The last few pixels of a row: one at a time, so nothing past the row's end is read or written.
                for (int lane = 0; lane < _width - place.X; lane++)
                {
                    if ((lanes >> lane & 1) == 0) continue;
                    pixels.Codes[i + lane] = (uint)Over(Vector256.Create((int)pixels.Codes[i + lane]), Vector256.Create(weight.GetElement(lane)),
                        Vector256.Create(red.GetElement(lane)), Vector256.Create(green.GetElement(lane)), Vector256.Create(blue.GetElement(lane)), Vector256<float>.AllBitsSet).ToScalar();
                }
            Mark(place.Y, place.X, lanes);
        }

        /// <summary>0 … 3 for each of two rows: added to each row's first column, the column of each lane.</summary>
        private static readonly Vector256<int> TwoRowIndices = Vector256.Create(0, 1, 2, 3, 0, 1, 2, 3);

        /// <summary>Marks the groups of the first and last of <paramref name="lanes"/> (bit k: column <paramref name="x"/> + k of row <paramref name="y"/>); none when empty.</summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private void Mark(int y, int x, uint lanes)
        {
            if (lanes == 0) return;
            byte* rowMarks = pixels.Marks + (y - pixels.Origin) * pixels.GroupsPerRow;
            rowMarks[(uint)(x + BitOperations.TrailingZeroCount(lanes)) / HdrFrame.GroupWidth] = 1;
            rowMarks[(uint)(x + 31 - BitOperations.LeadingZeroCount(lanes)) / HdrFrame.GroupWidth] = 1;
        }

        /// <summary>
        /// Lanes at <paramref name="place"/> (columns <paramref name="columns"/>; frame pixels <paramref name="pixel"/>
        /// and, for two rows, <paramref name="nextPixel"/>) not behind a surface (line depth <paramref name="lineDepth"/>)
        /// and showing sky.
        /// </summary>
        private Vector256<float> Visible<TTwoRows>(LanePlace place, Vector256<int> columns, int pixel, int nextPixel, Vector256<float> lineDepth)
            where TTwoRows : struct, ITypeFlag
        {
            Vector256<float> visible = Vector256<float>.AllBitsSet;
            if (testDepth)
            {
                Vector256<float> surfaceDepth = TTwoRows.IsSet
                    ? Vector256.Create(Vector128.Load(pixels.Depth + pixel), Vector128.Load(pixels.Depth + nextPixel))
                    : Lanes(pixels.Depth + pixel, Math.Min(VectorLanes.Count, _width - place.X));
                visible = Vector256.LessThanOrEqual(lineDepth, surfaceDepth);
            }
            if (testSky)
            {
                (int first, int last) = pixels.Sky.SkyColumns(place.Y);
                Vector256<int> firstSky = Vector256.Create(first), lastSky = Vector256.Create(last);
                if (TTwoRows.IsSet)
                {
                    (int nextFirst, int nextLast) = pixels.Sky.SkyColumns(place.NextY);
                    firstSky = Vector256.Create(Vector128.Create(first), Vector128.Create(nextFirst));
                    lastSky = Vector256.Create(Vector128.Create(last), Vector128.Create(nextLast));
                }
                visible &= (Vector256.GreaterThanOrEqual(columns, firstSky) & Vector256.LessThanOrEqual(columns, lastSky)).AsSingle();
            }
            return visible;
        }

        /// <summary>Eight values from <paramref name="from"/>, of which the first <paramref name="count"/> exist (the rest read as +∞).</summary>
        private static Vector256<float> Lanes(float* from, int count)
        {
            if (count == VectorLanes.Count) return Vector256.Load(from);
            Span<float> lanes = stackalloc float[VectorLanes.Count];
            lanes.Fill(float.PositiveInfinity);
            new ReadOnlySpan<float>(from, count).CopyTo(lanes);
            return Vector256.Create<float>(lanes);
        }

        /// <summary>
        /// Premultiplied codes <paramref name="old"/> with the colour laid over them at coverage
        /// <paramref name="weight"/> in the covered lanes: each code c ← c + w·(colour − c), the coverage
        /// a ← a + w·(255 − a), rounded (so a code never passes its coverage).
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private static Vector256<int> Over(Vector256<int> old, Vector256<float> weight, Vector256<float> red, Vector256<float> green, Vector256<float> blue,
            Vector256<float> covered)
        {
            Vector256<int> channel = Vector256.Create(0xFF);
            Vector256<float> oldRed = Vector256.ConvertToSingle(old & channel), oldGreen = Vector256.ConvertToSingle(Vector256.ShiftRightLogical(old, 8) & channel);
            Vector256<float> oldBlue = Vector256.ConvertToSingle(Vector256.ShiftRightLogical(old, 16) & channel), oldCoverage = Vector256.ConvertToSingle(Vector256.ShiftRightLogical(old, 24));
            Vector256<int> laid = VectorRounding.Round(Vector256.FusedMultiplyAdd(weight, red - oldRed, oldRed))
                | Vector256.ShiftLeft(VectorRounding.Round(Vector256.FusedMultiplyAdd(weight, green - oldGreen, oldGreen)), 8)
                | Vector256.ShiftLeft(VectorRounding.Round(Vector256.FusedMultiplyAdd(weight, blue - oldBlue, oldBlue)), 16)
                | Vector256.ShiftLeft(VectorRounding.Round(Vector256.FusedMultiplyAdd(weight, Vector256.Create(255f) - oldCoverage, oldCoverage)), 24);
            return Vector256.ConditionalSelect(covered.AsInt32(), laid, old);
        }


        /// <summary>A float already clamped to a pixel range, as an int, without the checks of a C# cast.</summary>
        private static int ToInt(float value) => float.ConvertToIntegerNative<int>(value);
    }
}
