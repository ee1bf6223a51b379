using Lightward.Rendering.NearField;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

public class MeshShapesTests
{
    /// <summary>Volume enclosed by a closed, outward-wound mesh: the sum of signed tetrahedra from the origin (divergence theorem).</summary>
    private static double SignedVolume(TriangleMesh mesh)
    {
        double volume = 0;
        for (int t = 0; t < mesh.TriangleCount; t++)
        {
            Vec3 a = mesh.Vertices[mesh.TriangleCorners[3 * t]], b = mesh.Vertices[mesh.TriangleCorners[3 * t + 1]], c = mesh.Vertices[mesh.TriangleCorners[3 * t + 2]];
            volume += Vec3.Dot(a, Vec3.Cross(b, c)) / 6;
        }
        return volume;
    }

    /// <summary>A closed, consistently wound surface uses every directed edge exactly once and its reverse exactly once.</summary>
    private static void AssertClosedAndConsistent(TriangleMesh mesh)
    {
        var directed = new HashSet<(int, int)>();
        for (int t = 0; t < mesh.TriangleCount; t++)
            for (int k = 0; k < 3; k++)
                Assert.True(directed.Add((mesh.TriangleCorners[3 * t + k], mesh.TriangleCorners[3 * t + (k + 1) % 3])));
        foreach ((int a, int b) in directed) Assert.Contains((b, a), directed);
    }

    [Fact]
    public void SphereIsClosedOutwardAndNearlyTheVolumeOfABall()
    {
        TriangleMesh sphere = MeshShapes.Sphere(2.0, bands: 48);
        AssertClosedAndConsistent(sphere);
        Assert.Equal(4 * 48 * 48 - 4 * 48, sphere.TriangleCount);
        // Archimedes: V = 4/3 π r³; an inscribed polyhedron this fine is within 0.5 % below it.
        double ball = 4.0 / 3 * Math.PI * 8;
        Assert.InRange(SignedVolume(sphere), 0.995 * ball, ball);
        Assert.Equal(2.0, sphere.BoundingRadius, 12);
    }

    [Fact]
    public void BoxIsClosedWithTheExactVolumeAndTintedFaces()
    {
        SurfaceTint[] tints = Enumerable.Range(0, 6).Select(i => new SurfaceTint(i, 0, 0)).ToArray();
        TriangleMesh box = MeshShapes.Box(new Vec3(1, 2, 3), tints, tilesPerEdge: 3);
        AssertClosedAndConsistent(box);
        // Volume of a rectangular box = product of its edges (elementary geometry).
        Assert.Equal(6.0, SignedVolume(box), 12);
        for (int t = 0; t < box.TriangleCount; t++)
        {
            Vec3 expectedNormal = MeshShapes.BoxFaceNormals[(int)box.TriangleTints[t].R];
            Assert.Equal(1.0, Vec3.Dot(box.Normal(t), expectedNormal), 12);
        }
    }

    [Fact]
    public void HullEnclosesPositiveVolumeWithEnoughTrianglesForTheBenchmark()
    {
        TriangleMesh hull = MeshShapes.Hull(1.0);
        Assert.True(hull.TriangleCount >= 2000, $"{hull.TriangleCount} triangles");
        Assert.True(SignedVolume(hull) > 0);
        Assert.InRange(hull.BoundingRadius, 0.5, 0.6);
    }
}
