using Lightward.Rendering.NearField;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

public class ImageSkyTests
{
    [Fact]
    public void A_flat_screen_shows_sky_everywhere_within_the_cone_of_its_corners()
    {
        var sky = new ImageSky(new Camera(ProjectionKind.Perspective, 1920, 1080, Math.PI / 2, 0, Exposure.Manual(0)).CreateProjection());
        Assert.False(sky.HasBlankPixels);
        Assert.Equal((0, 1919), sky.SkyColumns(0));
        Assert.Equal((0, 1919), sky.SkyColumns(1079));
        // Gnomonic projection (Snyder, Map Projections — A Working Manual, USGS PP 1395, 1987, §22): the pixel centre
        // (x, y) is seen along (x − w/2, h/2 − y, f), f = (w/2)/tan(45°) = 960 px. The cap is centred on the middle
        // pixel (960, 540) and reaches the farthest sampled one, the corner pixel (0, 0), plus its 0.01 rad margin.
        Vec3 centre = new Vec3(0.5, -0.5, 960).NormalizedOr(Vec3.UnitZ), corner = new Vec3(-959.5, 539.5, 960).NormalizedOr(Vec3.UnitZ);
        Assert.Equal(Vec3.AngleBetween(centre, corner) + 0.01, sky.View.Radius, 1e-5);
    }

    [Fact]
    public void A_dome_shows_sky_on_the_chord_of_its_disc_in_each_row()
    {
        const int size = 512;
        var sky = new ImageSky(new Camera(ProjectionKind.Domemaster, size, size, Math.PI, 0, Exposure.Manual(0)).CreateProjection());
        Assert.True(sky.HasBlankPixels);
        for (int row = 0; row < size; row++)
        {
            // Azimuthal equidistant (Snyder §25): the 180° disc's rim is 90° from the centre, a radius of size/2 px; a
            // pixel shows sky when its centre lies within it (to a hundredth of a pixel, single-precision arithmetic).
            double up = size / 2.0 - (row + 0.5);
            (int first, int last) = sky.SkyColumns(row);
            for (int column = 0; column < size; column++)
            {
                double across = column + 0.5 - size / 2.0, radius = Math.Sqrt(across * across + up * up);
                if (Math.Abs(radius - size / 2.0) < 0.01) continue;
                Assert.Equal(radius < size / 2.0, column >= first && column <= last);
            }
        }
        // The cap is centred on the middle pixel, half a pixel off the disc centre each way (√2/2 px at 90°/256 px
        // per px), and reaches the rim 90° away, plus its 0.01 rad margin; sampling every other pixel may miss a pixel.
        double offCentre = Math.Sqrt(0.5) * (Math.PI / 2) / (size / 2.0), pixel = (Math.PI / 2) / (size / 2.0);
        Assert.InRange(sky.View.Radius, Math.PI / 2 + offCentre + 0.01 - 2 * pixel, Math.PI / 2 + offCentre + 0.01 + 1e-5);
    }
}
