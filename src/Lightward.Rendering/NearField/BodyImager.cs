using System.Numerics;
using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>What the camera makes of one body this frame (for <c>observe</c>, the scope view and tests).</summary>
/// <param name="Direction">Unit direction (camera axes) toward where the body's centre appears.</param>
/// <param name="Doppler">Doppler factor of the centre's light.</param>
/// <param name="Distance">Emission-time distance of the centre in the ship's frame, light-seconds.</param>
/// <param name="AngularDiameter">Twice the largest angle between the centre's image and any vertex's image, rad.</param>
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
/// pixel of the drawn arc.
/// </summary>
public sealed class BodyImager
{
    private const int MaxSplitDepth = 6;
    /// <summary>Sides longer than this on the sky are split regardless, so depth and colour interpolate smoothly, rad.</summary>
    private const double LongestSide = 0.25;
    /// <summary>A Doppler factor varying by more than this ratio across a triangle splits it, so the colour gradient stays smooth.</summary>
    private const double DopplerSpread = 1.1;

    private readonly TriangleMesh _mesh;
    private readonly int[] _neighbours;
    private readonly PointSight[] _sights;
    private readonly bool[] _front;
    private RestFrameSight _sight;
    private SurfaceShader _shader;

    public BodyImager(NearFieldBody body)
    {
        Body = body;
        _mesh = body.Mesh;
        _neighbours = Neighbours(_mesh);
        _sights = new PointSight[_mesh.Vertices.Length];
        _front = new bool[_mesh.TriangleCount];
    }

    public NearFieldBody Body { get; }

    /// <summary>
    /// Solves where every vertex is seen from <paramref name="ship"/>; null when no light from the body reaches the
    /// camera (it did not yet exist when the light would have had to leave).
    /// </summary>
    public BodyAppearance? Look(ShipState ship, Rotation cameraToShip)
    {
        IWorldline worldline = Body.Worldline;
        LightConeEvent centre = LightCone.Retarded(ship.Position, worldline);
        if (!centre.IsMet) return null;
        LorentzFrame restFrame = worldline.RestFrameAtHomeTime(centre.Event.T);
        double clockAtCentre = worldline.ProperTimeAtHomeTime(centre.Event.T);
        _sight = RestFrameSight.Of(centre.Event, restFrame, ship, cameraToShip);

        Vec3[] vertices = _mesh.Vertices;
        for (int i = 0; i < vertices.Length; i++) _sights[i] = _sight.See(vertices[i]);
        Vec3 camera = _sight.CameraEvent.Space;
        int[] corners = _mesh.TriangleCorners;
        for (int t = 0; t < _front.Length; t++)
        {
            Vec3 a = vertices[corners[3 * t]], b = vertices[corners[3 * t + 1]], c = vertices[corners[3 * t + 2]];
            // Facing is decided where the light left: the ray to the camera leaves through the outward side.
            _front[t] = Vec3.Dot(Vec3.Cross(b - a, c - a), camera - a) > 0;
        }

        PointSight middle = _sight.See(Vec3.Zero);
        double radius = 0;
        foreach (PointSight s in _sights) radius = Math.Max(radius, Vec3.AngleBetween(s.Direction, middle.Direction));
        Vec3 restDirection = (-camera).NormalizedOr(Vec3.UnitZ);
        double rotation = Vec3.AngleBetween(restDirection, Optics.Aberration.Apparent(restDirection, _sight.ShipVelocityInFrame));
        return new BodyAppearance(middle.Direction, middle.Doppler, middle.Distance, 2 * radius, rotation, clockAtCentre + Body.ClockOffset + middle.EmissionTime);
    }

    /// <summary>
    /// Appends the front faces seen by the last successful <see cref="Look"/> as sky triangles for an image with
    /// <paramref name="pixelsPerRadian"/> (the finest scale anywhere on it) and reference pixel solid angle <paramref name="referencePixelSolidAngle"/>.
    /// </summary>
    public void AppendTriangles(List<SkyTriangle> output, double pixelsPerRadian, double referencePixelSolidAngle)
    {
        _shader = SurfaceShader.OfLuminance(Body.Surface.Temperature, Body.Surface.Luminance, referencePixelSolidAngle);
        Vec3[] vertices = _mesh.Vertices;
        int[] corners = _mesh.TriangleCorners;
        BodySurface surface = Body.Surface;
        for (int t = 0; t < _front.Length; t++)
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
            var piece = new Piece(vertices[ia], vertices[ib], vertices[ic], _sights[ia], _sights[ib], _sights[ic]);
            Emit(output, piece, faceTint, outline, pixelsPerRadian, 0);
        }
    }

    private readonly record struct Piece(Vec3 A, Vec3 B, Vec3 C, PointSight SeenA, PointSight SeenB, PointSight SeenC);

    private void Emit(List<SkyTriangle> output, in Piece p, Vector3 faceTint, byte outline, double pixelsPerRadian, int depth)
    {
        if (depth < MaxSplitDepth)
        {
            Vec3 ab = (p.A + p.B) / 2, bc = (p.B + p.C) / 2, ca = (p.C + p.A) / 2;
            PointSight seenAB = _sight.See(ab), seenBC = _sight.See(bc), seenCA = _sight.See(ca);
            if (NeedsSplit(p.SeenA, p.SeenB, seenAB, pixelsPerRadian) || NeedsSplit(p.SeenB, p.SeenC, seenBC, pixelsPerRadian)
                || NeedsSplit(p.SeenC, p.SeenA, seenCA, pixelsPerRadian))
            {
                // Corner pieces keep the outline bits of the two original sides they lie on; the middle piece has none.
                Emit(output, new Piece(p.A, ab, ca, p.SeenA, seenAB, seenCA), faceTint, (byte)(outline & 0b101), pixelsPerRadian, depth + 1);
                Emit(output, new Piece(ab, p.B, bc, seenAB, p.SeenB, seenBC), faceTint, (byte)(outline & 0b011), pixelsPerRadian, depth + 1);
                Emit(output, new Piece(ca, bc, p.C, seenCA, seenBC, p.SeenC), faceTint, (byte)(outline & 0b110), pixelsPerRadian, depth + 1);
                Emit(output, new Piece(ab, bc, ca, seenAB, seenBC, seenCA), faceTint, 0, pixelsPerRadian, depth + 1);
                return;
            }
        }
        output.Add(new SkyTriangle
        {
            DirectionA = ToVector3(p.SeenA.Direction), DirectionB = ToVector3(p.SeenB.Direction), DirectionC = ToVector3(p.SeenC.Direction),
            DepthA = (float)p.SeenA.Distance, DepthB = (float)p.SeenB.Distance, DepthC = (float)p.SeenC.Distance,
            ColourA = faceTint * _shader.Shade(p.SeenA.Doppler), ColourB = faceTint * _shader.Shade(p.SeenB.Doppler), ColourC = faceTint * _shader.Shade(p.SeenC.Doppler),
            OutlineSides = outline,
        });
    }

    /// <summary>A side must be split when its midpoint's image strays half a pixel off the great-circle arc, the arc is long, or D varies much.</summary>
    private static bool NeedsSplit(PointSight from, PointSight to, PointSight middle, double pixelsPerRadian)
    {
        Vec3 plane = Vec3.Cross(from.Direction, to.Direction);
        double length = Vec3.AngleBetween(from.Direction, to.Direction);
        if (length > LongestSide) return true;
        double spread = from.Doppler > to.Doppler ? from.Doppler / to.Doppler : to.Doppler / from.Doppler;
        if (spread > DopplerSpread) return true;
        double planeLength = plane.Length;
        return planeLength > 0 && Math.Abs(Vec3.Dot(middle.Direction, plane)) / planeLength * pixelsPerRadian > 0.5;
    }

    private static Vector3 ToVector3(Vec3 v) => new((float)v.X, (float)v.Y, (float)v.Z);

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
