using Lightward.Rendering.NearField;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

public class WavefrontObjTests
{
    // Wavefront OBJ format as specified in the Wavefront Advanced Visualizer manual, Appendix B1 (indices are 1-based,
    // negative indices count back from the latest element).
    private const string CubeWithQuads = """
        # unit cube
        o cube
        v 0 0 0
        v 1 0 0
        v 1 1 0
        v 0 1 0
        v 0 0 1
        v 1 0 1
        v 1 1 1
        v 0 1 1
        vt 0 0
        vn 0 0 -1
        usemtl hullplate
        f 1/1/1 4/1/1 3/1/1 2/1/1
        f 5 6 7 8
        f 1//1 2//1 6//1 5//1
        f 2 3 7 6
        f 3 4 8 7
        f -4 -8 -5 -1
        """;

    [Fact]
    public void QuadsBecomeTwoTrianglesEachAndNegativeIndicesCountBack()
    {
        TriangleMesh cube = WavefrontObj.Parse(CubeWithQuads, "cube.obj", lengthPerUnit: 2.0);
        Assert.Equal(12, cube.TriangleCount);
        Assert.Equal(new Vec3(2, 2, 2), cube.Vertices[6]);
        // The last face "-4 -8 -5 -1" is vertices 5 1 4 8 (the x = 0 side).
        Assert.Equal([4, 0, 3, 4, 3, 7], cube.TriangleCorners[^6..]);
        foreach (int t in Enumerable.Range(0, 12)) Assert.Equal(1.0, cube.Normal(t).Length, 12);
    }

    [Theory]
    [InlineData("v 0 0\nf 1 1 1", "model.obj:1:6: missing z")]
    [InlineData("v 0 0 0\nv 1 0 0\nf 1 2", "model.obj:3:1: a face needs at least 3 corners, found 2")]
    [InlineData("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 4", "model.obj:4:7: vertex index 4 refers to none of the 3 vertexs")]
    [InlineData("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 -4", "model.obj:4:7: vertex index -4")]
    [InlineData("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1/1 2 3", "model.obj:4:3: texture coordinate index 1 refers to none of the 0")]
    [InlineData("v 0 0 zero", "model.obj:1:7: z 'zero' is not a finite decimal number")]
    [InlineData("v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 x", "model.obj:4:7: 'x' is not a vertex index")]
    [InlineData("curv 0 1 2", "model.obj:1:1: unknown statement 'curv'")]
    [InlineData("# nothing\nv 1 2 3", "model.obj: no faces found")]
    public void MalformedFilesNameFileLineColumnAndTheProblem(string text, string expectedStart)
    {
        var error = Assert.ThrowsAny<UserInputException>(() => WavefrontObj.Parse(text, "model.obj", 1));
        Assert.StartsWith(expectedStart, error.Message);
    }

    [Fact]
    public void MissingFileIsAUserError()
    {
        var error = Assert.ThrowsAny<UserInputException>(() => WavefrontObj.Load("/nonexistent/hull.obj", 1));
        Assert.StartsWith("/nonexistent/hull.obj: cannot read", error.Message);
    }
}
