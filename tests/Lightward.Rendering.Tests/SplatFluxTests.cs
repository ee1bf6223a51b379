namespace Lightward.Rendering.Tests;

/// <summary>A splat only spreads a star's light: the weights of every footprint sum to its flux (energy conservation).</summary>
public class SplatFluxTests
{
    public static TheoryData<int> Footprints()
    {
        var data = new TheoryData<int> { 0 };
        for (int size = 0; size < PointSpreadKernels.Radii.Length; size++) data.Add(size + 1);
        return data;
    }

    [Theory]
    [MemberData(nameof(Footprints))]
    public void Sum_of_a_splat_equals_the_stars_flux_at_every_sub_pixel_position(int footprint)
    {
        var splatter = new StarSplatter();
        var frame = new HdrFrame(160, 160);
        foreach ((float x, float y) in new[] { (80.5f, 80.5f), (80.13f, 79.91f), (79.99f, 80.37f), (80.74f, 80.26f) })
        {
            frame.ClearRows(0, frame.Height);
            splatter.SplatOne(frame, x, y, 3f, 2f, 0.5f, footprint, 0, frame.Height, 0, frame.Width);
            Assert.Equal(3.0, frame.Red.Sum(v => (double)v), 3.0 * 1e-5);
            Assert.Equal(2.0, frame.Green.Sum(v => (double)v), 2.0 * 1e-5);
            Assert.Equal(0.5, frame.Blue.Sum(v => (double)v), 0.5 * 1e-5);
        }
    }

    [Fact]
    public void Splitting_a_splat_into_tiles_deposits_the_same_light_and_marks_it()
    {
        var splatter = new StarSplatter();
        var whole = new HdrFrame(300, 100);
        var tiled = new HdrFrame(300, 100);
        foreach (int footprint in new[] { 0, splatter.FootprintFor(1e4f) })
            foreach ((float x, float y) in new[] { (128.3f, 47.8f), (127.6f, 48.2f), (40.2f, 15.9f) })
            {
                splatter.SplatOne(whole, x, y, 1f, 1f, 1f, footprint, 0, 100, 0, 300);
                for (int row = 0; row < 100; row += StarSplatter.BandHeight)
                    for (int column = 0; column < 300; column += StarSplatter.TileWidth)
                        splatter.SplatOne(tiled, x, y, 1f, 1f, 1f, footprint, row, Math.Min(100, row + StarSplatter.BandHeight),
                            column, Math.Min(300, column + StarSplatter.TileWidth));
            }
        Assert.Equal(whole.Red, tiled.Red);
        Assert.Equal(whole.Touched, tiled.Touched);
        // Every lit pixel lies in a marked group, so the tone map cannot skip it.
        for (int i = 0; i < whole.Red.Length; i++)
            if (whole.Red[i] != 0) Assert.NotEqual(0, whole.Touched[i / 300 * whole.GroupsPerRow + i % 300 / HdrFrame.GroupWidth]);
    }

    [Fact]
    public void Brighter_stars_get_wider_footprints()
    {
        var splatter = new StarSplatter();
        Assert.Equal(0, splatter.FootprintFor(StarSplatter.BilinearLimit));
        int previous = 0;
        foreach (float flux in new[] { 2f, 20f, 200f, 2e3f, 2e4f, 2e5f, 2e6f })
        {
            int footprint = splatter.FootprintFor(flux);
            Assert.True(footprint >= previous, $"flux {flux} got footprint {footprint} after {previous}");
            previous = footprint;
        }
        Assert.True(previous > 4, "the brightest stars should reach the wide halo kernels");
    }
}
