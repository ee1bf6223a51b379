using Lightward.Rendering.Safety;

namespace Lightward.Rendering.Tests.Safety;

/// <summary>Synthetic frame sequences built from the definitions in ITU-R BT.1702 (and W3C WCAG 2.2 for saturated red).</summary>
public class FlashAnalyserTests
{
    private const int Size = 32, Grid = 16;
    private const double Fps = 30;

    /// <summary>An 8-bit sRGB value whose decoded linear value is <paramref name="linear"/> (IEC 61966-2-1 encoding).</summary>
    private static byte Encode(double linear)
    {
        double c = linear <= 0.0031308 ? 12.92 * linear : 1.055 * Math.Pow(linear, 1 / 2.4) - 0.055;
        return (byte)Math.Round(255 * Math.Clamp(c, 0, 1));
    }

    /// <summary>A frame whose left <paramref name="share"/> of columns has the given linear colour, the rest the background.</summary>
    private static byte[] Frame((double R, double G, double B) colour, (double R, double G, double B) background, double share = 1)
    {
        var frame = new byte[Size * Size * 4];
        int columns = (int)Math.Round(share * Size);
        for (int y = 0; y < Size; y++)
            for (int x = 0; x < Size; x++)
            {
                var c = x < columns ? colour : background;
                int i = (y * Size + x) * 4;
                frame[i] = Encode(c.R); frame[i + 1] = Encode(c.G); frame[i + 2] = Encode(c.B); frame[i + 3] = 255;
            }
        return frame;
    }

    private static (double, double, double) Grey(double luminance, double peak) => (luminance / peak, luminance / peak, luminance / peak);

    /// <summary>Alternates two frames, switching every <paramref name="framesPerState"/> frames, for two seconds.</summary>
    private static IReadOnlyList<FlashFinding> Flicker(byte[] a, byte[] b, int framesPerState, double peak)
    {
        var analyser = new FlashAnalyser(Grid, Grid, Fps, peak, ScreenArea.Uniform(Grid, Grid));
        for (int frame = 0; frame < 2 * Fps; frame++)
            analyser.AddFrame((frame / framesPerState) % 2 == 0 ? a : b, Size, Size);
        return analyser.Findings();
    }

    [Fact]
    public void Five_full_screen_flashes_a_second_between_dark_and_100_cd_m2_are_harmful()
    {
        // ITU-R BT.1702: opposing changes of ≥ 20 cd/m², darker image < 160 cd/m², more than three flashes a second.
        var findings = Flicker(Frame(Grey(0, 200), Grey(0, 200)), Frame(Grey(100, 200), Grey(100, 200)), 3, 200);
        var flash = Assert.Single(findings);
        Assert.Equal(FlashKind.Luminance, flash.Kind);
        Assert.True(flash.PeakFlashesPerSecond > 3);
        Assert.Equal(1, flash.PeakArea, 3);
    }

    [Fact]
    public void Three_flashes_a_second_are_within_the_limit()
    {
        // ITU-R BT.1702: harmful only with more than three flashes in any one second (30 fps, a state every 5 frames = 3 Hz).
        Assert.Empty(Flicker(Frame(Grey(0, 200), Grey(0, 200)), Frame(Grey(100, 200), Grey(100, 200)), 5, 200));
    }

    [Fact]
    public void Changes_under_20_cd_m2_are_not_flashes()
    {
        // ITU-R BT.1702: a flash needs opposing changes of 20 cd/m² or more; 0 ↔ 15 cd/m² at 5 Hz is below.
        Assert.Empty(Flicker(Frame(Grey(0, 200), Grey(0, 200)), Frame(Grey(15, 200), Grey(15, 200)), 3, 200));
    }

    [Fact]
    public void Flashes_between_bright_images_do_not_count()
    {
        // ITU-R BT.1702: the darker image must be below 160 cd/m²; 170 ↔ 200 cd/m² changes by 30 but stays bright.
        Assert.Empty(Flicker(Frame(Grey(170, 200), Grey(170, 200)), Frame(Grey(200, 200), Grey(200, 200)), 3, 200));
    }

    [Fact]
    public void Flashes_over_a_fifth_of_the_screen_pass_and_over_a_third_fail()
    {
        // ITU-R BT.1702: harmful only when concurrent flashes cover more than one quarter of the screen.
        var dark = Grey(0, 200);
        Assert.Empty(Flicker(Frame(dark, dark), Frame(Grey(100, 200), dark, share: 0.1875), 3, 200));
        Assert.NotEmpty(Flicker(Frame(dark, dark), Frame(Grey(100, 200), dark, share: 0.3125), 3, 200));
    }

    [Fact]
    public void Saturated_red_flashes_are_harmful_even_below_the_luminance_threshold()
    {
        // ITU-R BT.1702: transitions to or from saturated red count regardless of luminance. With a 50 cd/m² peak, pure
        // red is 0.2126 × 50 = 10.6 cd/m² (BT.709 luminance coefficients), under the 20 cd/m² luminance threshold; the red
        // measure (R−G−B)×320 = 320 and R/(R+G+B) = 1 ≥ 0.8 (W3C WCAG 2.2 definitions).
        var findings = Flicker(Frame((0, 0, 0), (0, 0, 0)), Frame((1, 0, 0), (1, 0, 0)), 3, 50);
        var flash = Assert.Single(findings);
        Assert.Equal(FlashKind.SaturatedRed, flash.Kind);
    }

    [Fact]
    public void A_slow_fade_up_and_down_is_one_flash_at_most()
    {
        // ITU-R BT.1702 counts pairs of opposing changes; a fade from black to 150 cd/m² and back over two seconds is one.
        var analyser = new FlashAnalyser(Grid, Grid, Fps, 200, ScreenArea.Uniform(Grid, Grid));
        for (int frame = 0; frame < 60; frame++)
        {
            double level = 150 * (1 - Math.Abs(frame - 30) / 30.0);
            analyser.AddFrame(Frame(Grey(level, 200), Grey(level, 200)), Size, Size);
        }
        Assert.Empty(analyser.Findings());
    }

    [Fact]
    public void Dome_area_shares_follow_the_solid_angle_of_a_spherical_cap()
    {
        // Solid angle of a cap of half-angle θ is 2π(1 − cos θ) (spherical geometry); on a 180° dome the inner half of
        // the domemaster radius (θ ≤ 45°) holds (1 − cos 45°) / (1 − cos 90°) = 0.2929 of the dome.
        const int grid = 64;
        float[] area = ScreenArea.Domemaster(grid, Math.PI);
        double inner = 0, total = 0;
        for (int row = 0; row < grid; row++)
            for (int column = 0; column < grid; column++)
            {
                double u = -1 + 2 * (column + 0.5) / grid, v = -1 + 2 * (row + 0.5) / grid;
                total += area[row * grid + column];
                if (Math.Sqrt(u * u + v * v) <= 0.5) inner += area[row * grid + column];
            }
        Assert.Equal(1, total, 5);
        Assert.Equal(1 - Math.Cos(Math.PI / 4), inner, 0.005); // cells straddle the circle r = 0.5
        Assert.Equal(0, area[0]); // the corner lies outside the dome circle
    }
}
