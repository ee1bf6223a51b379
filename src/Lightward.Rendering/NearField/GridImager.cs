using System.Numerics;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// A straight piece of a drawn line in pixel coordinates, with colour and emission distance at both ends. The colour
/// is in exposed (display-linear) units: the drawer divides it by the frame's exposure scale.
/// </summary>
public readonly record struct PixelSegment(float X0, float Y0, float X1, float Y1, Vector3 Colour0, Vector3 Colour1, float Depth0, float Depth1);

/// <summary>
/// Turns the grid's lines into pixel segments. Every line point is static in the grid's frame, so each sample is a
/// closed-form retarded sight (<see cref="RestFrameSight"/>). Each line is first cut to the part that can reach the
/// image: aberration maps circles on the sky to circles, so the view's cone seen from the grid's frame is again a
/// cone, and a straight line meets it in at most two intervals, found in closed form. What is left is sampled
/// adaptively: a piece is halved until the image of its middle lies within half a pixel of the straight segment
/// between the images of its ends, and its colour and depth there within a small tolerance of the values the
/// drawer interpolates, so the drawn polyline follows the curved image. Pieces that cross a projection seam (the
/// equirectangular wrap, a dome's nadir, the plane behind a perspective camera) never meet that test and are
/// dropped at the finest level; pieces wholly beyond one edge of the image are dropped at once.
/// </summary>
public sealed class GridImager
{
    private const int MaxHalvings = 14;
    private const float PositionTolerance = 0.5f;
    /// <summary>Largest error of the interpolated colour, exposed units (display white is about 16).</summary>
    private const float ColourTolerance = 0.01f;
    /// <summary>Largest relative error of the interpolated emission distance (decides which side of a surface a line is).</summary>
    private const float DepthTolerance = 0.01f;
    private const float LongestAtFinestLevel = 3;
    /// <summary>The view's cone is widened by this angle before the lines are cut to it, rad (the drawn lines are a pixel or two wide).</summary>
    private const double ViewMargin = 0.01;

    private readonly record struct Sample(Vec3 Point, bool Placed, float X, float Y, Vector3 Colour, float Depth);

    private RestFrameSight _sight;
    private Projection _projection = null!;
    private LineShader _shader;
    private SpaceGrid _grid = null!;
    private Vec3 _camera;
    private FrameCap _visible;

    /// <summary>Lines traced per work item; each item writes its own list, joined in item order, so the output never depends on scheduling.</summary>
    private const int LinesPerChunk = 32;
    private readonly List<List<PixelSegment>> _chunks = [];
    /// <summary>This frame's lattice lines, kept between frames.</summary>
    private readonly List<(Vec3 From, Vec3 To)> _lines = [];
    private readonly Action<int> _traceChunk;

    public GridImager() => _traceChunk = TraceChunk;

    /// <summary>Appends the pixel segments of <paramref name="grid"/> seen from <paramref name="ship"/>.</summary>
    public void Trace(SpaceGrid grid, ShipState ship, Rotation cameraToShip, ViewCap view, Projection projection, List<PixelSegment> output, ParallelOptions parallel)
    {
        _grid = grid;
        _projection = projection;
        _sight = RestFrameSight.Of(grid.Origin, grid.Frame, ship, cameraToShip);
        _shader = new LineShader(grid.Temperature, grid.Brightness);
        _camera = _sight.CameraEvent.Space;
        _visible = FrameCap.Of(view, ViewMargin, _sight);
        grid.LinesAround(_camera, _lines);
        int chunkCount = (_lines.Count + LinesPerChunk - 1) / LinesPerChunk;
        while (_chunks.Count < chunkCount) _chunks.Add([]);
        ParallelItems.For(0, chunkCount, parallel, _traceChunk);
        for (int chunk = 0; chunk < chunkCount; chunk++) output.AddRange(_chunks[chunk]);
    }

    /// <summary>The lines of chunk <paramref name="chunk"/>, each cut to the view and traced into the chunk's own list.</summary>
    private void TraceChunk(int chunk)
    {
        List<PixelSegment> segments = _chunks[chunk];
        segments.Clear();
        Span<double> cuts = stackalloc double[4];
        for (int line = chunk * LinesPerChunk; line < Math.Min(_lines.Count, (chunk + 1) * LinesPerChunk); line++)
        {
            (Vec3 from, Vec3 to) = _lines[line];
            int count = _visible.Cut(from - _camera, to - from, cuts);
            for (int piece = 0; piece < count; piece += 2)
                TraceLine(from + cuts[piece] * (to - from), from + cuts[piece + 1] * (to - from), segments);
        }
    }

    private void TraceLine(Vec3 from, Vec3 to, List<PixelSegment> output)
    {
        // Start from pieces of at most one spacing, so the fade and the Doppler colour are never sampled too coarsely to notice.
        int pieces = Math.Max(1, (int)Math.Ceiling((to - from).Length / _grid.Spacing));
        Sample previous = See(from);
        for (int k = 1; k <= pieces; k++)
        {
            Sample next = See(from + (double)k / pieces * (to - from));
            Refine(previous, next, 0, output);
            previous = next;
        }
    }

    private Sample See(Vec3 point)
    {
        PointSight sight = _sight.See(point);
        bool placed = ImagePlacement.TryPlace(_projection, sight.Direction, out double x, out double y);
        double fade = _grid.Fade((point - _camera).Length);
        return new Sample(point, placed, (float)x, (float)y, (float)fade * _shader.Shade(sight.Doppler), (float)sight.Distance);
    }

    private void Refine(in Sample a, in Sample b, int halvings, List<PixelSegment> output)
    {
        if (a.Colour == Vector3.Zero && b.Colour == Vector3.Zero) return;
        Sample middle = See((a.Point + b.Point) / 2);
        if (a.Placed && b.Placed && middle.Placed)
        {
            if (ImagePlacement.BeyondOneEdge(_projection, a.X, a.Y, b.X, b.Y, middle.X, middle.Y)) return;
            float offX = middle.X - (a.X + b.X) / 2, offY = middle.Y - (a.Y + b.Y) / 2;
            Vector3 colourError = Vector3.Abs(middle.Colour - (a.Colour + b.Colour) / 2);
            float depthError = MathF.Abs(middle.Depth - (a.Depth + b.Depth) / 2);
            if (offX * offX + offY * offY <= PositionTolerance * PositionTolerance
                && MathF.Max(colourError.X, MathF.Max(colourError.Y, colourError.Z)) <= ColourTolerance
                && depthError <= DepthTolerance * middle.Depth)
            {
                output.Add(new PixelSegment(a.X, a.Y, b.X, b.Y, a.Colour, b.Colour, a.Depth, b.Depth));
                return;
            }
        }
        // Both ends and the middle behind a flat screen: the piece's image, a short circle arc, is behind it too.
        else if (!a.Placed && !b.Placed && !middle.Placed) return;
        if (halvings < MaxHalvings)
        {
            Refine(a, middle, halvings + 1, output);
            Refine(middle, b, halvings + 1, output);
        }
        else if (a.Placed && b.Placed && (b.X - a.X) * (b.X - a.X) + (b.Y - a.Y) * (b.Y - a.Y) <= LongestAtFinestLevel * LongestAtFinestLevel)
            output.Add(new PixelSegment(a.X, a.Y, b.X, b.Y, a.Colour, b.Colour, a.Depth, b.Depth));
    }

    /// <summary>
    /// The directions of the grid's frame whose light reaches the image: the half-space {d : n·d ≥ h} of the unit
    /// sphere, the view's cone seen from the frame. Aberration is a conformal map of the sky that takes circles to
    /// circles (Penrose 1959), so three points of the cone's rim, traced back to the frame, fix the rim there exactly.
    /// </summary>
    private readonly record struct FrameCap(Vec3 Normal, double Height, bool Everything)
    {
        public static FrameCap Of(ViewCap view, double margin, RestFrameSight sight)
        {
            double radius = view.Radius + margin;
            if (radius >= Math.PI - margin) return new FrameCap(Vec3.UnitZ, -1, true);
            Vec3 centre = view.Centre, across = centre.AnyPerpendicular(), third = Vec3.Cross(centre, across);
            Vec3 Rim(double turn) => sight.SourceDirection(Math.Cos(radius) * centre + Math.Sin(radius) * (Math.Cos(turn) * across + Math.Sin(turn) * third));
            Vec3 p0 = Rim(0), p1 = Rim(2 * Math.PI / 3), p2 = Rim(4 * Math.PI / 3);
            Vec3 normal = Vec3.Cross(p1 - p0, p2 - p0).NormalizedOr(Vec3.Zero);
            if (normal == Vec3.Zero) return new FrameCap(Vec3.UnitZ, -1, true);
            double height = Vec3.Dot(normal, p0);
            // The side of the rim that holds the view's centre is the visible one.
            return Vec3.Dot(normal, sight.SourceDirection(centre)) >= height ? new FrameCap(normal, height, false) : new FrameCap(-normal, -height, false);
        }

        /// <summary>
        /// The parts of the line q(t) = <paramref name="start"/> + t·<paramref name="along"/>, t ∈ [0, 1] (relative
        /// to the camera), whose directions lie in the cap, as pairs [t₀, t₁] written to <paramref name="cuts"/>;
        /// returns the number of values written (0, 2 or 4). Visible means g(t) = n·q − h|q| ≥ 0; g changes sign only
        /// where (n·q)² = h²|q|² with n·q of the sign of h, a quadratic in t.
        /// </summary>
        public int Cut(Vec3 start, Vec3 along, Span<double> cuts)
        {
            if (Everything)
            {
                cuts[0] = 0;
                cuts[1] = 1;
                return 2;
            }
            double a0 = Vec3.Dot(Normal, start), a1 = Vec3.Dot(Normal, along), h2 = Height * Height;
            double qa = a1 * a1 - h2 * along.LengthSquared;
            double qb = 2 * (a0 * a1 - h2 * Vec3.Dot(start, along));
            double qc = a0 * a0 - h2 * start.LengthSquared;
            Span<double> ends = stackalloc double[4];
            int endCount = 0;
            ends[endCount++] = 0;
            Span<double> roots = stackalloc double[2];
            int rootCount = SolveQuadratic(qa, qb, qc, roots);
            for (int r = 0; r < rootCount; r++)
                if (roots[r] > 0 && roots[r] < 1) ends[endCount++] = roots[r];
            ends[endCount++] = 1;
            ends[..endCount].Sort();
            int written = 0;
            for (int i = 0; i + 1 < endCount; i++)
            {
                double middle = (ends[i] + ends[i + 1]) / 2;
                Vec3 q = start + middle * along;
                // A touching point (the line through the camera, seen end on) is no piece to draw.
                if (ends[i + 1] - ends[i] < 1e-9 || Vec3.Dot(Normal, q) < Height * q.Length) continue;
                // Join with the previous visible interval when they touch (a root where g only grazes zero).
                if (written > 0 && cuts[written - 1] == ends[i]) cuts[written - 1] = ends[i + 1];
                else if (written < cuts.Length)
                {
                    cuts[written++] = ends[i];
                    cuts[written++] = ends[i + 1];
                }
            }
            return written;
        }

        /// <summary>Real roots of a t² + b t + c = 0 (a linear or constant equation when a vanishes), without cancellation.</summary>
        private static int SolveQuadratic(double a, double b, double c, Span<double> roots)
        {
            double scale = Math.Max(Math.Abs(a), Math.Max(Math.Abs(b), Math.Abs(c)));
            if (!(scale > 0)) return 0;
            if (Math.Abs(a) <= 1e-12 * scale)
            {
                if (b == 0) return 0;
                roots[0] = -c / b;
                return 1;
            }
            double discriminant = b * b - 4 * a * c;
            if (discriminant < 0) return 0;
            double q = -0.5 * (b + Math.CopySign(Math.Sqrt(discriminant), b));
            roots[0] = q / a;
            if (q == 0) return 1;
            roots[1] = c / q;
            return 2;
        }
    }
}
