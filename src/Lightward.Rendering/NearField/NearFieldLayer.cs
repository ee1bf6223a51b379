using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>A body and how it looks this frame (null when none of its light reaches the camera yet).</summary>
public readonly record struct BodyView(NearFieldBody Body, BodyAppearance? Appearance);

/// <summary>
/// The near field as a frame layer: bodies seen at their retarded positions, drawn as opaque surfaces into buffers of
/// their own with their own depth buffer (and metered), then laid over the stars, and the grid of space drawn in front
/// of or behind them at a brightness relative to the display. The bodies and the grid are worked out side by side;
/// both are laid over the frame one row band at a time, as the renderer hands the bands out. Keeps its buffers
/// between frames (they are rebuilt only when the projection changes); the surfaces stay in them from one frame's
/// rasterising to the next.
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
    /// <summary>The bodies' triangles joined in body order (grown as needed, reused).</summary>
    private SkyTriangle[] _triangles = [];
    private readonly List<SkyTriangle>[] _bodyTriangles;
    private readonly List<PixelSegment> _segments = [];
    private readonly LineDrawer _lineDrawer = new();
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

    public void Rasterize(FrameContext frame)
    {
        Rasterize(frame.Projection, frame.Observer.Ship, frame.CameraToShip, frame.Parallel);
        _rasterizer!.AddSurfaceLevels(frame.SurfaceLevels);
    }

    public void Composite(FrameContext frame, HdrBand band) => Composite(band, frame.ExposureScale);

    /// <summary>Both passes at once, for pictures of the near field alone: bodies and grid drawn over <paramref name="hdr"/>, the grid for exposure scale <paramref name="exposureScale"/>.</summary>
    public void Draw(HdrFrame hdr, Projection projection, ShipState ship, Rotation cameraToShip, ParallelOptions parallel, float exposureScale = 1)
    {
        Rasterize(projection, ship, cameraToShip, parallel);
        Parallel.For(0, (hdr.Height + StarSplatter.BandHeight - 1) / StarSplatter.BandHeight, parallel, band =>
            Composite(new HdrBand(hdr, 0, band * StarSplatter.BandHeight, Math.Min(hdr.Height, (band + 1) * StarSplatter.BandHeight)), exposureScale));
    }

    /// <summary>
    /// Bodies → sky triangles → the surface layer's own buffers, and beside them (the two share nothing) the grid's
    /// lines → pixel segments; then the segments are sorted into row bands, knowing where the surfaces are.
    /// </summary>
    private void Rasterize(Projection projection, ShipState ship, Rotation cameraToShip, ParallelOptions parallel)
    {
        SkyRasterizer rasterizer = RasterizerFor(projection);
        _segments.Clear();
        Parallel.Invoke(parallel,
            () => DrawBodies(rasterizer, ship, cameraToShip, parallel),
            () => { if (Grid is not null) _gridImager.Trace(Grid, ship, cameraToShip, rasterizer.View, projection, _segments, parallel); });
        _lineDrawer.SortIntoBands(_segments, rasterizer);
    }

    /// <summary>Looks at every body, joins their front faces as sky triangles in body order and draws them into the surface layer.</summary>
    private void DrawBodies(SkyRasterizer rasterizer, ShipState ship, Rotation cameraToShip, ParallelOptions parallel)
    {
        Projection projection = rasterizer.Projection;
        double pixelsPerRadian = PixelScaleMargin / Math.Sqrt(projection.ReferencePixelSolidAngle);
        // Each body is imaged by one thread into its own list; the lists are joined in body order.
        Parallel.For(0, _imagers.Length, parallel, i =>
        {
            _bodyTriangles[i].Clear();
            _views[i] = new BodyView(_imagers[i].Body, _imagers[i].Look(ship, cameraToShip));
            if (_views[i].Appearance is not null)
                _imagers[i].AppendTriangles(_bodyTriangles[i], pixelsPerRadian, projection.ReferencePixelSolidAngle);
        });
        int count = _bodyTriangles.Sum(triangles => triangles.Count), joined = 0;
        if (_triangles.Length < count) _triangles = new SkyTriangle[Math.Max(count, 2 * _triangles.Length)];
        foreach (List<SkyTriangle> triangles in _bodyTriangles)
        {
            triangles.CopyTo(_triangles, joined);
            joined += triangles.Count;
        }
        rasterizer.Clear(parallel);
        rasterizer.Draw(_triangles.AsMemory(0, count), parallel);
    }

    /// <summary>Surfaces over the band, then the grid's lines (depth-tested against the surfaces), brought to the exposure.</summary>
    private void Composite(HdrBand band, float exposureScale)
    {
        _rasterizer!.CompositeOver(band);
        if (_segments.Count > 0) _lineDrawer.Draw(band, 1 / exposureScale);
    }

    private SkyRasterizer RasterizerFor(Projection projection)
    {
        if (_rasterizer?.Projection != projection) _rasterizer = new SkyRasterizer(new PixelDirections(projection));
        return _rasterizer;
    }
}
