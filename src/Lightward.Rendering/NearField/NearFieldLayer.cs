using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>A body and how it looks this frame (null when none of its light reaches the camera yet).</summary>
public readonly record struct BodyView(NearFieldBody Body, BodyAppearance? Appearance);

/// <summary>
/// The near field as a frame layer: bodies seen at their retarded positions, drawn as opaque surfaces with their own
/// depth buffer, then the grid of space drawn in front of or behind them. Keeps its buffers between frames (they are
/// rebuilt only when the projection changes).
/// </summary>
public sealed class NearFieldLayer : IFrameLayer
{
    /// <summary>
    /// Margin on the projection's reference pixel scale for the split test: pixels away from the reference point
    /// (toward the edge of a wide flat screen) are smaller in angle.
    /// </summary>
    private const double PixelScaleMargin = 1.5;

    private readonly BodyImager[] _imagers;
    private readonly GridImager _gridImager = new();
    private readonly List<SkyTriangle> _triangles = [];
    private readonly List<SkyTriangle>[] _bodyTriangles;
    private readonly List<PixelSegment> _segments = [];
    private readonly BodyView[] _views;
    private SkyRasterizer? _rasterizer;

    public NearFieldLayer(IEnumerable<NearFieldBody> bodies, SpaceGrid? grid)
    {
        _imagers = bodies.Select(b => new BodyImager(b)).ToArray();
        _views = _imagers.Select(i => new BodyView(i.Body, null)).ToArray();
        _bodyTriangles = _imagers.Select(_ => new List<SkyTriangle>()).ToArray();
        Grid = grid;
    }

    /// <summary>The grid drawn with the bodies; may be swapped between frames (a show fades it by its brightness).</summary>
    public SpaceGrid? Grid { get; set; }

    /// <summary>Each body as the last frame saw it, in the order given.</summary>
    public IReadOnlyList<BodyView> LastViews => _views;

    /// <summary>How each body looks from <paramref name="ship"/> (directions in the axes <paramref name="cameraToShip"/> maps from), without drawing.</summary>
    public IReadOnlyList<BodyView> Look(ShipState ship, Rotation cameraToShip)
    {
        for (int i = 0; i < _imagers.Length; i++) _views[i] = new BodyView(_imagers[i].Body, _imagers[i].Look(ship, cameraToShip));
        return _views;
    }

    /// <summary>
    /// The look rotation (look axes → ship axes) that centres the body named <paramref name="bodyName"/> where it appears
    /// from <paramref name="ship"/>, or null when no body has that name or none of its light has arrived yet.
    /// </summary>
    public Rotation? LookAt(string? bodyName, ShipState ship)
    {
        int index = Array.FindIndex(_imagers, i => string.Equals(i.Body.Name, bodyName, StringComparison.OrdinalIgnoreCase));
        if (index < 0 || _imagers[index].Look(ship, Rotation.Identity) is not { } seen) return null;
        // Keep the ship's up as the view's up where the body is not straight above or below.
        Vec3 forward = seen.Direction;
        Vec3 right = Vec3.Cross(Vec3.UnitY, forward).NormalizedOr(forward.AnyPerpendicular());
        Vec3 up = Vec3.Cross(forward, right);
        return Rotation.FromMatrix(new[,] { { right.X, up.X, forward.X }, { right.Y, up.Y, forward.Y }, { right.Z, up.Z, forward.Z } });
    }

    public void Draw(FrameContext frame) =>
        Draw(frame.Hdr, frame.Projection, frame.Observer.Ship, frame.CameraToShip, frame.Parallel);

    /// <summary>Bodies → sky triangles → surface layer over the frame → grid lines (depth-tested against the surfaces).</summary>
    public void Draw(HdrFrame hdr, Projection projection, ShipState ship, Rotation cameraToShip, ParallelOptions parallel)
    {
        SkyRasterizer rasterizer = RasterizerFor(projection);
        double pixelsPerRadian = PixelScaleMargin / Math.Sqrt(projection.ReferencePixelSolidAngle);
        // Each body is imaged by one thread into its own list; the lists are joined in body order.
        Parallel.For(0, _imagers.Length, parallel, i =>
        {
            _bodyTriangles[i].Clear();
            _views[i] = new BodyView(_imagers[i].Body, _imagers[i].Look(ship, cameraToShip));
            if (_views[i].Appearance is not null)
                _imagers[i].AppendTriangles(_bodyTriangles[i], pixelsPerRadian, projection.ReferencePixelSolidAngle);
        });
        _triangles.Clear();
        foreach (List<SkyTriangle> triangles in _bodyTriangles) _triangles.AddRange(triangles);
        rasterizer.Draw(System.Runtime.InteropServices.CollectionsMarshal.AsSpan(_triangles), parallel);
        rasterizer.CompositeOver(hdr.Red, hdr.Green, hdr.Blue);
        if (Grid is not null)
        {
            _segments.Clear();
            _gridImager.Trace(Grid, ship, cameraToShip, rasterizer.View, projection, _segments, parallel);
            LineDrawer.Draw(_segments, hdr, rasterizer, parallel);
        }
        rasterizer.Clear();
    }

    private SkyRasterizer RasterizerFor(Projection projection)
    {
        if (_rasterizer?.Projection != projection) _rasterizer = new SkyRasterizer(new PixelDirections(projection));
        return _rasterizer;
    }
}
