using System.Numerics;
using System.Runtime.CompilerServices;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Draws <see cref="SkyTriangle"/>s into an opaque-surface layer with its own depth buffer, for any projection.
/// A pixel belongs to a triangle when the direction through its centre lies inside the spherical triangle (three
/// great-circle side tests on the cached <see cref="PixelDirections"/>), so the equirectangular wrap, a dome's rim and
/// the region behind a perspective camera need no special cases: only the pixel box to search is found per
/// projection, by subdividing triangles whose box is not trustworthy. Outline sides get a half-pixel ramp on either
/// side (anti-aliasing); the nearest emission event wins each pixel. Row bands are drawn in parallel, each by one
/// thread, every band over the triangles in one fixed order, so the result never depends on scheduling. The layer
/// remembers which <see cref="TileSize"/>-pixel tiles it drew into, and composites and clears only those.
/// </summary>
public sealed class SkyRasterizer
{
    private const int BandRows = 32;
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

    private readonly PixelDirections _directions;
    private readonly ViewCap _view;
    /// <summary>The layer, row-major; one struct per pixel keeps a pixel's blend within one or two cache lines.</summary>
    private readonly SurfacePixel[] _pixels;
    private readonly int _tileColumns, _tileRows;
    private readonly double _smallBox;
    private readonly bool[] _dirtyTiles;
    private PreparedTriangle[] _prepared = new PreparedTriangle[1024];
    private int _preparedCount;
    /// <summary>Per row band, the prepared triangles reaching into it, in drawing order.</summary>
    private readonly List<int>[] _bandTriangles;
    private readonly Action<int> _fillBand;

    public SkyRasterizer(PixelDirections directions)
    {
        _directions = directions;
        _view = ViewCap.Of(directions);
        _pixels = new SurfacePixel[Width * Height];
        Array.Fill(_pixels, SurfacePixel.Empty);
        _tileColumns = (Width + TileSize - 1) / TileSize;
        _tileRows = (Height + TileSize - 1) / TileSize;
        _dirtyTiles = new bool[_tileColumns * _tileRows];
        _smallBox = Math.Min(SmallBox, Math.Min(Width, Height) / 4.0);
        _bandTriangles = new List<int>[(Height + BandRows - 1) / BandRows];
        for (int band = 0; band < _bandTriangles.Length; band++) _bandTriangles[band] = [];
        _fillBand = FillBand;
    }

    public Projection Projection => _directions.Projection;
    public int Width => Projection.Width;
    public int Height => Projection.Height;

    /// <summary>Emission distance of the nearest surface at pixel <paramref name="index"/> (row-major), +∞ where none was drawn; kept until <see cref="Clear"/>.</summary>
    internal float DepthAt(int index) => _pixels[index].Depth;

    /// <summary>
    /// False when no surface was drawn within <paramref name="reach"/> pixels of the box spanned by (x0, y0) and
    /// (x1, y1), so that every depth there is +∞.
    /// </summary>
    internal bool MayHaveSurfaceIn(float x0, float y0, float x1, float y1, int reach)
    {
        int firstTile = TileOf(MathF.Min(x0, x1) - reach, Width), lastTile = TileOf(MathF.Max(x0, x1) + reach, Width);
        int firstRow = TileOf(MathF.Min(y0, y1) - reach, Height), lastRow = TileOf(MathF.Max(y0, y1) + reach, Height);
        for (int tileRow = firstRow; tileRow <= lastRow; tileRow++)
            for (int tile = firstTile; tile <= lastTile; tile++)
                if (_dirtyTiles[tileRow * _tileColumns + tile]) return true;
        return false;
    }

    private static int TileOf(float position, int limit) => (int)Math.Clamp(position, 0, limit - 1) / TileSize;

    public PixelDirections Directions => _directions;

    /// <summary>The cone of directions the image shows.</summary>
    public ViewCap View => _view;

    /// <summary>Rasterises <paramref name="triangles"/> (front-facing; winding is taken from the directions) into the layer.</summary>
    public void Draw(ReadOnlySpan<SkyTriangle> triangles, ParallelOptions parallel)
    {
        _preparedCount = 0;
        foreach (List<int> band in _bandTriangles) band.Clear();
        foreach (SkyTriangle triangle in triangles) Prepare(triangle, 0);
        if (_preparedCount == 0) return;
        Parallel.For(0, _bandTriangles.Length, parallel, _fillBand);
    }

    /// <summary>
    /// Lays the layer over <paramref name="frame"/>: surfaces hide what lies behind them in proportion to their
    /// coverage, and the pixels they cover are marked touched. The depth buffer stays until <see cref="Clear"/>, so
    /// lines drawn afterwards can pass behind or in front of the surfaces.
    /// </summary>
    public void CompositeOver(HdrFrame frame, ParallelOptions parallel)
    {
        if (frame.Width != Width || frame.Height != Height) throw new ArgumentException("frame and surface layer differ in size", nameof(frame));
        float[] red = frame.Red, green = frame.Green, blue = frame.Blue;
        ForEachDirtyRowSpan(parallel, (y, start, end) =>
        {
            bool touched = false;
            for (int i = y * Width + start, last = y * Width + end; i < last; i++)
            {
                ref readonly SurfacePixel pixel = ref _pixels[i];
                if (pixel.Alpha == 0) continue;
                float keep = 1 - pixel.Alpha;
                red[i] = red[i] * keep + pixel.Red;
                green[i] = green[i] * keep + pixel.Green;
                blue[i] = blue[i] * keep + pixel.Blue;
                touched = true;
            }
            if (touched) frame.MarkTouched(y, start, end);
        });
    }

    /// <summary>
    /// Adds the brightness of every covered pixel to <paramref name="levels"/>: its brightest channel at full
    /// coverage (the surface's own brightness, whatever share of the pixel it covers), in HDR units.
    /// </summary>
    public void AddSurfaceLevels(LevelHistogram levels) =>
        ForEachDirtyRowSpan(null, (y, start, end) =>
        {
            for (int i = y * Width + start, last = y * Width + end; i < last; i++)
            {
                ref readonly SurfacePixel pixel = ref _pixels[i];
                if (pixel.Alpha > 0) levels.Add(MathF.Max(pixel.Red, MathF.Max(pixel.Green, pixel.Blue)) / pixel.Alpha);
            }
        });

    /// <summary>Empties the layer (only the tiles drawn since the last clear) for the next frame.</summary>
    public void Clear(ParallelOptions parallel)
    {
        ForEachDirtyRowSpan(parallel, (y, start, end) => Array.Fill(_pixels, SurfacePixel.Empty, y * Width + start, end - start));
        Array.Clear(_dirtyTiles);
    }

    /// <summary>
    /// Calls <paramref name="span"/>(row, first column, end column) for each run of drawn tiles in each row: top to
    /// bottom, or with <paramref name="parallel"/> one row of tiles per work item (each owns its rows).
    /// </summary>
    private void ForEachDirtyRowSpan(ParallelOptions? parallel, Action<int, int, int> span)
    {
        if (parallel is null)
            for (int tileRow = 0; tileRow < _tileRows; tileRow++) ForEachDirtySpanInTileRow(tileRow, span);
        else
            Parallel.For(0, _tileRows, parallel, tileRow => ForEachDirtySpanInTileRow(tileRow, span));
    }

    private void ForEachDirtySpanInTileRow(int tileRow, Action<int, int, int> span)
    {
        for (int tile = 0; tile < _tileColumns;)
        {
            if (!_dirtyTiles[tileRow * _tileColumns + tile]) { tile++; continue; }
            int runEnd = tile + 1;
            while (runEnd < _tileColumns && _dirtyTiles[tileRow * _tileColumns + runEnd]) runEnd++;
            int start = tile * TileSize, end = Math.Min(Width, runEnd * TileSize);
            for (int y = tileRow * TileSize; y < Math.Min(Height, (tileRow + 1) * TileSize); y++) span(y, start, end);
            tile = runEnd;
        }
    }

    /// <summary>Finds the pixel box to search for a triangle, subdividing it where the projection makes the box unreliable.</summary>
    private void Prepare(in SkyTriangle t, int depth)
    {
        Vec3 a = ToVec3(t.DirectionA), b = ToVec3(t.DirectionB), c = ToVec3(t.DirectionC);
        // The angle subtended by the longest chord.
        double longestChord = Math.Sqrt(Math.Max((a - b).LengthSquared, Math.Max((b - c).LengthSquared, (c - a).LengthSquared)));
        double diameter = 2 * Math.Asin(Math.Min(1, longestChord / 2));
        Vec3 centre = (a + b + c).NormalizedOr(a);
        // Every point of the triangle lies within its diameter of the centroid direction.
        if (_view.Misses(centre, diameter)) return;
        Projection projection = Projection;
        bool onA = ImagePlacement.TryPlace(projection, a, out double ax, out double ay);
        bool onB = ImagePlacement.TryPlace(projection, b, out double bx, out double by);
        bool onC = ImagePlacement.TryPlace(projection, c, out double cx, out double cy);
        if (!onA && !onB && !onC && diameter < OffImageDropAngle) return;
        if (onA && onB && onC && diameter < OffImageDropAngle && ImagePlacement.BeyondOneEdge(projection, ax, ay, bx, by, cx, cy)) return;

        if (onA && onB && onC && ImagePlacement.TryPlace(projection, centre, out double mx, out double my))
        {
            double minX = Math.Min(Math.Min(ax, bx), Math.Min(cx, mx)), maxX = Math.Max(Math.Max(ax, bx), Math.Max(cx, mx));
            double minY = Math.Min(Math.Min(ay, by), Math.Min(cy, my)), maxY = Math.Max(Math.Max(ay, by), Math.Max(cy, my));
            double extent = Math.Max(maxX - minX, maxY - minY);
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
                Keep(prepared);
                return;
            }
        }
        double pixelsPerRadian = PixelsPerRadian(onA ? a : onB ? b : onC ? c : centre);
        if (depth < MaxSubdivisionDepth && diameter * pixelsPerRadian > 3)
        {
            Subdivide(t, depth);
            return;
        }
        // A few pixels across and still straddling a seam or the image edge: search around each corner that is on the image.
        double radius = diameter * pixelsPerRadian + 2;
        var straddling = new PreparedTriangle(t, (float)pixelsPerRadian);
        if (onA) AddBox(ref straddling, ax - radius, ay - radius, ax + radius, ay + radius);
        if (onB) AddBox(ref straddling, bx - radius, by - radius, bx + radius, by + radius);
        if (onC) AddBox(ref straddling, cx - radius, cy - radius, cx + radius, cy + radius);
        Keep(straddling);
    }

    private void Subdivide(in SkyTriangle t, int depth)
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
        Prepare(Make(t.DirectionA, t.DepthA, t.ColourA, ab, dab, cab, ca, dca, cca, (byte)((o & 1) | (o & 4))), depth + 1);
        Prepare(Make(ab, dab, cab, t.DirectionB, t.DepthB, t.ColourB, bc, dbc, cbc, (byte)((o & 1) | (o & 2))), depth + 1);
        Prepare(Make(ca, dca, cca, bc, dbc, cbc, t.DirectionC, t.DepthC, t.ColourC, (byte)((o & 2) | (o & 4))), depth + 1);
        Prepare(Make(ab, dab, cab, bc, dbc, cbc, ca, dca, cca, 0), depth + 1);
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
        for (int tileRow = y0 / TileSize; tileRow <= y1 / TileSize; tileRow++)
            for (int tile = x0 / TileSize; tile <= x1 / TileSize; tile++) _dirtyTiles[tileRow * _tileColumns + tile] = true;
    }

    private void Keep(in PreparedTriangle prepared)
    {
        if (prepared.BoxCount == 0) return;
        if (_preparedCount == _prepared.Length) Array.Resize(ref _prepared, 2 * _prepared.Length);
        for (int band = prepared.MinY / BandRows; band <= prepared.MaxY / BandRows; band++) _bandTriangles[band].Add(_preparedCount);
        _prepared[_preparedCount++] = prepared;
    }

    private void FillBand(int band)
    {
        int top = band * BandRows, bottom = Math.Min(Height, top + BandRows) - 1;
        foreach (int k in _bandTriangles[band]) Fill(_prepared[k], top, bottom);
    }

    private void Fill(in PreparedTriangle t, int top, int bottom)
    {
        for (int boxIndex = 0; boxIndex < t.BoxCount; boxIndex++)
        {
            (int x0, int y0, int x1, int y1) = t.Box(boxIndex);
            for (int y = Math.Max(y0, top); y <= Math.Min(y1, bottom); y++) FillRow(t, boxIndex, y, x0, x1);
        }
    }

    private void FillRow(in PreparedTriangle t, int boxIndex, int y, int x0, int x1)
    {
        int start = y * Width + x0, count = x1 - x0 + 1;
        ReadOnlySpan<float> dx = _directions.X.AsSpan(start, count), dy = _directions.Y.AsSpan(start, count), dz = _directions.Z.AsSpan(start, count);
        Span<SurfacePixel> pixels = _pixels.AsSpan(start, count);
        for (int k = 0; k < pixels.Length; k++)
        {
            if (boxIndex > 0 && t.InEarlierBox(boxIndex, x0 + k, y)) continue;
            if (t.TryShade(dx[k], dy[k], dz[k], out float depth, out Vector3 colour, out float coverage)) Blend(ref pixels[k], depth, colour, coverage);
        }
    }

    /// <summary>Nearest surface in front; a partly covered pixel shows what lies behind it through the uncovered part.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void Blend(ref SurfacePixel pixel, float depth, Vector3 colour, float coverage)
    {
        float oldAlpha = pixel.Alpha;
        if (depth < pixel.Depth)
        {
            float behind = 1 - coverage;
            pixel.Red = coverage * colour.X + behind * pixel.Red;
            pixel.Green = coverage * colour.Y + behind * pixel.Green;
            pixel.Blue = coverage * colour.Z + behind * pixel.Blue;
            pixel.Alpha = coverage + behind * oldAlpha;
            pixel.Depth = depth;
        }
        else if (oldAlpha < 1)
        {
            float through = (1 - oldAlpha) * coverage;
            pixel.Red += through * colour.X;
            pixel.Green += through * colour.Y;
            pixel.Blue += through * colour.Z;
            pixel.Alpha = oldAlpha + through;
        }
    }

    /// <summary>Premultiplied surface colour, coverage, and the emission distance of the nearest surface.</summary>
    private struct SurfacePixel
    {
        public static readonly SurfacePixel Empty = new() { Depth = float.PositiveInfinity };
        public float Red, Green, Blue, Alpha, Depth;
    }

    private static Vec3 ToVec3(Vector3 v) => new(v.X, v.Y, v.Z);

    /// <summary>A triangle ready for the per-pixel tests: oriented side planes, corner data and up to three pixel boxes.</summary>
    private struct PreparedTriangle
    {
        private readonly Vector3 _sideBC, _sideCA, _sideAB;
        /// <summary>Per side: pixels per unit of side-plane weight (outline sides), or 0 for an inner side with a hard edge.</summary>
        private readonly float _rampBC, _rampCA, _rampAB;
        private readonly float _depthA, _depthB, _depthC;
        private readonly Vector3 _colourA, _colourB, _colourC;
        private int _box0X0, _box0Y0, _box0X1, _box0Y1, _box1X0, _box1Y0, _box1X1, _box1Y1, _box2X0, _box2Y0, _box2X1, _box2Y1;

        public PreparedTriangle(in SkyTriangle t, float pixelsPerRadian)
        {
            // Side planes through the eye, oriented so the inside is positive whichever way the corners wind.
            Vector3 bc = Vector3.Cross(t.DirectionB, t.DirectionC), ca = Vector3.Cross(t.DirectionC, t.DirectionA), ab = Vector3.Cross(t.DirectionA, t.DirectionB);
            float sign = Vector3.Dot(t.DirectionA, bc) < 0 ? -1 : 1;
            _sideBC = sign * bc; _sideCA = sign * ca; _sideAB = sign * ab;
            // weight / |side normal| is the sine of the angle to the side's great circle.
            _rampBC = (t.OutlineSides & 2) != 0 ? pixelsPerRadian / MathF.Max(bc.Length(), 1e-30f) : 0;
            _rampCA = (t.OutlineSides & 4) != 0 ? pixelsPerRadian / MathF.Max(ca.Length(), 1e-30f) : 0;
            _rampAB = (t.OutlineSides & 1) != 0 ? pixelsPerRadian / MathF.Max(ab.Length(), 1e-30f) : 0;
            _depthA = t.DepthA; _depthB = t.DepthB; _depthC = t.DepthC;
            _colourA = t.ColourA; _colourB = t.ColourB; _colourC = t.ColourC;
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

        /// <summary>Pixels where boxes overlap are drawn from the first box only, so no pixel is blended twice.</summary>
        public readonly bool InEarlierBox(int boxIndex, int x, int y)
        {
            for (int b = 0; b < boxIndex; b++)
            {
                (int x0, int y0, int x1, int y1) = Box(b);
                if (x >= x0 && x <= x1 && y >= y0 && y <= y1) return true;
            }
            return false;
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public readonly bool TryShade(float px, float py, float pz, out float depth, out Vector3 colour, out float coverage)
        {
            depth = 0; colour = default; coverage = 1;
            // NaN directions (no sky in this pixel) fail every comparison below.
            float weightA = _sideBC.X * px + _sideBC.Y * py + _sideBC.Z * pz;
            float weightB = _sideCA.X * px + _sideCA.Y * py + _sideCA.Z * pz;
            float weightC = _sideAB.X * px + _sideAB.Y * py + _sideAB.Z * pz;
            if (!SideCoverage(weightA, _rampBC, ref coverage) || !SideCoverage(weightB, _rampCA, ref coverage) || !SideCoverage(weightC, _rampAB, ref coverage)) return false;
            weightA = MathF.Max(weightA, 0); weightB = MathF.Max(weightB, 0); weightC = MathF.Max(weightC, 0);
            float total = weightA + weightB + weightC;
            if (!(total > 0)) return false;
            float inverse = 1 / total;
            weightA *= inverse; weightB *= inverse; weightC *= inverse;
            depth = weightA * _depthA + weightB * _depthB + weightC * _depthC;
            colour = weightA * _colourA + weightB * _colourB + weightC * _colourC;
            return true;
        }

        /// <summary>
        /// Inside test against one side. An outline side fades over one pixel centred on it (coverage ramp); an inner
        /// side is a hard edge shared with the neighbouring triangle, which covers the rest.
        /// </summary>
        private static bool SideCoverage(float weight, float ramp, ref float coverage)
        {
            if (ramp == 0) return weight >= 0;
            float pixels = weight * ramp;
            if (!(pixels > -0.5f)) return false;
            coverage *= MathF.Min(1, pixels + 0.5f);
            return true;
        }
    }
}
