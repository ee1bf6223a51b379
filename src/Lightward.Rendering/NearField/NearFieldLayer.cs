using System.Runtime.InteropServices;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>A body and how it looks this frame (null when none of its light reaches the camera yet).</summary>
public readonly record struct BodyView(NearFieldBody Body, BodyAppearance? Appearance);

/// <summary>
/// The near field as a frame layer: bodies seen at their retarded positions, drawn as opaque surfaces into buffers of
/// their own with their own depth buffer (and metered), then laid over the stars, and the grid of space drawn in front
/// of or behind them at a brightness relative to the display, as a guide laid over the tone-mapped picture. The bodies and then the grid are worked out in steps
/// that each spread over the threads; both are laid over the frame one row band at a time, as the renderer hands the
/// bands out. Keeps its buffers between frames (they are rebuilt only when the projection changes); the surfaces stay
/// in them from one frame's rasterising to the next.
/// </summary>
public sealed class NearFieldLayer : IFrameLayer
{
    /// <summary>
    /// Margin on the projection's reference pixel scale for the split test: pixels away from the reference point
    /// (toward the edge of a wide flat screen) are smaller in angle.
    /// </summary>
    private const double PixelScaleMargin = 1.5;

    private readonly BodyImager[] _imagers;
    /// <summary>Every body's chunks of faces, in body order, and the triangles each chunk gave this frame.</summary>
    private readonly (int Body, int Chunk)[] _faceChunks;
    private readonly List<SkyTriangle>[] _chunkTriangles;
    /// <summary>Every body's chunks of points, in body order.</summary>
    private readonly (int Body, int Chunk)[] _pointChunks;
    private readonly GridImager _gridImager = new();
    private readonly List<PixelSegment> _segments = [];
    private readonly LineDrawer _lineDrawer = new();
    private readonly BodyView[] _views;
    private SkyRasterizer? _rasterizer;

    public NearFieldLayer(IEnumerable<NearFieldBody> bodies, SpaceGrid? grid)
    {
        _imagers = bodies.Select(b => new BodyImager(b)).ToArray();
        _views = _imagers.Select(i => new BodyView(i.Body, null)).ToArray();
        _faceChunks = _imagers.SelectMany((imager, body) => Enumerable.Range(0, imager.FaceChunkCount).Select(chunk => (body, chunk))).ToArray();
        _chunkTriangles = _faceChunks.Select(_ => new List<SkyTriangle>()).ToArray();
        _pointChunks = _imagers.SelectMany((imager, body) => Enumerable.Range(0, imager.PointChunkCount).Select(chunk => (body, chunk))).ToArray();
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

    public void Composite(FrameContext frame, HdrBand band) => Composite(band);

    /// <summary>
    /// Both passes at once, for pictures of the near field alone: bodies drawn over <paramref name="hdr"/> and the grid
    /// into <paramref name="guides"/> (display codes, of the same size), where the tone map would lay it over them.
    /// </summary>
    public void Draw(HdrFrame hdr, DisplayOverlay guides, Projection projection, ShipState ship, Rotation cameraToShip, ParallelOptions parallel)
    {
        Rasterize(projection, ship, cameraToShip, parallel);
        ParallelItems.For(0, (hdr.Height + StarSplatter.BandHeight - 1) / StarSplatter.BandHeight, parallel, band =>
            Composite(new HdrBand(hdr, 0, band * StarSplatter.BandHeight, Math.Min(hdr.Height, (band + 1) * StarSplatter.BandHeight), guides, 0)));
    }

    /// <summary>
    /// Bodies → sky triangles → the surface layer's own buffers, then the grid's lines → pixel segments sorted into
    /// row bands; the lines learn where the surfaces are when they are drawn. One after the other, each spreading its
    /// own work over the threads: run side by side, each one's parallel loops ended up waiting on the other's.
    /// </summary>
    private void Rasterize(Projection projection, ShipState ship, Rotation cameraToShip, ParallelOptions parallel)
    {
        SkyRasterizer rasterizer = RasterizerFor(projection);
        DrawBodies(rasterizer, ship, cameraToShip, parallel);
        TraceGrid(rasterizer, ship, cameraToShip, parallel);
    }

    private void TraceGrid(SkyRasterizer rasterizer, ShipState ship, Rotation cameraToShip, ParallelOptions parallel)
    {
        _segments.Clear();
        if (Grid is not null) _gridImager.Trace(Grid, ship, cameraToShip, rasterizer.View, rasterizer.Projection, _segments, parallel);
        _lineDrawer.SortIntoBands(_segments, rasterizer, parallel);
    }

    /// <summary>
    /// Looks at every body and draws their front faces as sky triangles into the surface layer, in body order. Each
    /// step is split into fixed chunks of every body's faces or points, worked on side by side, so that the threads
    /// stay busy however many bodies there are; each face chunk's triangles are prepared for the layer as they come.
    /// </summary>
    private void DrawBodies(SkyRasterizer rasterizer, ShipState ship, Rotation cameraToShip, ParallelOptions parallel)
    {
        Projection projection = rasterizer.Projection;
        double pixelsPerRadian = PixelScaleMargin / Math.Sqrt(projection.ReferencePixelSolidAngle);
        foreach (BodyImager imager in _imagers) imager.Begin(ship, cameraToShip, projection.ReferencePixelSolidAngle);
        ParallelItems.For(0, _faceChunks.Length, parallel, k =>
        {
            (int body, int chunk) = _faceChunks[k];
            if (_imagers[body].IsSeen) _imagers[body].FindFrontFaces(chunk);
        });
        ParallelItems.For(0, _pointChunks.Length, parallel, k =>
        {
            (int body, int chunk) = _pointChunks[k];
            if (_imagers[body].IsSeen) _imagers[body].SeePoints(chunk);
        });
        for (int i = 0; i < _imagers.Length; i++) _views[i] = new BodyView(_imagers[i].Body, _imagers[i].IsSeen ? _imagers[i].Appearance() : null);
        rasterizer.Clear();
        rasterizer.BeginParts(_faceChunks.Length);
        ParallelItems.For(0, _faceChunks.Length, parallel, k =>
        {
            (int body, int chunk) = _faceChunks[k];
            List<SkyTriangle> triangles = _chunkTriangles[k];
            triangles.Clear();
            if (_imagers[body].IsSeen) _imagers[body].AppendFaces(chunk, triangles, pixelsPerRadian);
            rasterizer.PreparePart(k, CollectionsMarshal.AsSpan(triangles));
        });
        rasterizer.FillParts(parallel);
    }

    /// <summary>Surfaces over the band, then the grid's lines (depth-tested against the surfaces) into its overlay.</summary>
    private void Composite(HdrBand band)
    {
        _rasterizer!.CompositeOver(band);
        if (_segments.Count > 0) _lineDrawer.Draw(band);
    }

    private SkyRasterizer RasterizerFor(Projection projection)
    {
        if (_rasterizer?.Projection != projection) _rasterizer = new SkyRasterizer(new ImageSky(projection));
        return _rasterizer;
    }
}
