using System.Numerics;
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
/// thread, every band over the triangles in one fixed order, so the result never depends on scheduling.
/// </summary>
public sealed class SkyRasterizer
{
    private const int BandRows = 32;
    private const int MaxSubdivisionDepth = 10;
    /// <summary>Triangles below this angular size are dropped when their corners cannot be placed (behind a flat screen) or all lie beyond one image edge, rad.</summary>
    private const double OffImageDropAngle = 1.0;

    private readonly PixelDirections _directions;
    private readonly ViewCap _view;
    private readonly float[] _depth, _red, _green, _blue, _alpha;
    private readonly List<PreparedTriangle> _prepared = [];
    private int _dirtyMinX = int.MaxValue, _dirtyMinY = int.MaxValue, _dirtyMaxX = -1, _dirtyMaxY = -1;

    public SkyRasterizer(PixelDirections directions)
    {
        _directions = directions;
        _view = ViewCap.Of(directions);
        int count = Width * Height;
        _depth = new float[count];
        Array.Fill(_depth, float.PositiveInfinity);
        _red = new float[count];
        _green = new float[count];
        _blue = new float[count];
        _alpha = new float[count];
    }

    public Projection Projection => _directions.Projection;
    public int Width => Projection.Width;
    public int Height => Projection.Height;

    /// <summary>Coverage of pixel (x, y) by surfaces drawn since the last composite (0 … 1).</summary>
    public float CoverageAt(int x, int y) => _alpha[y * Width + x];
    /// <summary>Emission distance of the nearest surface at pixel (x, y), +∞ where none was drawn.</summary>
    public float DepthAt(int x, int y) => _depth[y * Width + x];

    /// <summary>Emission distance of the nearest surface per pixel (row-major), +∞ where none was drawn; kept until <see cref="Clear"/>.</summary>
    internal float[] DepthBuffer => _depth;

    public PixelDirections Directions => _directions;

    /// <summary>The cone of directions the image shows.</summary>
    public ViewCap View => _view;

    /// <summary>Rasterises <paramref name="triangles"/> (front-facing; winding is taken from the directions) into the layer.</summary>
    public void Draw(ReadOnlySpan<SkyTriangle> triangles, ParallelOptions parallel)
    {
        _prepared.Clear();
        foreach (SkyTriangle triangle in triangles) Prepare(triangle, 0);
        if (_prepared.Count == 0) return;
        int bands = (Height + BandRows - 1) / BandRows;
        Parallel.For(0, bands, parallel, band =>
        {
            int top = band * BandRows, bottom = Math.Min(Height, top + BandRows) - 1;
            foreach (PreparedTriangle triangle in _prepared)
                if (triangle.MaxY >= top && triangle.MinY <= bottom)
                    Fill(triangle, top, bottom);
        });
    }

    /// <summary>
    /// Lays the layer over planar HDR radiance (row-major, <see cref="Width"/> × <see cref="Height"/>): surfaces hide
    /// what lies behind them in proportion to their coverage. The depth buffer stays until <see cref="Clear"/>, so
    /// lines drawn afterwards can pass behind or in front of the surfaces.
    /// </summary>
    public void CompositeOver(Span<float> red, Span<float> green, Span<float> blue)
    {
        for (int y = _dirtyMinY; y <= _dirtyMaxY; y++)
        {
            int start = y * Width + _dirtyMinX, end = y * Width + _dirtyMaxX;
            for (int i = start; i <= end; i++)
            {
                float alpha = _alpha[i];
                if (alpha == 0) continue;
                float keep = 1 - alpha;
                red[i] = red[i] * keep + _red[i];
                green[i] = green[i] * keep + _green[i];
                blue[i] = blue[i] * keep + _blue[i];
            }
        }
    }

    /// <summary>Empties the layer (only the region drawn since the last clear) for the next frame.</summary>
    public void Clear()
    {
        for (int y = _dirtyMinY; y <= _dirtyMaxY; y++)
        {
            int start = y * Width + _dirtyMinX, length = _dirtyMaxX - _dirtyMinX + 1;
            Array.Clear(_alpha, start, length);
            Array.Clear(_red, start, length);
            Array.Clear(_green, start, length);
            Array.Clear(_blue, start, length);
            Array.Fill(_depth, float.PositiveInfinity, start, length);
        }
        _dirtyMinX = _dirtyMinY = int.MaxValue;
        _dirtyMaxX = _dirtyMaxY = -1;
    }

    /// <summary>Finds the pixel box to search for a triangle, subdividing it where the projection makes the box unreliable.</summary>
    private void Prepare(in SkyTriangle t, int depth)
    {
        Vec3 a = ToVec3(t.DirectionA), b = ToVec3(t.DirectionB), c = ToVec3(t.DirectionC);
        double diameter = Math.Max(Vec3.AngleBetween(a, b), Math.Max(Vec3.AngleBetween(b, c), Vec3.AngleBetween(c, a)));
        Vec3 centre = (a + b + c).NormalizedOr(a);
        // Every point of the triangle lies within its diameter of the centroid direction.
        if (_view.Misses(centre, diameter)) return;
        Projection projection = Projection;
        bool onA = ImagePlacement.TryPlace(projection, a, out double ax, out double ay);
        bool onB = ImagePlacement.TryPlace(projection, b, out double bx, out double by);
        bool onC = ImagePlacement.TryPlace(projection, c, out double cx, out double cy);
        if (!onA && !onB && !onC && diameter < OffImageDropAngle) return;
        if (onA && onB && onC && diameter < OffImageDropAngle && ImagePlacement.BeyondOneEdge(projection, ax, ay, bx, by, cx, cy)) return;

        double pixelsPerRadian = PixelsPerRadian(onA ? a : onB ? b : onC ? c : centre);
        if (onA && onB && onC && ImagePlacement.TryPlace(projection, centre, out double mx, out double my))
        {
            double minX = Math.Min(Math.Min(ax, bx), Math.Min(cx, mx)), maxX = Math.Max(Math.Max(ax, bx), Math.Max(cx, mx));
            double minY = Math.Min(Math.Min(ay, by), Math.Min(cy, my)), maxY = Math.Max(Math.Max(ay, by), Math.Max(cy, my));
            // A box much wider than the triangle's angular size allows means its corners sit on both sides of a seam.
            double plausible = 2 * diameter * pixelsPerRadian + 4;
            if (maxX - minX <= plausible && maxY - minY <= plausible)
            {
                // Great-circle sides bow out of the corners' box by a few percent of their length at most (sides are at most
                // a quarter radian); one pixel more covers the outline ramp.
                double pad = 0.05 * diameter * pixelsPerRadian + 1;
                AddPrepared(t, pixelsPerRadian, [(minX - pad, minY - pad, maxX + pad, maxY + pad)]);
                return;
            }
        }
        if (depth < MaxSubdivisionDepth && diameter * pixelsPerRadian > 3)
        {
            Subdivide(t, depth);
            return;
        }
        // A few pixels across and still straddling a seam or the image edge: search around each corner that is on the image.
        double radius = diameter * pixelsPerRadian + 2;
        var boxes = new List<(double, double, double, double)>(3);
        if (onA) boxes.Add((ax - radius, ay - radius, ax + radius, ay + radius));
        if (onB) boxes.Add((bx - radius, by - radius, bx + radius, by + radius));
        if (onC) boxes.Add((cx - radius, cy - radius, cx + radius, cy + radius));
        if (boxes.Count > 0) AddPrepared(t, pixelsPerRadian, boxes);
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

    private void AddPrepared(in SkyTriangle t, double pixelsPerRadian, List<(double MinX, double MinY, double MaxX, double MaxY)> boxes)
    {
        var prepared = new PreparedTriangle(t, (float)pixelsPerRadian);
        Span<int> box = stackalloc int[4];
        foreach (var (minX, minY, maxX, maxY) in boxes)
        {
            int x0 = Math.Max(0, (int)Math.Floor(minX)), y0 = Math.Max(0, (int)Math.Floor(minY));
            int x1 = Math.Min(Width - 1, (int)Math.Ceiling(maxX)), y1 = Math.Min(Height - 1, (int)Math.Ceiling(maxY));
            if (x0 > x1 || y0 > y1) continue;
            prepared.AddBox(x0, y0, x1, y1);
            _dirtyMinX = Math.Min(_dirtyMinX, x0); _dirtyMaxX = Math.Max(_dirtyMaxX, x1);
            _dirtyMinY = Math.Min(_dirtyMinY, y0); _dirtyMaxY = Math.Max(_dirtyMaxY, y1);
        }
        if (prepared.BoxCount > 0) _prepared.Add(prepared);
    }

    private void Fill(PreparedTriangle t, int top, int bottom)
    {
        float[] dx = _directions.X, dy = _directions.Y, dz = _directions.Z;
        for (int boxIndex = 0; boxIndex < t.BoxCount; boxIndex++)
        {
            (int x0, int y0, int x1, int y1) = t.Box(boxIndex);
            for (int y = Math.Max(y0, top); y <= Math.Min(y1, bottom); y++)
                for (int x = x0; x <= x1; x++)
                {
                    if (t.InEarlierBox(boxIndex, x, y)) continue;
                    int i = y * Width + x;
                    var p = new Vector3(dx[i], dy[i], dz[i]);
                    if (!t.TryShade(p, out float depth, out Vector3 colour, out float coverage)) continue;
                    Blend(i, depth, colour, coverage);
                }
        }
    }

    /// <summary>Nearest surface in front; a partly covered pixel shows what lies behind it through the uncovered part.</summary>
    private void Blend(int i, float depth, Vector3 colour, float coverage)
    {
        float oldAlpha = _alpha[i];
        if (depth < _depth[i])
        {
            float behind = 1 - coverage;
            _red[i] = coverage * colour.X + behind * _red[i];
            _green[i] = coverage * colour.Y + behind * _green[i];
            _blue[i] = coverage * colour.Z + behind * _blue[i];
            _alpha[i] = coverage + behind * oldAlpha;
            _depth[i] = depth;
        }
        else if (oldAlpha < 1)
        {
            float through = (1 - oldAlpha) * coverage;
            _red[i] += through * colour.X;
            _green[i] += through * colour.Y;
            _blue[i] += through * colour.Z;
            _alpha[i] = oldAlpha + through;
        }
    }

    private static Vec3 ToVec3(Vector3 v) => new(v.X, v.Y, v.Z);

    /// <summary>A triangle ready for the per-pixel tests: oriented side planes, corner data and up to three pixel boxes.</summary>
    private sealed class PreparedTriangle
    {
        private readonly Vector3 _sideBC, _sideCA, _sideAB;
        private readonly float _inverseBC, _inverseCA, _inverseAB;
        private readonly float _depthA, _depthB, _depthC;
        private readonly Vector3 _colourA, _colourB, _colourC;
        private readonly bool _outlineAB, _outlineBC, _outlineCA;
        private readonly float _pixelsPerRadian;
        private readonly int[] _boxes = new int[12];

        public PreparedTriangle(in SkyTriangle t, float pixelsPerRadian)
        {
            // Side planes through the eye, oriented so the inside is positive whichever way the corners wind.
            Vector3 bc = Vector3.Cross(t.DirectionB, t.DirectionC), ca = Vector3.Cross(t.DirectionC, t.DirectionA), ab = Vector3.Cross(t.DirectionA, t.DirectionB);
            float sign = Vector3.Dot(t.DirectionA, bc) < 0 ? -1 : 1;
            _sideBC = sign * bc; _sideCA = sign * ca; _sideAB = sign * ab;
            _inverseBC = 1 / MathF.Max(bc.Length(), 1e-30f); _inverseCA = 1 / MathF.Max(ca.Length(), 1e-30f); _inverseAB = 1 / MathF.Max(ab.Length(), 1e-30f);
            _depthA = t.DepthA; _depthB = t.DepthB; _depthC = t.DepthC;
            _colourA = t.ColourA; _colourB = t.ColourB; _colourC = t.ColourC;
            _outlineAB = (t.OutlineSides & 1) != 0; _outlineBC = (t.OutlineSides & 2) != 0; _outlineCA = (t.OutlineSides & 4) != 0;
            _pixelsPerRadian = pixelsPerRadian;
        }

        public int BoxCount { get; private set; }

        public void AddBox(int x0, int y0, int x1, int y1)
        {
            _boxes[4 * BoxCount] = x0; _boxes[4 * BoxCount + 1] = y0; _boxes[4 * BoxCount + 2] = x1; _boxes[4 * BoxCount + 3] = y1;
            MinY = BoxCount == 0 ? y0 : Math.Min(MinY, y0);
            MaxY = BoxCount == 0 ? y1 : Math.Max(MaxY, y1);
            BoxCount++;
        }

        public int MinY { get; private set; }
        public int MaxY { get; private set; }

        public (int X0, int Y0, int X1, int Y1) Box(int index) => (_boxes[4 * index], _boxes[4 * index + 1], _boxes[4 * index + 2], _boxes[4 * index + 3]);

        /// <summary>Pixels where boxes overlap are drawn from the first box only, so no pixel is blended twice.</summary>
        public bool InEarlierBox(int boxIndex, int x, int y)
        {
            for (int b = 0; b < boxIndex; b++)
                if (x >= _boxes[4 * b] && x <= _boxes[4 * b + 2] && y >= _boxes[4 * b + 1] && y <= _boxes[4 * b + 3]) return true;
            return false;
        }

        public bool TryShade(Vector3 p, out float depth, out Vector3 colour, out float coverage)
        {
            depth = 0; colour = default; coverage = 0;
            // NaN directions (no sky in this pixel) fail every comparison below.
            float weightA = Vector3.Dot(_sideBC, p), weightB = Vector3.Dot(_sideCA, p), weightC = Vector3.Dot(_sideAB, p);
            coverage = 1;
            if (!SideCoverage(weightA, _inverseBC, _outlineBC, ref coverage)) return false;
            if (!SideCoverage(weightB, _inverseCA, _outlineCA, ref coverage)) return false;
            if (!SideCoverage(weightC, _inverseAB, _outlineAB, ref coverage)) return false;
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
        private bool SideCoverage(float weight, float inverseLength, bool outline, ref float coverage)
        {
            if (!outline) return weight >= 0;
            // weight / |side normal| is the sine of the angle to the side's great circle.
            float pixels = weight * inverseLength * _pixelsPerRadian;
            if (!(pixels > -0.5f)) return false;
            coverage *= MathF.Min(1, pixels + 0.5f);
            return true;
        }
    }
}
