using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>A linear-RGB multiplier for a surface (emission or reflectance per channel, 1 = neutral).</summary>
public readonly record struct SurfaceTint(float R, float G, float B)
{
    public static readonly SurfaceTint Neutral = new(1, 1, 1);
}

/// <summary>
/// A closed or open triangle mesh in a body's own rest frame (light-seconds, body axes). Triangles wind
/// counter-clockwise when seen from outside, so that their normals (right-hand rule) point outward.
/// </summary>
public sealed class TriangleMesh
{
    public TriangleMesh(Vec3[] vertices, int[] triangleCorners, SurfaceTint[] triangleTints)
    {
        if (triangleCorners.Length % 3 != 0) throw new ArgumentException("corner count must be a multiple of 3", nameof(triangleCorners));
        if (triangleTints.Length != triangleCorners.Length / 3) throw new ArgumentException("one tint per triangle", nameof(triangleTints));
        foreach (int corner in triangleCorners)
            if ((uint)corner >= (uint)vertices.Length) throw new ArgumentOutOfRangeException(nameof(triangleCorners), $"corner {corner} outside 0..{vertices.Length - 1}");
        Vertices = vertices;
        TriangleCorners = triangleCorners;
        TriangleTints = triangleTints;
    }

    public Vec3[] Vertices { get; }
    /// <summary>Three vertex indices per triangle.</summary>
    public int[] TriangleCorners { get; }
    public SurfaceTint[] TriangleTints { get; }
    public int TriangleCount => TriangleCorners.Length / 3;

    /// <summary>Outward unit normal of triangle <paramref name="triangle"/> (zero for a degenerate one).</summary>
    public Vec3 Normal(int triangle)
    {
        Vec3 a = Vertices[TriangleCorners[3 * triangle]], b = Vertices[TriangleCorners[3 * triangle + 1]], c = Vertices[TriangleCorners[3 * triangle + 2]];
        return Vec3.Cross(b - a, c - a).NormalizedOr(Vec3.Zero);
    }

    /// <summary>Radius of the smallest origin-centred sphere holding every vertex.</summary>
    public double BoundingRadius => Vertices.Length == 0 ? 0 : Vertices.Max(v => v.Length);

    /// <summary>The same mesh with every vertex multiplied by <paramref name="factor"/> (e.g. to set a size in light-seconds).</summary>
    public TriangleMesh Scaled(double factor) => new(Vertices.Select(v => factor * v).ToArray(), TriangleCorners, TriangleTints);

    /// <summary>The same mesh with one tint on every triangle.</summary>
    public TriangleMesh Tinted(SurfaceTint tint) => new(Vertices, TriangleCorners, Enumerable.Repeat(tint, TriangleCount).ToArray());
}
