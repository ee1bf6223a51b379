using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>Built-in shapes, centred on the body's origin, in body axes.</summary>
public static class MeshShapes
{
    /// <summary>
    /// A latitude–longitude sphere: <paramref name="bands"/> rings from pole to pole (+Z is the pole) and
    /// 2 × bands segments around; 4·bands² − 4·bands triangles (e.g. 24 bands → 2208).
    /// </summary>
    public static TriangleMesh Sphere(double radius, int bands = 24, SurfaceTint? tint = null)
    {
        if (bands < 2) throw new ArgumentOutOfRangeException(nameof(bands), "at least 2 bands");
        int segments = 2 * bands;
        var vertices = new List<Vec3> { radius * Vec3.UnitZ };
        for (int ring = 1; ring < bands; ring++)
        {
            double polar = Math.PI * ring / bands;
            for (int segment = 0; segment < segments; segment++)
            {
                double azimuth = 2 * Math.PI * segment / segments;
                vertices.Add(radius * new Vec3(Math.Sin(polar) * Math.Cos(azimuth), Math.Sin(polar) * Math.Sin(azimuth), Math.Cos(polar)));
            }
        }
        vertices.Add(-radius * Vec3.UnitZ);
        int south = vertices.Count - 1;
        int RingVertex(int ring, int segment) => 1 + (ring - 1) * segments + segment % segments;

        var corners = new List<int>();
        for (int segment = 0; segment < segments; segment++)
        {
            corners.AddRange([0, RingVertex(1, segment), RingVertex(1, segment + 1)]);
            corners.AddRange([south, RingVertex(bands - 1, segment + 1), RingVertex(bands - 1, segment)]);
            for (int ring = 1; ring < bands - 1; ring++)
            {
                int a = RingVertex(ring, segment), b = RingVertex(ring, segment + 1), c = RingVertex(ring + 1, segment), d = RingVertex(ring + 1, segment + 1);
                corners.AddRange([a, c, d, a, d, b]);
            }
        }
        return new TriangleMesh(vertices.ToArray(), corners.ToArray(), Enumerable.Repeat(tint ?? SurfaceTint.Neutral, corners.Count / 3).ToArray());
    }

    /// <summary>The face order used by <see cref="Box"/> for its face tints.</summary>
    public static readonly Vec3[] BoxFaceNormals = [Vec3.UnitX, -Vec3.UnitX, Vec3.UnitY, -Vec3.UnitY, Vec3.UnitZ, -Vec3.UnitZ];

    /// <summary>
    /// A box with the given full edge lengths; each face is a grid of <paramref name="tilesPerEdge"/>² squares so
    /// that its image can bend smoothly. <paramref name="faceTints"/> follows <see cref="BoxFaceNormals"/> (+X, −X, +Y, −Y, +Z, −Z).
    /// </summary>
    public static TriangleMesh Box(Vec3 size, IReadOnlyList<SurfaceTint>? faceTints = null, int tilesPerEdge = 1)
    {
        if (faceTints is not null && faceTints.Count != 6) throw new ArgumentException("six face tints", nameof(faceTints));
        if (tilesPerEdge < 1) throw new ArgumentOutOfRangeException(nameof(tilesPerEdge));
        Vec3 half = 0.5 * size;
        var vertices = new List<Vec3>();
        // Faces share their edge vertices, so the surface is closed (edges meet exactly, which outlines rely on).
        var vertexAt = new Dictionary<(int, int, int), int>();
        var corners = new List<int>();
        var tints = new List<SurfaceTint>();
        for (int face = 0; face < 6; face++)
        {
            Vec3 normal = BoxFaceNormals[face];
            // Two in-face axes with u × v = normal, so the quads wind counter-clockwise seen from outside.
            Vec3 u = Math.Abs(normal.X) > 0 ? Vec3.UnitY * Math.Sign(normal.X) : Math.Abs(normal.Y) > 0 ? Vec3.UnitZ * Math.Sign(normal.Y) : Vec3.UnitX * Math.Sign(normal.Z);
            Vec3 v = Vec3.Cross(normal, u);
            Vec3 Scale(Vec3 w) => new(w.X * half.X, w.Y * half.Y, w.Z * half.Z);
            int Vertex(int i, int j)
            {
                // Keyed on whole-number lattice coordinates: the same corner computed from two faces may differ in the last bit.
                Vec3 lattice = tilesPerEdge * normal + (2 * i - tilesPerEdge) * u + (2 * j - tilesPerEdge) * v;
                var key = ((int)lattice.X, (int)lattice.Y, (int)lattice.Z);
                if (!vertexAt.TryGetValue(key, out int index))
                {
                    index = vertices.Count;
                    vertices.Add(Scale(lattice / tilesPerEdge));
                    vertexAt[key] = index;
                }
                return index;
            }
            for (int j = 0; j < tilesPerEdge; j++)
                for (int i = 0; i < tilesPerEdge; i++)
                {
                    int a = Vertex(i, j), b = Vertex(i + 1, j), c = Vertex(i, j + 1), d = Vertex(i + 1, j + 1);
                    corners.AddRange([a, b, d, a, d, c]);
                    SurfaceTint tint = faceTints?[face] ?? SurfaceTint.Neutral;
                    tints.Add(tint);
                    tints.Add(tint);
                }
        }
        return new TriangleMesh(vertices.ToArray(), corners.ToArray(), tints.ToArray());
    }

    /// <summary>
    /// Our built-in hull: a lathed spindle along +Z (nose forward) with a flared drive section and four fins,
    /// <paramref name="length"/> long overall. About 2,300 triangles at the default detail.
    /// </summary>
    public static TriangleMesh Hull(double length, int segments = 80, SurfaceTint? tint = null)
    {
        // Profile (z from stern to nose, radius), both as fractions of the length.
        (double Z, double R)[] profile =
        [
            (-0.50, 0.00), (-0.50, 0.10), (-0.46, 0.13), (-0.40, 0.12), (-0.34, 0.08), (-0.25, 0.075),
            (-0.10, 0.08), (0.05, 0.085), (0.15, 0.08), (0.25, 0.07), (0.33, 0.055), (0.40, 0.04),
            (0.45, 0.025), (0.48, 0.012), (0.50, 0.00),
        ];
        var vertices = new List<Vec3>();
        var corners = new List<int>();
        int rings = profile.Length;
        for (int ring = 0; ring < rings; ring++)
            for (int segment = 0; segment < segments; segment++)
            {
                double azimuth = 2 * Math.PI * segment / segments;
                vertices.Add(length * new Vec3(profile[ring].R * Math.Cos(azimuth), profile[ring].R * Math.Sin(azimuth), profile[ring].Z));
            }
        for (int ring = 0; ring < rings - 1; ring++)
            for (int segment = 0; segment < segments; segment++)
            {
                int a = ring * segments + segment, b = ring * segments + (segment + 1) % segments;
                int c = a + segments, d = b + segments;
                corners.AddRange([a, b, d, a, d, c]);
            }
        const int FinCount = 4;
        for (int fin = 0; fin < FinCount; fin++)
        {
            double azimuth = 2 * Math.PI * (fin + 0.5) / FinCount;
            Vec3 outward = new(Math.Cos(azimuth), Math.Sin(azimuth), 0);
            Vec3 side = Vec3.Cross(Vec3.UnitZ, outward);
            // A thin wedge: root along the drive section, tip swept back.
            Vec3[] outline = [new(0, 0.07, -0.44), new(0, 0.07, -0.20), new(0, 0.22, -0.46), new(0, 0.22, -0.52)];
            int first = vertices.Count;
            foreach (double thickness in new[] { -0.006, 0.006 })
                foreach (Vec3 p in outline)
                    vertices.Add(length * (p.Y * outward + thickness * side + p.Z * Vec3.UnitZ));
            // Outline i on the −side is first+i, on the +side first+4+i; each fin is a closed convex prism.
            int[] finCorners = [first, first + 2, first + 1, first, first + 3, first + 2, first + 4, first + 5, first + 6, first + 4, first + 6, first + 7];
            for (int edge = 0; edge < 4; edge++)
            {
                int a = first + edge, b = first + (edge + 1) % 4;
                finCorners = [.. finCorners, a, b, b + 4, a, b + 4, a + 4];
            }
            corners.AddRange(OrientOutward(vertices, finCorners));
        }
        return new TriangleMesh(vertices.ToArray(), corners.ToArray(), Enumerable.Repeat(tint ?? SurfaceTint.Neutral, corners.Count / 3).ToArray());
    }

    /// <summary>Winds each triangle of a convex piece so that its normal points away from the piece's centroid.</summary>
    private static int[] OrientOutward(List<Vec3> vertices, int[] corners)
    {
        Vec3 centroid = Vec3.Zero;
        foreach (int corner in corners) centroid += vertices[corner];
        centroid /= corners.Length;
        int[] oriented = (int[])corners.Clone();
        for (int t = 0; t < oriented.Length; t += 3)
        {
            Vec3 a = vertices[oriented[t]], b = vertices[oriented[t + 1]], c = vertices[oriented[t + 2]];
            if (Vec3.Dot(Vec3.Cross(b - a, c - a), (a + b + c) / 3 - centroid) < 0)
                (oriented[t + 1], oriented[t + 2]) = (oriented[t + 2], oriented[t + 1]);
        }
        return oriented;
    }
}
