using Lightward.Spacetime;

namespace Lightward.Rendering.Tests;

/// <summary>
/// A single star rendered through the whole pipeline lands where the analytic projection of its direction says,
/// within one pixel, for a dim star (bilinear sample) and a bright one (point-spread kernel).
/// Formulas: Snyder, "Map Projections — A Working Manual", USGS Professional Paper 1395 (1987): gnomonic (§22),
/// azimuthal equidistant (§25), equirectangular (§12).
/// </summary>
public class ProjectionPlacementTests
{
    public static TheoryData<double, double, double> Directions => new()
    {
        // azimuth (right of the nose), elevation, exposure stops (−1: dim bilinear star; 6: bright kernel star)
        { 0, 0, -1 }, { 20, 10, -1 }, { -30, -15, 6 }, { 35, -20, 6 }, { -5, 25, -1 },
    };

    [Theory]
    [MemberData(nameof(Directions))]
    public void Perspective_star_lands_on_the_gnomonic_projection(double azimuth, double elevation, double stops)
    {
        var camera = new Camera(ProjectionKind.Perspective, 400, 300, 100 * Math.PI / 180, 0, Exposure.Manual(stops));
        Vec3 d = RenderHarness.FromDegrees(azimuth, elevation);
        // Snyder eq. (22-4), (22-5) on a tangent plane at the view axis: x = f·dx/dz, y = f·dy/dz.
        double focal = 200 / Math.Tan(50 * Math.PI / 180);
        AssertCentroid(camera, d, 200 + focal * d.X / d.Z, 150 - focal * d.Y / d.Z);
    }

    [Theory]
    [MemberData(nameof(Directions))]
    public void Equirectangular_star_lands_on_its_longitude_and_latitude(double azimuth, double elevation, double stops)
    {
        var camera = new Camera(ProjectionKind.Equirectangular, 720, 360, 2 * Math.PI, 0, Exposure.Manual(stops));
        Vec3 d = RenderHarness.FromDegrees(azimuth, elevation);
        // Snyder eq. (12-1), (12-2) with standard parallel 0: x = R·λ, y = R·φ; here 2 px per degree.
        double longitude = Math.Atan2(d.X, d.Z) * 180 / Math.PI, latitude = Math.Asin(d.Y) * 180 / Math.PI;
        AssertCentroid(camera, d, 360 + 2 * longitude, 180 - 2 * latitude);
    }

    [Theory]
    [MemberData(nameof(Directions))]
    public void Dome_star_lands_on_the_azimuthal_equidistant_projection(double azimuth, double elevation, double stops)
    {
        var camera = new Camera(ProjectionKind.Domemaster, 512, 512, Math.PI, 0, Exposure.Manual(stops));
        // Seen from the dome: zenith = ship up, the image's downward direction = the ship's front.
        Vec3 d = RenderHarness.FromDegrees(azimuth, elevation + 30);
        // Snyder eq. (25-2): ρ = R·c, c the angular distance from the centre (zenith); 256 px for 90°.
        double zenithAngle = Math.Acos(d.Y), radius = 256 * zenithAngle / (Math.PI / 2);
        double across = Math.Sqrt(d.X * d.X + d.Z * d.Z);
        AssertCentroid(camera, d, 256 + radius * d.X / across, 256 + radius * d.Z / across);
    }

    private static void AssertCentroid(Camera camera, Vec3 direction, double expectedX, double expectedY)
    {
        RgbaImage image = new FrameRenderer(1).Render(RenderHarness.OneStar(direction), RenderHarness.AtRest(), camera);
        (double x, double y, double total) = RenderHarness.Centroid(image);
        Assert.True(total > 0, "the star left no light on the image");
        Assert.InRange(x, expectedX - 1, expectedX + 1);
        Assert.InRange(y, expectedY - 1, expectedY + 1);
    }
}
