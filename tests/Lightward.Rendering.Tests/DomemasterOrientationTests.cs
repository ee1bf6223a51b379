using Lightward.Spacetime;

namespace Lightward.Rendering.Tests;

/// <summary>
/// Fulldome orientation: the dome master's centre is the zenith and the front of the audience (here the ship's
/// nose) is at the bottom edge of the image, on the rim of a 180° disc, 90° from the zenith (common fulldome
/// practice, e.g. the domemaster format described by Paul Bourke, "Fisheye/domemaster images", paulbourke.net; from memory).
/// </summary>
public class DomemasterOrientationTests
{
    private const int Size = 400;
    private static readonly Camera Dome = new(ProjectionKind.Domemaster, Size, Size, Math.PI, 0, Exposure.Manual(2));

    private static (double X, double Y) Where(Vec3 direction, Camera camera)
    {
        (double x, double y, _) = RenderHarness.Centroid(new FrameRenderer(1).Render(RenderHarness.OneStar(direction), RenderHarness.AtRest(), camera));
        return (x, y);
    }

    [Fact]
    public void Ship_up_is_the_zenith_at_the_centre()
    {
        (double x, double y) = Where(new Vec3(0, 1, 0), Dome);
        Assert.InRange(x, Size / 2.0 - 1, Size / 2.0 + 1);
        Assert.InRange(y, Size / 2.0 - 1, Size / 2.0 + 1);
    }

    [Fact]
    public void The_nose_is_at_the_bottom_edge_just_inside_the_rim()
    {
        // 89° from the zenith: 1° inside the rim, so the whole splat stays on the disc.
        (double x, double y) = Where(new Vec3(0, Math.Sin(Math.PI / 180), Math.Cos(Math.PI / 180)), Dome);
        Assert.InRange(x, Size / 2.0 - 1, Size / 2.0 + 1);
        Assert.InRange(y, Size / 2.0 + 89 / 90.0 * Size / 2 - 1, Size / 2.0 + 89 / 90.0 * Size / 2 + 1);
    }

    [Fact]
    public void Right_of_the_ship_is_on_the_right_and_aft_at_the_top()
    {
        double rim = 89 / 90.0 * Size / 2, lift = Math.Sin(Math.PI / 180), level = Math.Cos(Math.PI / 180);
        (double rightX, double rightY) = Where(new Vec3(level, lift, 0), Dome);
        Assert.InRange(rightX, Size / 2.0 + rim - 1, Size / 2.0 + rim + 1);
        Assert.InRange(rightY, Size / 2.0 - 1, Size / 2.0 + 1);
        (double aftX, double aftY) = Where(new Vec3(0, lift, -level), Dome);
        Assert.InRange(aftX, Size / 2.0 - 1, Size / 2.0 + 1);
        Assert.InRange(aftY, Size / 2.0 - rim - 1, Size / 2.0 - rim + 1);
    }

    [Fact]
    public void Directions_90_degrees_from_the_zenith_lie_on_the_rim()
    {
        var projection = Dome.CreateProjection();
        for (int degrees = 0; degrees < 360; degrees += 15)
        {
            double a = degrees * Math.PI / 180;
            // A unit vector 90° from the camera's +Z (the zenith) in any azimuth.
            // The rim itself may fall on the image's far edge (x = Size), so only the position is checked, not visibility.
            _ = projection.TryProject(new Vec3(Math.Cos(a), Math.Sin(a), 0), out double x, out double y);
            Assert.Equal(Size / 2.0, Math.Sqrt((x - Size / 2.0) * (x - Size / 2.0) + (y - Size / 2.0) * (y - Size / 2.0)), 1e-9);
        }
    }

    [Fact]
    public void Tilting_the_dome_moves_the_nose_toward_the_centre_by_the_tilt()
    {
        var tilted = Dome with { DomeTilt = 30 * Math.PI / 180 };
        (double x, double y) = Where(new Vec3(0, 0, 1), tilted);
        double radius = 60 / 90.0 * Size / 2;
        Assert.InRange(x, Size / 2.0 - 1, Size / 2.0 + 1);
        Assert.InRange(y, Size / 2.0 + radius - 1, Size / 2.0 + radius + 1);
    }
}
