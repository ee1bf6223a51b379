using System.Numerics;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>What the camera makes of one body this frame (for <c>observe</c>, the scope view and tests).</summary>
/// <param name="Direction">Unit direction (camera axes) toward where the body's centre appears.</param>
/// <param name="Doppler">Doppler factor of the centre's light.</param>
/// <param name="Distance">Emission-time distance of the centre in the ship's frame, light-seconds.</param>
/// <param name="AngularDiameter">Twice the largest angle between the centre's image and the image of any corner of a front face, rad.</param>
/// <param name="ApparentRotation">
/// How far the body appears turned (Terrell 1959): the angle between the direction the light left the body in its
/// rest frame and the direction it arrives from in the ship's frame, rad.
/// </param>
/// <param name="ClockReading">The body's clock (proper time plus its offset) at the emission of the centre's light, s.</param>
public readonly record struct BodyAppearance(Vec3 Direction, double Doppler, double Distance, double AngularDiameter, double ApparentRotation, double ClockReading);

/// <summary>
/// Images one body each frame. Every vertex is seen where its light left it: the body's centre is solved on the past
/// light cone of the camera event (<see cref="LightCone.Retarded"/>), and the vertices are static points of the body's
/// rest frame at that emission event, where <see cref="RestFrameSight"/> solves each in closed form. That is exact for
/// bodies in uniform motion; for accelerating or turning bodies it neglects the change of the body's velocity
/// during the light-crossing time of the body itself (terms of order |a|·R and |ω|·R, R the body's size).
/// Front faces become <see cref="SkyTriangle"/>s, split until the curved image of every side stays within half a
/// pixel of the drawn arc. A frame's work comes in steps, each split into fixed chunks of faces or points that may
/// run side by side (<see cref="Begin"/>, <see cref="FindFrontFaces"/>, <see cref="SeePoints"/>,
/// <see cref="Appearance"/>, <see cref="AppendFaces"/>); every chunk writes only its own entries, so the result
/// never depends on scheduling.
/// </summary>
public sealed class BodyImager
{
    private const int MaxSplitDepth = 6;
    /// <summary>Sides longer than this on the sky are split regardless, so depth and colour interpolate smoothly, rad.</summary>
    private const double LongestSide = 0.25;
    /// <summary>The squared chord between unit directions <see cref="LongestSide"/> apart: 4 sin²(θ/2).</summary>
    private static readonly double LongestChordSquared = 4 * Math.Pow(Math.Sin(LongestSide / 2), 2);
    /// <summary>A Doppler factor varying by more than this ratio across a triangle splits it, so the colour gradient stays smooth.</summary>
    private const double DopplerSpread = 1.1;
    /// <summary>Faces per chunk of <see cref="FindFrontFaces"/> and <see cref="AppendFaces"/>.</summary>
    private const int FacesPerChunk = 256;
    /// <summary>Vertices or edges per chunk of <see cref="SeePoints"/>.</summary>
    private const int PointsPerChunk = 1024;

    private readonly TriangleMesh _mesh;
    private readonly int[] _neighbours;
    /// <summary>Per triangle side (A→B, B→C, C→A), the index of the mesh edge it lies on; shared sides share one.</summary>
    private readonly int[] _sideEdges;
    /// <summary>Per mesh edge, its two vertices.</summary>
    private readonly int[] _edgeEnds;
    /// <summary>Per mesh edge: a side of a front face this frame (only those have their middles looked at).</summary>
    private readonly bool[] _edgeSeen;
    /// <summary>Per mesh edge, how its midpoint is seen this frame.</summary>
    private readonly PointSight[] _edgeMiddles;
    private readonly PointSight[] _sights;
    private readonly bool[] _front;
    /// <summary>Per vertex: a corner of a front face this frame (only those are looked at and shaded).</summary>
    private readonly bool[] _seen;
    private readonly Vector3[] _shades;
    private RestFrameSight _sight;
    private SurfaceShader _shader;
    /// <summary>Whether this frame's points are shaded and its sides' middles looked at, for drawing.</summary>
    private bool _drawing;
    private double _clockAtCentre;

    public BodyImager(NearFieldBody body)
    {
        Body = body;
        _mesh = body.Mesh;
        _neighbours = Neighbours(_mesh);
        _sideEdges = SideEdges(_mesh, out _edgeEnds);
        _edgeSeen = new bool[_edgeEnds.Length / 2];
        _edgeMiddles = new PointSight[_edgeEnds.Length / 2];
        _sights = new PointSight[_mesh.Vertices.Length];
        _front = new bool[_mesh.TriangleCount];
        _seen = new bool[_mesh.Vertices.Length];
        _shades = new Vector3[_mesh.Vertices.Length];
    }

    public NearFieldBody Body { get; }

    /// <summary>Whether the last <see cref="Begin"/> found light from the body reaching the camera.</summary>
    public bool IsSeen { get; private set; }

    /// <summary>Chunks of faces this body's <see cref="FindFrontFaces"/> and <see cref="AppendFaces"/> take.</summary>
    public int FaceChunkCount => (_front.Length + FacesPerChunk - 1) / FacesPerChunk;

    private int CornerChunkCount => (_seen.Length + PointsPerChunk - 1) / PointsPerChunk;

    /// <summary>Chunks of points (front faces' corners, then their sides' middles) this body's <see cref="SeePoints"/> takes.</summary>
    public int PointChunkCount => CornerChunkCount + (_edgeSeen.Length + PointsPerChunk - 1) / PointsPerChunk;

    /// <summary>
    /// Solves where every vertex is seen from <paramref name="ship"/>; null when no light from the body reaches the
    /// camera (it did not yet exist when the light would have had to leave). The steps of a frame, one after another.
    /// </summary>
    public BodyAppearance? Look(ShipState ship, Rotation cameraToShip)
    {
        if (!Begin(ship, cameraToShip, referencePixelSolidAngle: null)) return null;
        for (int chunk = 0; chunk < FaceChunkCount; chunk++) FindFrontFaces(chunk);
        for (int chunk = 0; chunk < CornerChunkCount; chunk++) SeePoints(chunk);
        return Appearance();
    }

    /// <summary>
    /// First step of a frame: puts the body's centre on the camera's past light cone; false (and <see cref="IsSeen"/>
    /// false) when no light from the body reaches the camera. With <paramref name="referencePixelSolidAngle"/> the
    /// points seen are also shaded and the sides' middles looked at, for drawing on an image with that reference pixel.
    /// </summary>
    public bool Begin(ShipState ship, Rotation cameraToShip, double? referencePixelSolidAngle)
    {
        IWorldline worldline = Body.Worldline;
        LightConeEvent centre = LightCone.Retarded(ship.Position, worldline);
        IsSeen = centre.IsMet;
        if (!IsSeen) return false;
        _clockAtCentre = worldline.ProperTimeAtHomeTime(centre.Event.T);
        _sight = RestFrameSight.Of(centre.Event, worldline.RestFrameAtHomeTime(centre.Event.T), ship, cameraToShip);
        if (referencePixelSolidAngle is { } solidAngle) _shader = SurfaceShader.OfLuminance(Body.Surface.Temperature, Body.Surface.Luminance, solidAngle);
        _drawing = referencePixelSolidAngle is not null;
        Array.Clear(_seen);
        Array.Clear(_edgeSeen);
        return true;
    }

    /// <summary>Decides which faces of chunk <paramref name="chunk"/> face the camera, marking their corners and sides.</summary>
    public void FindFrontFaces(int chunk)
    {
        Vec3[] vertices = _mesh.Vertices;
        Vec3 camera = _sight.CameraEvent.Space;
        int[] corners = _mesh.TriangleCorners;
        for (int t = chunk * FacesPerChunk; t < Math.Min(_front.Length, (chunk + 1) * FacesPerChunk); t++)
        {
            Vec3 a = vertices[corners[3 * t]], b = vertices[corners[3 * t + 1]], c = vertices[corners[3 * t + 2]];
            // Facing is decided where the light left: the ray to the camera leaves through the outward side.
            _front[t] = Vec3.Dot(Vec3.Cross(b - a, c - a), camera - a) > 0;
            if (!_front[t]) continue;
            // Faces of other chunks may mark the same corner or side: all write true, so the marks never depend on the order.
            _seen[corners[3 * t]] = _seen[corners[3 * t + 1]] = _seen[corners[3 * t + 2]] = true;
            _edgeSeen[_sideEdges[3 * t]] = _edgeSeen[_sideEdges[3 * t + 1]] = _edgeSeen[_sideEdges[3 * t + 2]] = true;
        }
    }

    /// <summary>
    /// Looks at the points of chunk <paramref name="chunk"/>: front faces' corners (only those are needed: they hold the
    /// whole picture of a closed body, outline included), shaded when drawing, then the middles of their sides.
    /// </summary>
    public void SeePoints(int chunk)
    {
        Vec3[] vertices = _mesh.Vertices;
        if (chunk < CornerChunkCount)
        {
            for (int i = chunk * PointsPerChunk; i < Math.Min(_seen.Length, (chunk + 1) * PointsPerChunk); i++)
            {
                if (!_seen[i]) continue;
                _sights[i] = _sight.See(vertices[i]);
                if (_drawing) _shades[i] = _shader.Shade(_sights[i].Doppler);
            }
            return;
        }
        chunk -= CornerChunkCount;
        for (int edge = chunk * PointsPerChunk; edge < Math.Min(_edgeSeen.Length, (chunk + 1) * PointsPerChunk); edge++)
            if (_edgeSeen[edge]) _edgeMiddles[edge] = _sight.See((vertices[_edgeEnds[2 * edge]] + vertices[_edgeEnds[2 * edge + 1]]) / 2);
    }

    /// <summary>How the body looks, once its front faces' corners are seen.</summary>
    public BodyAppearance Appearance()
    {
        PointSight middle = _sight.See(Vec3.Zero);
        // The widest angle from the centre's image, found as the longest chord: θ = 2 asin(chord / 2).
        double longestChordSquared = 0;
        for (int i = 0; i < _seen.Length; i++)
            if (_seen[i]) longestChordSquared = Math.Max(longestChordSquared, (_sights[i].Direction - middle.Direction).LengthSquared);
        double radius = 2 * Math.Asin(Math.Min(1, Math.Sqrt(longestChordSquared) / 2));
        Vec3 restDirection = (-_sight.CameraEvent.Space).NormalizedOr(Vec3.UnitZ);
        double rotation = Vec3.AngleBetween(restDirection, Optics.Aberration.Apparent(restDirection, _sight.ShipVelocityInFrame));
        return new BodyAppearance(middle.Direction, middle.Doppler, middle.Distance, 2 * radius, rotation, _clockAtCentre + Body.ClockOffset + middle.EmissionTime);
    }

    /// <summary>
    /// Appends the front faces of chunk <paramref name="chunk"/>, as seen by the frame's steps so far (begun for
    /// drawing), as sky triangles for an image with <paramref name="pixelsPerRadian"/> (the finest scale anywhere on it).
    /// </summary>
    public void AppendFaces(int chunk, List<SkyTriangle> output, double pixelsPerRadian)
    {
        Vec3[] vertices = _mesh.Vertices;
        int[] corners = _mesh.TriangleCorners;
        BodySurface surface = Body.Surface;
        for (int t = chunk * FacesPerChunk; t < Math.Min(_front.Length, (chunk + 1) * FacesPerChunk); t++)
        {
            if (!_front[t]) continue;
            SurfaceTint tint = _mesh.TriangleTints[t];
            double facing = surface.Kind == SurfaceKind.Lit ? Math.Max(0, Vec3.Dot(_mesh.Normal(t), surface.TowardLight)) : 1;
            Vector3 faceTint = (float)facing * new Vector3(tint.R, tint.G, tint.B);
            byte outline = 0;
            for (int side = 0; side < 3; side++)
            {
                int neighbour = _neighbours[3 * t + side];
                if (neighbour < 0 || !_front[neighbour]) outline |= (byte)(1 << side);
            }
            int ia = corners[3 * t], ib = corners[3 * t + 1], ic = corners[3 * t + 2];
            var piece = new Piece(new Corner(vertices[ia], _sights[ia], _shades[ia]), new Corner(vertices[ib], _sights[ib], _shades[ib]),
                new Corner(vertices[ic], _sights[ic], _shades[ic]));
            Emit(output, piece, _edgeMiddles[_sideEdges[3 * t]], _edgeMiddles[_sideEdges[3 * t + 1]], _edgeMiddles[_sideEdges[3 * t + 2]],
                faceTint, outline, pixelsPerRadian, 0);
        }
    }

    /// <summary>A corner of a piece of a face: body-frame point, how it is seen, and its shade for unit tint.</summary>
    private readonly record struct Corner(Vec3 Point, PointSight Seen, Vector3 Shade);

    private readonly record struct Piece(Corner A, Corner B, Corner C);

    /// <summary>Emits a piece, split into four while a side's image strays from its arc (its sides' middles seen as given).</summary>
    private void Emit(List<SkyTriangle> output, in Piece p, in PointSight seenAB, in PointSight seenBC, in PointSight seenCA, Vector3 faceTint, byte outline, double pixelsPerRadian, int depth)
    {
        if (depth < MaxSplitDepth
            && (NeedsSplit(p.A.Seen, p.B.Seen, seenAB, pixelsPerRadian) || NeedsSplit(p.B.Seen, p.C.Seen, seenBC, pixelsPerRadian)
                || NeedsSplit(p.C.Seen, p.A.Seen, seenCA, pixelsPerRadian)))
        {
            var ab = new Corner((p.A.Point + p.B.Point) / 2, seenAB, _shader.Shade(seenAB.Doppler));
            var bc = new Corner((p.B.Point + p.C.Point) / 2, seenBC, _shader.Shade(seenBC.Doppler));
            var ca = new Corner((p.C.Point + p.A.Point) / 2, seenCA, _shader.Shade(seenCA.Doppler));
            // Corner pieces keep the outline bits of the two original sides they lie on; the middle piece has none.
            EmitPiece(output, new Piece(p.A, ab, ca), faceTint, (byte)(outline & 0b101), pixelsPerRadian, depth + 1);
            EmitPiece(output, new Piece(ab, p.B, bc), faceTint, (byte)(outline & 0b011), pixelsPerRadian, depth + 1);
            EmitPiece(output, new Piece(ca, bc, p.C), faceTint, (byte)(outline & 0b110), pixelsPerRadian, depth + 1);
            EmitPiece(output, new Piece(ab, bc, ca), faceTint, 0, pixelsPerRadian, depth + 1);
            return;
        }
        output.Add(new SkyTriangle
        {
            DirectionA = ToVector3(p.A.Seen.Direction), DirectionB = ToVector3(p.B.Seen.Direction), DirectionC = ToVector3(p.C.Seen.Direction),
            DepthA = (float)p.A.Seen.Distance, DepthB = (float)p.B.Seen.Distance, DepthC = (float)p.C.Seen.Distance,
            ColourA = faceTint * p.A.Shade, ColourB = faceTint * p.B.Shade, ColourC = faceTint * p.C.Shade,
            OutlineSides = outline,
        });
    }

    /// <summary>A side must be split when its midpoint's image strays half a pixel off the great-circle arc, the arc is long, or D varies much.</summary>
    private static bool NeedsSplit(in PointSight from, in PointSight to, in PointSight middle, double pixelsPerRadian)
    {
        if ((from.Direction - to.Direction).LengthSquared > LongestChordSquared) return true;
        Vec3 plane = Vec3.Cross(from.Direction, to.Direction);
        double spread = from.Doppler > to.Doppler ? from.Doppler / to.Doppler : to.Doppler / from.Doppler;
        if (spread > DopplerSpread) return true;
        double planeLength = plane.Length;
        return planeLength > 0 && Math.Abs(Vec3.Dot(middle.Direction, plane)) / planeLength * pixelsPerRadian > 0.5;
    }

    /// <summary>A piece made by a split: its sides' middles are its own, looked at here (none when it can split no further).</summary>
    private void EmitPiece(List<SkyTriangle> output, in Piece p, Vector3 faceTint, byte outline, double pixelsPerRadian, int depth)
    {
        if (depth >= MaxSplitDepth)
        {
            Emit(output, p, default, default, default, faceTint, outline, pixelsPerRadian, depth);
            return;
        }
        Emit(output, p, _sight.See((p.A.Point + p.B.Point) / 2), _sight.See((p.B.Point + p.C.Point) / 2), _sight.See((p.C.Point + p.A.Point) / 2),
            faceTint, outline, pixelsPerRadian, depth);
    }

    private static Vector3 ToVector3(Vec3 v) => new((float)v.X, (float)v.Y, (float)v.Z);

    /// <summary>Numbers the mesh's edges (a side shared by two faces is one edge), gives each triangle side its edge and each edge its two vertices.</summary>
    private static int[] SideEdges(TriangleMesh mesh, out int[] edgeEnds)
    {
        int[] corners = mesh.TriangleCorners;
        var edgeOf = new Dictionary<(int, int), int>(corners.Length);
        var sideEdges = new int[corners.Length];
        var ends = new List<int>(corners.Length);
        for (int k = 0; k < corners.Length; k++)
        {
            int from = corners[k], to = corners[k - k % 3 + (k % 3 + 1) % 3];
            (int, int) key = from < to ? (from, to) : (to, from);
            if (!edgeOf.TryGetValue(key, out int edge))
            {
                edgeOf.Add(key, edge = edgeOf.Count);
                ends.Add(from);
                ends.Add(to);
            }
            sideEdges[k] = edge;
        }
        edgeEnds = ends.ToArray();
        return sideEdges;
    }

    /// <summary>For each triangle side (A→B, B→C, C→A) the triangle across it, or −1 on an open border.</summary>
    private static int[] Neighbours(TriangleMesh mesh)
    {
        int[] corners = mesh.TriangleCorners;
        var sideOwner = new Dictionary<(int, int), int>(corners.Length);
        for (int t = 0; t < mesh.TriangleCount; t++)
            for (int side = 0; side < 3; side++)
                sideOwner.TryAdd((corners[3 * t + side], corners[3 * t + (side + 1) % 3]), t);
        var neighbours = new int[corners.Length];
        for (int t = 0; t < mesh.TriangleCount; t++)
            for (int side = 0; side < 3; side++)
                neighbours[3 * t + side] = sideOwner.TryGetValue((corners[3 * t + (side + 1) % 3], corners[3 * t + side]), out int other) ? other : -1;
        return neighbours;
    }
}
