using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests;

/// <summary>
/// The vectorised row unprojection against the projection's own double-precision inverse, and its promise that a
/// run of a row holds exactly the values of the whole row (the near field works out directions for drawn tiles only).
/// </summary>
public class ProjectionUnprojectRowTests
{
    public static TheoryData<ProjectionKind, int, int, double> Cameras => new()
    {
        { ProjectionKind.Perspective, 1920, 1080, Math.PI / 2 },
        { ProjectionKind.Domemaster, 515, 515, Math.PI },
        { ProjectionKind.Equirectangular, 722, 361, 2 * Math.PI },
    };

    [Theory]
    [MemberData(nameof(Cameras))]
    public void A_run_of_a_row_holds_the_values_of_the_whole_row(ProjectionKind kind, int width, int height, double fieldOfView)
    {
        Projection projection = new Camera(kind, width, height, fieldOfView, 0, Exposure.Manual(0)).CreateProjection();
        var whole = new float[3][];
        for (int plane = 0; plane < 3; plane++) whole[plane] = new float[width];
        foreach (int row in new[] { 0, height / 3, height - 1 })
        {
            projection.UnprojectRow(row, 0, whole[0], whole[1], whole[2]);
            // Runs of every alignment and length, including ones shorter than a vector and ones ending at the row's end.
            foreach ((int first, int length) in new[] { (0, 5), (3, 16), (7, 33), (width - 21, 21), (width / 2 - 1, 1), (1, width - 1) })
            {
                float[] x = new float[length], y = new float[length], z = new float[length];
                projection.UnprojectRow(row, first, x, y, z);
                Assert.Equal(whole[0].AsSpan(first, length).ToArray(), x);
                Assert.Equal(whole[1].AsSpan(first, length).ToArray(), y);
                Assert.Equal(whole[2].AsSpan(first, length).ToArray(), z);
            }
        }
    }

    [Theory]
    [MemberData(nameof(Cameras))]
    public void Row_directions_match_the_double_precision_inverse(ProjectionKind kind, int width, int height, double fieldOfView)
    {
        Projection projection = new Camera(kind, width, height, fieldOfView, 0, Exposure.Manual(0)).CreateProjection();
        float[] x = new float[width], y = new float[width], z = new float[width];
        foreach (int row in new[] { 0, height / 2, height - 2 })
        {
            projection.UnprojectRow(row, 0, x, y, z);
            for (int column = 0; column < width; column++)
            {
                bool shown = projection.TryUnproject(column + 0.5, row + 0.5, out Vec3 expected);
                Assert.Equal(!shown, float.IsNaN(x[column]));
                if (!shown) continue;
                // Single-precision arithmetic: a few units in the last place of a unit vector (common practice, no source).
                Assert.Equal(expected.X, x[column], 1e-5);
                Assert.Equal(expected.Y, y[column], 1e-5);
                Assert.Equal(expected.Z, z[column], 1e-5);
            }
        }
    }
}
