using System.Numerics;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>A straight piece of a drawn line in pixel coordinates, with colour (HDR) and emission distance at both ends.</summary>
public readonly record struct PixelSegment(float X0, float Y0, float X1, float Y1, Vector3 Colour0, Vector3 Colour1, float Depth0, float Depth1);

/// <summary>
/// Turns the grid's lines into pixel segments. Every line point is static in the grid's frame, so each sample is a
/// closed-form retarded sight (<see cref="RestFrameSight"/>). Lines are sampled adaptively on the image: a piece is
/// halved until the image of its middle lies within half a pixel of the straight segment between the images of its
/// ends, so the drawn polyline follows the curved image. Pieces that cross a projection seam (the equirectangular wrap,
/// a dome's nadir, the plane behind a perspective camera) never meet that test and are dropped at the finest level;
/// pieces wholly beyond one edge of the image are dropped at once.
/// </summary>
public sealed class GridImager
{
    private const int MaxHalvings = 14;
    private const float Tolerance = 0.5f;
    /// <summary>Longest segment kept in pixels; longer ones are halved so colour and depth interpolate smoothly.</summary>
    private const float LongestSegment = 24;
    private const float LongestAtFinestLevel = 3;
    /// <summary>A Doppler factor changing by more than this ratio along a segment halves it (keeps the colour ramp smooth).</summary>
    private const double DopplerSpread = 1.1;
    private const double ArcMargin = 0.2;

    private readonly record struct Sample(Vec3 Point, Vec3 Direction, bool Placed, float X, float Y, Vector3 Colour, float Depth, double Doppler);

    private RestFrameSight _sight;
    private Projection _projection = null!;
    private SurfaceShader _shader;
    private SpaceGrid _grid = null!;
    private Vec3 _camera;
    private ViewCap _view;

    /// <summary>Lines traced per work item; each item writes its own list, joined in item order, so the output never depends on scheduling.</summary>
    private const int LinesPerChunk = 32;
    private readonly List<List<PixelSegment>> _chunks = [];

    /// <summary>Appends the pixel segments of <paramref name="grid"/> seen from <paramref name="ship"/>.</summary>
    public void Trace(SpaceGrid grid, ShipState ship, Rotation cameraToShip, ViewCap view, Projection projection, List<PixelSegment> output, ParallelOptions parallel)
    {
        _grid = grid;
        _view = view;
        _projection = projection;
        _sight = RestFrameSight.Of(grid.Origin, grid.Frame, ship, cameraToShip);
        _shader = SurfaceShader.OfHdrValue(grid.Temperature, grid.Brightness);
        _camera = _sight.CameraEvent.Space;
        (Vec3 From, Vec3 To)[] lines = grid.LinesAround(_camera).ToArray();
        int chunkCount = (lines.Length + LinesPerChunk - 1) / LinesPerChunk;
        while (_chunks.Count < chunkCount) _chunks.Add([]);
        Parallel.For(0, chunkCount, parallel, chunk =>
        {
            List<PixelSegment> segments = _chunks[chunk];
            segments.Clear();
            for (int line = chunk * LinesPerChunk; line < Math.Min(lines.Length, (chunk + 1) * LinesPerChunk); line++)
                TraceLine(lines[line].From, lines[line].To, segments);
        });
        for (int chunk = 0; chunk < chunkCount; chunk++) output.AddRange(_chunks[chunk]);
    }

    private void TraceLine(Vec3 from, Vec3 to, List<PixelSegment> output)
    {
        // Start from pieces of one spacing so no bend is skipped between coarse samples.
        int pieces = Math.Max(2, (int)Math.Ceiling((to - from).Length / _grid.Spacing));
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
        return new Sample(point, sight.Direction, placed, (float)x, (float)y, (float)fade * _shader.Shade(sight.Doppler), (float)sight.Distance, sight.Doppler);
    }

    private void Refine(in Sample a, in Sample b, int halvings, List<PixelSegment> output)
    {
        if (a.Colour == Vector3.Zero && b.Colour == Vector3.Zero) return;
        // A piece's image bends away from its chord's great circle by far less than this once it is a spacing long or shorter.
        if (_view.MissesArc(a.Direction, b.Direction, ArcMargin)) return;
        Sample middle = See((a.Point + b.Point) / 2);
        float length = MathF.Sqrt((b.X - a.X) * (b.X - a.X) + (b.Y - a.Y) * (b.Y - a.Y));
        if (a.Placed && b.Placed && middle.Placed)
        {
            if (ImagePlacement.BeyondOneEdge(_projection, a.X, a.Y, b.X, b.Y, middle.X, middle.Y)) return;
            float offX = middle.X - (a.X + b.X) / 2, offY = middle.Y - (a.Y + b.Y) / 2;
            double spread = a.Doppler > b.Doppler ? a.Doppler / b.Doppler : b.Doppler / a.Doppler;
            if (offX * offX + offY * offY <= Tolerance * Tolerance && length <= LongestSegment && spread <= DopplerSpread)
            {
                output.Add(new PixelSegment(a.X, a.Y, b.X, b.Y, a.Colour, b.Colour, a.Depth, b.Depth));
                return;
            }
        }
        if (halvings < MaxHalvings)
        {
            Refine(a, middle, halvings + 1, output);
            Refine(middle, b, halvings + 1, output);
        }
        else if (a.Placed && b.Placed && length <= LongestAtFinestLevel)
            output.Add(new PixelSegment(a.X, a.Y, b.X, b.Y, a.Colour, b.Colour, a.Depth, b.Depth));
    }
}
