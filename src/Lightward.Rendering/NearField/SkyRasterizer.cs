using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Draws <see cref="SkyTriangle"/>s into an opaque-surface layer with its own depth buffer, for any projection.
/// A pixel belongs to a triangle when the direction through its centre lies inside the spherical triangle (three
/// great-circle side tests on the pixel's direction, worked out per band), so the equirectangular wrap, a dome's rim and
/// the region behind a perspective camera need no special cases: only the pixel box to search is found per
/// projection, by subdividing triangles whose box is not trustworthy. Outline sides get a half-pixel ramp on either
/// side (anti-aliasing); the nearest emission event wins each pixel. Triangles come in parts, prepared side by side,
/// each sorted into row bands; the bands are then filled in parallel, each by one thread over the triangles in part
/// order, eight neighbouring pixels at a time, so the result never depends on scheduling. Each band counts its
/// surfaces' brightness for the exposure meter as it finishes. The layer remembers which
/// <see cref="TileSize"/>-pixel tiles it drew into, and composites and clears only those.
/// </summary>
public sealed class SkyRasterizer
{
    /// <summary>Rows per band of the fill: a tile high, so that bodies a few bands tall still spread over the threads.</summary>
    private const int BandRows = TileSize;
    /// <summary>Side of the square tiles in which drawn regions are tracked, pixels.</summary>
    public const int TileSize = 16;
    private const int MaxSubdivisionDepth = 10;
    /// <summary>Triangles below this angular size are dropped when their corners cannot be placed (behind a flat screen) or all lie beyond one image edge, rad.</summary>
    private const double OffImageDropAngle = 1.0;
    /// <summary>
    /// Great-circle sides bow out of the straight line between their corners' images by at most this fraction of
    /// their length for sides a quarter radian long, and proportionally less for shorter ones (the bow of a smooth
    /// curve grows with the square of its length).
    /// </summary>
    private const double BowAtQuarterRadian = 0.05;
    /// <summary>How far past an outline side its coverage ramp can reach, pixels: half a pixel, plus room for the pixel scale varying across the triangle.</summary>
    private const double OutlineRampReach = 0.6;
    /// <summary>A triangle whose corners' images lie within a box this many pixels wide (and a quarter of the image) cannot straddle a seam.</summary>
    private const double SmallBox = 16;

    private readonly ImageSky _sky;
    /// <summary>The layer, row-major: premultiplied surface colour, coverage, and the emission distance of the nearest surface (+∞ where none).</summary>
    private readonly SurfacePlanes _pixels;
    private readonly int _tileColumns, _tileRows;
    private readonly double _smallBox;
    private bool[] _dirtyTiles;
    /// <summary>The tiles drawn before the last <see cref="Clear"/>, still to be emptied, and the range that holds them.</summary>
    private bool[] _staleTiles;
    private (int FirstColumn, int LastColumn, int FirstRow, int LastRow) _staleRange = NoTiles;
    /// <summary>Per tile row, how many drawn tiles lie left of each tile column (a row has one entry more than columns), kept from <see cref="FillParts"/> to <see cref="Clear"/>.</summary>
    private readonly int[] _drawnTilesBefore;
    /// <summary>The tile columns and rows that hold every drawn tile (empty when first &gt; last).</summary>
    private (int FirstColumn, int LastColumn, int FirstRow, int LastRow) _drawnTiles = NoTiles;
    private static readonly (int FirstColumn, int LastColumn, int FirstRow, int LastRow) NoTiles = (0, -1, 0, -1);
    /// <summary>Per part of the triangles, those prepared (see <see cref="BeginParts"/>).</summary>
    private readonly List<PreparedPart> _parts = [];
    private int _partCount;
    private readonly int _bandCount;
    /// <summary>Per row band, the brightness of its surfaces, counted as the band is filled (see <see cref="AddSurfaceLevels"/>).</summary>
    private readonly LevelHistogram[] _bandLevels;
    private bool _filled;
    private readonly Func<int, BandDirections, BandDirections> _fillBand;
    /// <summary>Band-sized direction buffers, one per thread of the fill.</summary>
    private readonly ScratchPool<BandDirections> _bandDirections;

    public SkyRasterizer(ImageSky sky)
    {
        _sky = sky;
        _pixels = new SurfacePlanes(Width * Height);
        _tileColumns = (Width + TileSize - 1) / TileSize;
        _tileRows = (Height + TileSize - 1) / TileSize;
        _dirtyTiles = new bool[_tileColumns * _tileRows];
        _staleTiles = new bool[_tileColumns * _tileRows];
        _drawnTilesBefore = new int[(_tileColumns + 1) * _tileRows];
        _smallBox = Math.Min(SmallBox, Math.Min(Width, Height) / 4.0);
        _bandCount = (Height + BandRows - 1) / BandRows;
        _bandLevels = Enumerable.Range(0, _bandCount).Select(_ => new LevelHistogram()).ToArray();
        _bandDirections = new ScratchPool<BandDirections>(() => new BandDirections(Width));
        _fillBand = FillBand;
    }

    public Projection Projection => _sky.Projection;
    public int Width => Projection.Width;
    public int Height => Projection.Height;

    /// <summary>Per pixel (row-major), the emission distance of the nearest surface, +∞ where none was drawn; kept until <see cref="Clear"/>.</summary>
    internal float[] Depths => _pixels.Depth;

    /// <summary>
    /// False when no surface was drawn within <paramref name="reach"/> pixels of the box spanned by (x0, y0) and
    /// (x1, y1), so that every depth there is +∞.
    /// </summary>
    internal bool MayHaveSurfaceIn(float x0, float y0, float x1, float y1, int reach)
    {
        int firstTile = Math.Max(_drawnTiles.FirstColumn, TileOf(MathF.Min(x0, x1) - reach, Width));
        int lastTile = Math.Min(_drawnTiles.LastColumn, TileOf(MathF.Max(x0, x1) + reach, Width));
        int firstRow = Math.Max(_drawnTiles.FirstRow, TileOf(MathF.Min(y0, y1) - reach, Height));
        int lastRow = Math.Min(_drawnTiles.LastRow, TileOf(MathF.Max(y0, y1) + reach, Height));
        if (firstTile > lastTile) return false;
        for (int tileRow = firstRow; tileRow <= lastRow; tileRow++)
        {
            int rowStart = tileRow * (_tileColumns + 1);
            if (_drawnTilesBefore[rowStart + lastTile + 1] > _drawnTilesBefore[rowStart + firstTile]) return true;
        }
        return false;
    }

    private static int TileOf(float position, int limit) => (int)Math.Clamp(position, 0, limit - 1) / TileSize;

    /// <summary>Which pixels show the sky.</summary>
    public ImageSky Sky => _sky;

    /// <summary>The cone of directions the image shows.</summary>
    public ViewCap View => _sky.View;

    /// <summary>
    /// Starts drawing <paramref name="partCount"/> parts of triangles into the (cleared) layer: each part is prepared
    /// by <see cref="PreparePart"/>, side by side in any order, and <see cref="FillParts"/> then draws them all, in
    /// part order.
    /// </summary>
    public void BeginParts(int partCount)
    {
        _partCount = partCount;
        while (_parts.Count < partCount) _parts.Add(new PreparedPart());
    }

    /// <summary>Prepares part <paramref name="part"/>: <paramref name="triangles"/> (front-facing; winding is taken from the directions), in order.</summary>
    public void PreparePart(int part, ReadOnlySpan<SkyTriangle> triangles)
    {
        PreparedPart output = _parts[part];
        output.Triangles.Clear();
        foreach (ref readonly SkyTriangle triangle in triangles) Prepare(triangle, 0, output.Triangles);
        output.Bands.Clear(_bandCount);
        foreach (ref readonly PreparedTriangle prepared in CollectionsMarshal.AsSpan(output.Triangles)) output.Bands.Add(prepared.MinY / BandRows, prepared.MaxY / BandRows);
        output.Bands.Sort();
    }

    /// <summary>Rasterises the prepared parts into the layer, in part order, emptying each band of what was drawn before <see cref="Clear"/> first.</summary>
    public void FillParts(ParallelOptions parallel)
    {
        _filled = false;
        _drawnTiles = DrawnTiles();
        if (_drawnTiles.FirstRow > _drawnTiles.LastRow && _staleRange.FirstRow > _staleRange.LastRow) return;
        ParallelItems.For(0, _bandCount, parallel, _bandDirections.Rent, _fillBand, _bandDirections.Return);
        _staleRange = NoTiles;
        _filled = true;
    }

    /// <summary>
    /// Lays the layer over the rows of <paramref name="band"/>: surfaces hide what lies behind them in proportion to
    /// their coverage, and the pixels they cover are marked touched. The depth buffer stays until the next fill, so
    /// lines drawn afterwards can pass behind or in front of the surfaces.
    /// </summary>
    public void CompositeOver(HdrBand band)
    {
        if (band.Buffer.Width != Width || band.EndRow > Height) throw new ArgumentException("band and surface layer differ in size", nameof(band));
        var over = new CompositeRun(_pixels, band);
        ForEachDirtyRun(band.FirstRow, band.EndRow, ref over);
    }

    /// <summary>
    /// Adds the brightness of every covered pixel to <paramref name="levels"/>: its brightest channel at full
    /// coverage (the surface's own brightness, whatever share of the pixel it covers), in HDR units.
    /// </summary>
    public void AddSurfaceLevels(LevelHistogram levels)
    {
        if (!_filled) return;
        foreach (LevelHistogram band in _bandLevels) levels.Add(band);
    }

    /// <summary>
    /// Empties the layer for the next frame. Only the tiles drawn since the last clear need emptying, and the next
    /// <see cref="FillParts"/> empties them band by band, each just before it fills the band, so that the band's
    /// planes are in cache when its triangles are drawn.
    /// </summary>
    public void Clear()
    {
        // Tiles still waiting from an earlier clear (no fill since) are emptied now.
        var clear = new ClearRun(_pixels);
        ForEachRun(_staleTiles, _staleRange, 0, Height, ref clear);
        (_staleTiles, _dirtyTiles) = (_dirtyTiles, _staleTiles);
        _staleRange = _drawnTiles;
        Array.Clear(_dirtyTiles);
        _drawnTiles = NoTiles;
        _filled = false;
    }

    /// <summary>The smallest range of tile columns and rows holding every drawn tile; counts the drawn tiles before each column as it goes.</summary>
    private (int FirstColumn, int LastColumn, int FirstRow, int LastRow) DrawnTiles()
    {
        (int firstColumn, int lastColumn, int firstRow, int lastRow) = (_tileColumns, -1, _tileRows, -1);
        for (int tileRow = 0; tileRow < _tileRows; tileRow++)
        {
            ReadOnlySpan<bool> row = _dirtyTiles.AsSpan(tileRow * _tileColumns, _tileColumns);
            int first = row.IndexOf(true);
            Span<int> before = _drawnTilesBefore.AsSpan(tileRow * (_tileColumns + 1), _tileColumns + 1);
            if (first < 0)
            {
                before.Clear();
                continue;
            }
            for (int tile = 0; tile < _tileColumns; tile++) before[tile + 1] = before[tile] + (row[tile] ? 1 : 0);
            (firstColumn, lastColumn) = (Math.Min(firstColumn, first), Math.Max(lastColumn, row.LastIndexOf(true)));
            (firstRow, lastRow) = (Math.Min(firstRow, tileRow), tileRow);
        }
        return (firstColumn, lastColumn, firstRow, lastRow);
    }

    /// <summary>Work on one run of pixels, [<c>start</c>, <c>end</c>) in row-major index (frame pixels), all in one row of drawn tiles.</summary>
    private interface IRunAction
    {
        void Run(int row, int start, int end);
    }

    /// <summary>Calls <paramref name="action"/> for each run of drawn tiles in each of rows [<paramref name="firstRow"/>, <paramref name="endRow"/>), top to bottom.</summary>
    private void ForEachDirtyRun<TAction>(int firstRow, int endRow, ref TAction action) where TAction : struct, IRunAction =>
        ForEachRun(_dirtyTiles, _drawnTiles, firstRow, endRow, ref action);

    /// <summary>Calls <paramref name="action"/> for each run of the marked <paramref name="tiles"/> (all within <paramref name="range"/>) in each of rows [<paramref name="firstRow"/>, <paramref name="endRow"/>), top to bottom.</summary>
    private void ForEachRun<TAction>(bool[] tiles, (int FirstColumn, int LastColumn, int FirstRow, int LastRow) range, int firstRow, int endRow, ref TAction action)
        where TAction : struct, IRunAction
    {
        for (int tileRow = Math.Max(firstRow / TileSize, range.FirstRow); tileRow * TileSize < endRow && tileRow <= range.LastRow; tileRow++)
        {
            int rowStart = tileRow * _tileColumns;
            for (int tile = range.FirstColumn; tile <= range.LastColumn;)
            {
                if (!tiles[rowStart + tile]) { tile++; continue; }
                int runEnd = tile + 1;
                while (runEnd <= range.LastColumn && tiles[rowStart + runEnd]) runEnd++;
                int start = tile * TileSize, end = Math.Min(Width, runEnd * TileSize);
                for (int y = Math.Max(firstRow, tileRow * TileSize); y < Math.Min(endRow, (tileRow + 1) * TileSize); y++)
                    action.Run(y, y * Width + start, y * Width + end);
                tile = runEnd;
            }
        }
    }

    /// <summary>Surfaces over one run of a band's row, eight pixels at a time; groups of eight with no coverage are skipped.</summary>
    private readonly struct CompositeRun(SurfacePlanes pixels, HdrBand band) : IRunAction
    {
        public void Run(int row, int start, int end)
        {
            float[] red = band.Buffer.Red, green = band.Buffer.Green, blue = band.Buffer.Blue;
            int rowStart = row * band.Buffer.Width, shift = band.RowStart(row) - rowStart;
            bool touched = false;
            int i = start;
            for (; i + VectorLanes.Count <= end; i += VectorLanes.Count)
            {
                Vector256<float> alpha = Lanes(pixels.Alpha, i);
                if (alpha == Vector256<float>.Zero) continue;
                // Where alpha is 0 the premultiplied colour is 0 too, so those lanes keep their value.
                Vector256<float> keep = Vector256<float>.One - alpha;
                int at = i + shift;
                (Lanes(red, at) * keep + Lanes(pixels.Red, i)).StoreUnsafe(ref Element(red, at));
                (Lanes(green, at) * keep + Lanes(pixels.Green, i)).StoreUnsafe(ref Element(green, at));
                (Lanes(blue, at) * keep + Lanes(pixels.Blue, i)).StoreUnsafe(ref Element(blue, at));
                touched = true;
            }
            for (; i < end; i++)
            {
                float alpha = pixels.Alpha[i];
                if (alpha == 0) continue;
                float keep = 1 - alpha;
                int at = i + shift;
                red[at] = red[at] * keep + pixels.Red[i];
                green[at] = green[at] * keep + pixels.Green[i];
                blue[at] = blue[at] * keep + pixels.Blue[i];
                touched = true;
            }
            if (touched) band.MarkTouched(row, start - rowStart, end - rowStart);
        }
    }

    /// <summary>Each covered pixel's level (brightest channel at full coverage), eight pixels at a time; groups of eight with no coverage are skipped.</summary>
    private readonly struct LevelsOfRun(SurfacePlanes pixels, LevelHistogram levels) : IRunAction
    {
        public void Run(int row, int start, int end)
        {
            int i = start;
            for (; i + VectorLanes.Count <= end; i += VectorLanes.Count)
            {
                Vector256<float> alpha = Lanes(pixels.Alpha, i);
                uint covered = Vector256.GreaterThan(alpha, Vector256<float>.Zero).ExtractMostSignificantBits();
                if (covered == 0) continue;
                // The processor's own max: the colours are finite, so the checks that order NaNs need not be paid for.
                Vector256<float> brightest = Vector256.MaxNative(Lanes(pixels.Red, i), Vector256.MaxNative(Lanes(pixels.Green, i), Lanes(pixels.Blue, i)));
                levels.Add(brightest / alpha, covered);
            }
            for (; i < end; i++)
            {
                float alpha = pixels.Alpha[i];
                if (alpha > 0) levels.Add(MathF.Max(pixels.Red[i], MathF.Max(pixels.Green[i], pixels.Blue[i])) / alpha);
            }
        }
    }

    /// <summary>Eight values of <paramref name="plane"/> from <paramref name="index"/>, which the caller keeps inside the array.</summary>
    private static Vector256<float> Lanes(float[] plane, int index) => Vector256.LoadUnsafe(ref Element(plane, index));

    private static ref float Element(float[] plane, int index) => ref Unsafe.Add(ref MemoryMarshal.GetArrayDataReference(plane), index);

    private readonly struct ClearRun(SurfacePlanes pixels) : IRunAction
    {
        public void Run(int row, int start, int end) => pixels.Clear(start, end - start);
    }

    /// <summary>Finds the pixel box to search for a triangle, subdividing it where the projection makes the box unreliable.</summary>
    private void Prepare(in SkyTriangle t, int depth, List<PreparedTriangle> output)
    {
        Vec3 a = ToVec3(t.DirectionA), b = ToVec3(t.DirectionB), c = ToVec3(t.DirectionC);
        // The angle subtended by the longest chord.
        double halfChord = Math.Min(1, Math.Sqrt(double.MaxNative((a - b).LengthSquared, double.MaxNative((b - c).LengthSquared, (c - a).LengthSquared))) / 2);
        Vec3 centre = (a + b + c).NormalizedOr(a);
        // Every point of the triangle lies within its diameter of the centroid direction.
        if (View.Misses(centre, halfChord)) return;
        double diameter = 2 * Math.Asin(halfChord);
        Projection projection = Projection;
        bool onA = ImagePlacement.TryPlace(projection, a, out double ax, out double ay);
        bool onB = ImagePlacement.TryPlace(projection, b, out double bx, out double by);
        bool onC = ImagePlacement.TryPlace(projection, c, out double cx, out double cy);
        if (!onA && !onB && !onC && diameter < OffImageDropAngle) return;
        if (onA && onB && onC && diameter < OffImageDropAngle && ImagePlacement.BeyondOneEdge(projection, ax, ay, bx, by, cx, cy)) return;

        if (onA && onB && onC && ImagePlacement.TryPlace(projection, centre, out double mx, out double my))
        {
            // Placed positions are finite, so the native min and max (plain instructions, not NaN-aware chains) serve.
            double minX = double.MinNative(double.MinNative(ax, bx), double.MinNative(cx, mx)), maxX = double.MaxNative(double.MaxNative(ax, bx), double.MaxNative(cx, mx));
            double minY = double.MinNative(double.MinNative(ay, by), double.MinNative(cy, my)), maxY = double.MaxNative(double.MaxNative(ay, by), double.MaxNative(cy, my));
            double extent = double.MaxNative(maxX - minX, maxY - minY);
            // A box much wider than the triangle's angular size allows means its corners sit on both sides of a seam.
            // A box a few pixels wide cannot: across any seam the positions jump by most of the image. Most triangles
            // are that small, and the inner ones (no outline ramp) then need no local pixel scale at all.
            bool small = extent <= _smallBox;
            double scale = small && t.OutlineSides == 0 ? 0 : PixelsPerRadian(a);
            if (small || extent <= 2 * diameter * scale + 4)
            {
                // Room for the sides' bow (its length in pixels is about the box's extent), for the outline ramp, and for rounding.
                double bow = BowAtQuarterRadian * extent * Math.Min(1, diameter / 0.25);
                double pad = bow + (t.OutlineSides != 0 ? OutlineRampReach : 0) + 0.01;
                var prepared = new PreparedTriangle(t, (float)scale);
                AddBox(ref prepared, minX - pad, minY - pad, maxX + pad, maxY + pad);
                if (prepared.BoxCount > 0) output.Add(prepared);
                return;
            }
        }
        double pixelsPerRadian = PixelsPerRadian(onA ? a : onB ? b : onC ? c : centre);
        if (depth < MaxSubdivisionDepth && diameter * pixelsPerRadian > 3)
        {
            Subdivide(t, depth, output);
            return;
        }
        // A few pixels across and still straddling a seam or the image edge: search around each corner that is on the image.
        double radius = diameter * pixelsPerRadian + 2;
        var straddling = new PreparedTriangle(t, (float)pixelsPerRadian);
        if (onA) AddBox(ref straddling, ax - radius, ay - radius, ax + radius, ay + radius);
        if (onB) AddBox(ref straddling, bx - radius, by - radius, bx + radius, by + radius);
        if (onC) AddBox(ref straddling, cx - radius, cy - radius, cx + radius, cy + radius);
        if (straddling.BoxCount > 0) output.Add(straddling);
    }

    private void Subdivide(in SkyTriangle t, int depth, List<PreparedTriangle> output)
    {
        // Midpoints on the great-circle sides; depth and colour halfway, as the fill interpolates them.
        Vector3 ab = Vector3.Normalize(t.DirectionA + t.DirectionB), bc = Vector3.Normalize(t.DirectionB + t.DirectionC), ca = Vector3.Normalize(t.DirectionC + t.DirectionA);
        float dab = (t.DepthA + t.DepthB) / 2, dbc = (t.DepthB + t.DepthC) / 2, dca = (t.DepthC + t.DepthA) / 2;
        Vector3 cab = (t.ColourA + t.ColourB) / 2, cbc = (t.ColourB + t.ColourC) / 2, cca = (t.ColourC + t.ColourA) / 2;
        SkyTriangle Make(Vector3 d0, float z0, Vector3 c0, Vector3 d1, float z1, Vector3 c1, Vector3 d2, float z2, Vector3 c2, byte outline) => new()
        {
            DirectionA = d0, DepthA = z0, ColourA = c0,
            DirectionB = d1, DepthB = z1, ColourB = c1,
            DirectionC = d2, DepthC = z2, ColourC = c2,
            OutlineSides = outline,
        };
        byte o = t.OutlineSides;
        // Each corner piece keeps the outline bits of the two original sides it lies on; the middle piece has none.
        Prepare(Make(t.DirectionA, t.DepthA, t.ColourA, ab, dab, cab, ca, dca, cca, (byte)((o & 1) | (o & 4))), depth + 1, output);
        Prepare(Make(ab, dab, cab, t.DirectionB, t.DepthB, t.ColourB, bc, dbc, cbc, (byte)((o & 1) | (o & 2))), depth + 1, output);
        Prepare(Make(ca, dca, cca, bc, dbc, cbc, t.DirectionC, t.DepthC, t.ColourC, (byte)((o & 2) | (o & 4))), depth + 1, output);
        Prepare(Make(ab, dab, cab, bc, dbc, cbc, ca, dca, cca, 0), depth + 1, output);
    }

    /// <summary>Image pixels per radian of sky around <paramref name="direction"/>: the larger of two perpendicular finite differences.</summary>
    private double PixelsPerRadian(Vec3 direction)
    {
        Projection projection = Projection;
        double best = 0;
        if (ImagePlacement.TryPlace(projection, direction, out double x0, out double y0))
        {
            Vec3 across = direction.AnyPerpendicular();
            best = Math.Max(StepLength(direction, across, x0, y0), StepLength(direction, Vec3.Cross(direction, across), x0, y0));
        }
        // Where no position exists (behind a flat screen) the reference pixel's size stands in.
        return best > 0 ? best : 1 / Math.Sqrt(projection.ReferencePixelSolidAngle);
    }

    /// <summary>Pixels moved per radian when the direction turns a little toward <paramref name="offset"/> (0 if it cannot be placed).</summary>
    private double StepLength(Vec3 direction, Vec3 offset, double x0, double y0)
    {
        const double Step = 1e-4;
        if (!ImagePlacement.TryPlace(Projection, (direction + Step * offset).NormalizedOr(direction), out double x1, out double y1)) return 0;
        return Math.Sqrt((x1 - x0) * (x1 - x0) + (y1 - y0) * (y1 - y0)) / Step;
    }

    /// <summary>Adds the pixels whose centres lie in the given box (pixel coordinates, clipped to the image) to the triangle's search, and marks their tiles.</summary>
    private void AddBox(ref PreparedTriangle prepared, double minX, double minY, double maxX, double maxY)
    {
        // Pixel x has its centre at x + ½.
        int x0 = (int)Math.Max(0, Math.Ceiling(minX - 0.5)), y0 = (int)Math.Max(0, Math.Ceiling(minY - 0.5));
        int x1 = (int)Math.Min(Width - 1, Math.Floor(maxX - 0.5)), y1 = (int)Math.Min(Height - 1, Math.Floor(maxY - 0.5));
        if (x0 > x1 || y0 > y1) return;
        prepared.AddBox(x0, y0, x1, y1);
        // Parts prepared side by side may mark the same tile: they all write true, so the marks never depend on the order.
        for (int tileRow = y0 / TileSize; tileRow <= y1 / TileSize; tileRow++)
            for (int tile = x0 / TileSize; tile <= x1 / TileSize; tile++) _dirtyTiles[tileRow * _tileColumns + tile] = true;
    }

    /// <summary>One part's prepared triangles, in order, listed under each row band they reach.</summary>
    private sealed class PreparedPart
    {
        public readonly List<PreparedTriangle> Triangles = [];
        public readonly BandLists Bands = new();
    }

    /// <summary>
    /// The directions through one band's pixels, worked out afresh for the drawn tiles each time the band is filled:
    /// a frame-sized table of them would come from main memory, row by row, which costs far more than the few
    /// operations per pixel of the projection's own vectorised unprojection.
    /// </summary>
    private sealed class BandDirections(int width)
    {
        public readonly float[] X = new float[BandRows * width], Y = new float[BandRows * width], Z = new float[BandRows * width];
    }

    private readonly struct UnprojectRun(Projection projection, BandDirections directions, int top) : IRunAction
    {
        public void Run(int row, int start, int end)
        {
            int width = projection.Width, column = start - row * width, at = (row - top) * width + column;
            projection.UnprojectRow(row, column, directions.X.AsSpan(at, end - start), directions.Y.AsSpan(at, end - start), directions.Z.AsSpan(at, end - start));
        }
    }

    private unsafe BandDirections FillBand(int band, BandDirections directions)
    {
        int top = band * BandRows, bottom = Math.Min(Height, top + BandRows) - 1;
        var clear = new ClearRun(_pixels);
        ForEachRun(_staleTiles, _staleRange, top, bottom + 1, ref clear);
        // Only the drawn tiles' directions: every pixel a triangle searches lies in one.
        var unproject = new UnprojectRun(Projection, directions, top);
        ForEachDirtyRun(top, bottom + 1, ref unproject);
        fixed (float* bandX = directions.X, bandY = directions.Y, bandZ = directions.Z)
        fixed (float* red = _pixels.Red, green = _pixels.Green, blue = _pixels.Blue, alpha = _pixels.Alpha, depth = _pixels.Depth)
        {
            // Addressed by frame pixel like the surface planes: the band's first row sits at its start.
            long shift = (long)top * Width;
            var pixels = new PixelPointers(bandX - shift, bandY - shift, bandZ - shift, red, green, blue, alpha, depth);
            for (int part = 0; part < _partCount; part++)
            {
                PreparedPart prepared = _parts[part];
                ReadOnlySpan<PreparedTriangle> triangles = CollectionsMarshal.AsSpan(prepared.Triangles);
                foreach (int k in prepared.Bands.In(band))
                {
                    ref readonly PreparedTriangle t = ref triangles[k];
                    for (int boxIndex = 0; boxIndex < t.BoxCount; boxIndex++)
                    {
                        (int x0, int y0, int x1, int y1) = t.Box(boxIndex);
                        for (int row = Math.Max(y0, top); row <= Math.Min(y1, bottom); row++) FillRow(t, boxIndex, row, x0, x1, pixels);
                    }
                }
            }
        }
        _bandLevels[band].Clear();
        var count = new LevelsOfRun(_pixels, _bandLevels[band]);
        ForEachDirtyRun(top, bottom + 1, ref count);
        return directions;
    }

    /// <summary>Pixels [<paramref name="x0"/>, <paramref name="x1"/>] of row <paramref name="y"/>, eight at a time.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private unsafe void FillRow(in PreparedTriangle t, int boxIndex, int y, int x0, int x1, in PixelPointers pixels)
    {
        const int Lanes = VectorLanes.Count;
        for (int x = x0; x <= x1; x += Lanes)
        {
            Vector256<int> column = Vector256.Create(x) + VectorLanes.Indices;
            Vector256<float> wanted = Vector256.LessThanOrEqual(column, Vector256.Create(x1)).AsSingle();
            // Pixels where boxes overlap are drawn from the first box only, so no pixel is blended twice.
            for (int earlier = 0; earlier < boxIndex; earlier++)
            {
                (int bx0, int by0, int bx1, int by1) = t.Box(earlier);
                if (y >= by0 && y <= by1)
                    wanted = Vector256.AndNot(wanted, (Vector256.GreaterThanOrEqual(column, Vector256.Create(bx0)) & Vector256.LessThanOrEqual(column, Vector256.Create(bx1))).AsSingle());
            }
            int i = y * Width + x;
            if (x + Lanes <= Width) Shade(t, pixels, i, wanted);
            else ShadeRowEnd(t, pixels.At(i), Width - x, wanted);
        }
    }

    /// <summary>
    /// The last <paramref name="count"/> (&lt; 8) pixels of a row, through a copy so that nothing past the row's end is
    /// read or written; kept out of line, so that the copy's stack space is not set up for every row.
    /// </summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private static unsafe void ShadeRowEnd(in PreparedTriangle t, in PixelPointers at, int count, Vector256<float> wanted)
    {
        PixelPointers.Lane8 copy = default;
        PixelPointers part = copy.Load(at, count);
        Shade(t, part, 0, wanted);
        copy.StoreSurface(at, count);
    }

    /// <summary>Shades eight pixels for a triangle and blends the covered ones that are <paramref name="wanted"/> into the layer.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void Shade(in PreparedTriangle t, in PixelPointers pixels, int i, Vector256<float> wanted)
    {
        Vector256<float> covered = wanted & t.Cover(Vector256.Load(pixels.X + i), Vector256.Load(pixels.Y + i), Vector256.Load(pixels.Z + i),
            out Vector256<float> weightA, out Vector256<float> weightB, out Vector256<float> weightC, out Vector256<float> coverage);
        // Most of the eight pixels searched around a small triangle lie outside it: only covered ones are interpolated.
        if (covered == Vector256<float>.Zero) return;
        t.Interpolate(weightA, weightB, weightC, out Vector256<float> depth, out Vector256<float> red, out Vector256<float> green, out Vector256<float> blue);
        // Nearest surface in front; a partly covered pixel shows what lies behind it through the uncovered part.
        float* redAt = pixels.Red + i, greenAt = pixels.Green + i, blueAt = pixels.Blue + i, alphaAt = pixels.Alpha + i, depthAt = pixels.Depth + i;
        Vector256<float> oldRed = Vector256.Load(redAt), oldGreen = Vector256.Load(greenAt), oldBlue = Vector256.Load(blueAt);
        Vector256<float> oldAlpha = Vector256.Load(alphaAt), oldDepth = Vector256.Load(depthAt);
        Vector256<float> one = Vector256<float>.One;
        Vector256<float> front = covered & Vector256.LessThan(depth, oldDepth);
        Vector256<float> through = Vector256.AndNot(covered, front) & Vector256.LessThan(oldAlpha, one);
        Vector256<float> behind = one - coverage, seen = (one - oldAlpha) * coverage;
        Vector256.ConditionalSelect(front, coverage * red + behind * oldRed, Vector256.ConditionalSelect(through, oldRed + seen * red, oldRed)).Store(redAt);
        Vector256.ConditionalSelect(front, coverage * green + behind * oldGreen, Vector256.ConditionalSelect(through, oldGreen + seen * green, oldGreen)).Store(greenAt);
        Vector256.ConditionalSelect(front, coverage * blue + behind * oldBlue, Vector256.ConditionalSelect(through, oldBlue + seen * blue, oldBlue)).Store(blueAt);
        Vector256.ConditionalSelect(front, coverage + behind * oldAlpha, Vector256.ConditionalSelect(through, oldAlpha + seen, oldAlpha)).Store(alphaAt);
        Vector256.ConditionalSelect(front, depth, oldDepth).Store(depthAt);
    }

    /// <summary>The layer's planes, one float per pixel each, reused from frame to frame.</summary>
    private sealed class SurfacePlanes(int count)
    {
        public readonly float[] Red = new float[count], Green = new float[count], Blue = new float[count], Alpha = new float[count];
        public readonly float[] Depth = Filled(count, float.PositiveInfinity);

        /// <summary>Empties <paramref name="count"/> pixels from <paramref name="start"/>: no colour, no coverage, no surface.</summary>
        public void Clear(int start, int count)
        {
            Array.Clear(Red, start, count);
            Array.Clear(Green, start, count);
            Array.Clear(Blue, start, count);
            Array.Clear(Alpha, start, count);
            Array.Fill(Depth, float.PositiveInfinity, start, count);
        }

        private static float[] Filled(int count, float value)
        {
            var plane = new float[count];
            Array.Fill(plane, value);
            return plane;
        }
    }

    /// <summary>Where eight neighbouring pixels' directions and surface values are (pinned by the caller).</summary>
    private readonly unsafe struct PixelPointers(float* x, float* y, float* z, float* red, float* green, float* blue, float* alpha, float* depth)
    {
        private const int Lanes = VectorLanes.Count;

        public readonly float* X = x, Y = y, Z = z, Red = red, Green = green, Blue = blue, Alpha = alpha, Depth = depth;

        public PixelPointers At(int index) => new(X + index, Y + index, Z + index, Red + index, Green + index, Blue + index, Alpha + index, Depth + index);

        /// <summary>Eight lanes of every plane, for the last pixels of a row: lanes past the row's end show no sky (NaN), so nothing is drawn there.</summary>
        public struct Lane8
        {
            private fixed float _values[8 * Lanes];

            public PixelPointers Load(in PixelPointers from, int count)
            {
                fixed (float* values = _values)
                {
                    new Span<float>(values, 3 * Lanes).Fill(float.NaN);
                    var to = new PixelPointers(values, values + Lanes, values + 2 * Lanes, values + 3 * Lanes, values + 4 * Lanes, values + 5 * Lanes, values + 6 * Lanes, values + 7 * Lanes);
                    for (int plane = 0; plane < 8; plane++) new ReadOnlySpan<float>(from.Plane(plane), count).CopyTo(new Span<float>(to.Plane(plane), Lanes));
                    // The copy lives in this struct, on the caller's stack: the pointers stay valid while it does.
                    return to;
                }
            }

            public void StoreSurface(in PixelPointers to, int count)
            {
                fixed (float* values = _values)
                    for (int plane = 3; plane < 8; plane++) new ReadOnlySpan<float>(values + plane * Lanes, count).CopyTo(new Span<float>(to.Plane(plane), count));
            }
        }

        private float* Plane(int plane) => plane switch { 0 => X, 1 => Y, 2 => Z, 3 => Red, 4 => Green, 5 => Blue, 6 => Alpha, _ => Depth };
    }

    private static Vec3 ToVec3(Vector3 v) => new(v.X, v.Y, v.Z);

    /// <summary>A triangle ready for the per-pixel tests: oriented side planes, corner data and up to three pixel boxes.</summary>
    private struct PreparedTriangle
    {
        private readonly FloatTriple _sideBC, _sideCA, _sideAB;
        /// <summary>Per side: pixels per unit of side-plane weight (outline sides), or 0 for an inner side with a hard edge.</summary>
        private readonly float _rampBC, _rampCA, _rampAB;
        private readonly float _depthA, _depthB, _depthC;
        private readonly FloatTriple _colourA, _colourB, _colourC;
        private int _box0X0, _box0Y0, _box0X1, _box0Y1, _box1X0, _box1Y0, _box1X1, _box1Y1, _box2X0, _box2Y0, _box2X1, _box2Y1;

        public PreparedTriangle(in SkyTriangle t, float pixelsPerRadian)
        {
            // Side planes through the eye, oriented so the inside is positive whichever way the corners wind.
            Vector3 bc = Vector3.Cross(t.DirectionB, t.DirectionC), ca = Vector3.Cross(t.DirectionC, t.DirectionA), ab = Vector3.Cross(t.DirectionA, t.DirectionB);
            float sign = Vector3.Dot(t.DirectionA, bc) < 0 ? -1 : 1;
            _sideBC = new FloatTriple(sign * bc); _sideCA = new FloatTriple(sign * ca); _sideAB = new FloatTriple(sign * ab);
            // weight / |side normal| is the sine of the angle to the side's great circle.
            _rampBC = (t.OutlineSides & 2) != 0 ? pixelsPerRadian / MathF.Max(bc.Length(), 1e-30f) : 0;
            _rampCA = (t.OutlineSides & 4) != 0 ? pixelsPerRadian / MathF.Max(ca.Length(), 1e-30f) : 0;
            _rampAB = (t.OutlineSides & 1) != 0 ? pixelsPerRadian / MathF.Max(ab.Length(), 1e-30f) : 0;
            _depthA = t.DepthA; _depthB = t.DepthB; _depthC = t.DepthC;
            _colourA = new FloatTriple(t.ColourA); _colourB = new FloatTriple(t.ColourB); _colourC = new FloatTriple(t.ColourC);
        }

        public int BoxCount { get; private set; }
        public int MinY { get; private set; }
        public int MaxY { get; private set; }

        public void AddBox(int x0, int y0, int x1, int y1)
        {
            switch (BoxCount)
            {
                case 0: (_box0X0, _box0Y0, _box0X1, _box0Y1) = (x0, y0, x1, y1); break;
                case 1: (_box1X0, _box1Y0, _box1X1, _box1Y1) = (x0, y0, x1, y1); break;
                default: (_box2X0, _box2Y0, _box2X1, _box2Y1) = (x0, y0, x1, y1); break;
            }
            MinY = BoxCount == 0 ? y0 : Math.Min(MinY, y0);
            MaxY = BoxCount == 0 ? y1 : Math.Max(MaxY, y1);
            BoxCount++;
        }

        public readonly (int X0, int Y0, int X1, int Y1) Box(int index) => index switch
        {
            0 => (_box0X0, _box0Y0, _box0X1, _box0Y1),
            1 => (_box1X0, _box1Y0, _box1X1, _box1Y1),
            _ => (_box2X0, _box2Y0, _box2X1, _box2Y1),
        };

        /// <summary>
        /// Which of eight pixels (directions px, py, pz) lie inside the triangle, as a lane mask, with their coverage
        /// and their (unnormalised, non-negative) weights for <see cref="Interpolate"/>, meaningful in the lanes inside only.
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public readonly Vector256<float> Cover(Vector256<float> px, Vector256<float> py, Vector256<float> pz,
            out Vector256<float> weightA, out Vector256<float> weightB, out Vector256<float> weightC, out Vector256<float> coverage)
        {
            weightA = Dot(_sideBC, px, py, pz); weightB = Dot(_sideCA, px, py, pz); weightC = Dot(_sideAB, px, py, pz);
            coverage = Vector256<float>.One;
            // NaN directions (no sky in this pixel) fail every comparison below.
            Vector256<float> inside = SideCoverage(weightA, _rampBC, ref coverage) & SideCoverage(weightB, _rampCA, ref coverage) & SideCoverage(weightC, _rampAB, ref coverage);
            weightA = Vector256.Max(weightA, Vector256<float>.Zero);
            weightB = Vector256.Max(weightB, Vector256<float>.Zero);
            weightC = Vector256.Max(weightC, Vector256<float>.Zero);
            return inside & Vector256.GreaterThan(weightA + weightB + weightC, Vector256<float>.Zero);
        }

        /// <summary>Depth and colour at eight pixels from their weights as <see cref="Cover"/> gives them.</summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public readonly void Interpolate(Vector256<float> weightA, Vector256<float> weightB, Vector256<float> weightC, out Vector256<float> depth,
            out Vector256<float> red, out Vector256<float> green, out Vector256<float> blue)
        {
            Vector256<float> inverse = Vector256<float>.One / (weightA + weightB + weightC);
            weightA *= inverse; weightB *= inverse; weightC *= inverse;
            depth = Interpolate(weightA, weightB, weightC, _depthA, _depthB, _depthC);
            red = Interpolate(weightA, weightB, weightC, _colourA.X, _colourB.X, _colourC.X);
            green = Interpolate(weightA, weightB, weightC, _colourA.Y, _colourB.Y, _colourC.Y);
            blue = Interpolate(weightA, weightB, weightC, _colourA.Z, _colourB.Z, _colourC.Z);
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private static Vector256<float> Dot(in FloatTriple side, Vector256<float> px, Vector256<float> py, Vector256<float> pz) =>
            Vector256.Create(side.X) * px + Vector256.Create(side.Y) * py + Vector256.Create(side.Z) * pz;

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private static Vector256<float> Interpolate(Vector256<float> weightA, Vector256<float> weightB, Vector256<float> weightC, float a, float b, float c) =>
            weightA * Vector256.Create(a) + weightB * Vector256.Create(b) + weightC * Vector256.Create(c);

        /// <summary>
        /// Inside test against one side. An outline side fades over one pixel centred on it (coverage ramp); an inner
        /// side is a hard edge shared with the neighbouring triangle, which covers the rest.
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private static Vector256<float> SideCoverage(Vector256<float> weight, float ramp, ref Vector256<float> coverage)
        {
            if (ramp == 0) return Vector256.GreaterThanOrEqual(weight, Vector256<float>.Zero);
            Vector256<float> pixels = weight * Vector256.Create(ramp), half = Vector256.Create(0.5f);
            coverage *= Vector256.Min(Vector256<float>.One, pixels + half);
            return Vector256.GreaterThan(pixels, -half);
        }
    }
}
