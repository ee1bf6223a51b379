using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests;

/// <summary>
/// The perspective projection's edge planes (which let the sky pass skip cells off a flat screen) bound exactly the
/// directions its star projection keeps: the gnomonic mapping x = cx + f·dx/dz (Snyder, "Map Projections — A Working
/// Manual", USGS PP 1395, §22) sends each plane through the eye and an edge of the margin to that edge's line.
/// </summary>
public class ProjectionEdgePlaneTests
{
    [Theory]
    [InlineData(1920, 1080, 90)]
    [InlineData(300, 800, 30)]
    [InlineData(640, 480, 150)]
    public void Every_kept_direction_lies_inside_the_edge_planes_and_every_direction_well_inside_is_kept(int width, int height, double fieldDegrees)
    {
        var projection = new PerspectiveProjection(width, height, fieldDegrees * Math.PI / 180);
        Vec3[] planes = projection.EdgePlanes.ToArray();
        Assert.Equal(4, planes.Length);
        var random = new Random(11);
        const int Count = 20_000;
        float[] dx = new float[Count], dy = new float[Count], dz = new float[Count], x = new float[Count], y = new float[Count], scale = new float[Count];
        for (int i = 0; i < Count; i++)
        {
            // Directions spread over the front hemisphere and a little behind, denser toward the view axis.
            var d = new Vec3(random.NextDouble() * 2 - 1, random.NextDouble() * 2 - 1, random.NextDouble() * 1.2 - 0.2).NormalizedOr(Vec3.UnitZ);
            (dx[i], dy[i], dz[i]) = ((float)d.X, (float)d.Y, (float)d.Z);
        }
        projection.ProjectDirections(dx, dy, dz, x, y, scale);
        int kept = 0;
        for (int i = 0; i < Count; i++)
        {
            var d = new Vec3(dx[i], dy[i], dz[i]);
            double nearest = planes.Min(n => Vec3.Dot(d, n));
            if (!float.IsNaN(x[i]))
            {
                kept++;
                Assert.True(nearest >= -1e-5, $"direction {d} kept at ({x[i]}, {y[i]}) lies {nearest} outside an edge plane");
            }
            else Assert.True(nearest <= 1e-5, $"direction {d}, {nearest} inside every edge plane, was not kept");
        }
        Assert.InRange(kept, Count / 20, Count);
    }
}
