using Lightward.Optics;
using Lightward.Rendering.NearField;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests.NearField;

/// <summary>How bodies and the grid look in finished frames: colour, exposure, and the grid's display brightness.</summary>
public class NearFieldLookTests
{
    private static readonly Observer AtOrigin = new(NearFieldImages.ShipAtRest(), Rotation.Identity);

    /// <summary>A small sky of ordinary stars, so that automatic exposure has the stars to meter as well.</summary>
    private static readonly Scene StarSky = new(StarCatalog.Procedural(2000, 11), ShowCosmicBackground: false);

    private static RgbaImage RenderFrame(NearFieldLayer layer, Camera camera, Observer? observer = null, Scene? scene = null)
    {
        var renderer = new FrameRenderer();
        renderer.Layers.Add(layer);
        return renderer.Render(scene ?? StarSky, observer ?? AtOrigin, camera);
    }

    /// <summary>
    /// Chromaticity of the Planckian locus, Kim et al. (2002), "Design of advanced color temperature control system
    /// for HDTV applications", J. Korean Phys. Soc. 41, 865, cubic-spline fit to CIE 1931 (coefficients from memory;
    /// they reproduce the locus at 2000 K, (0.5267, 0.4133) in Wyszecki &amp; Stiles, Color Science, 2nd ed., to 1e-4).
    /// Valid for 1667 K ≤ T ≤ 2222 K (the y-branch used here).
    /// </summary>
    private static (double X, double Y) PlanckianChromaticity(double temperature)
    {
        Assert.InRange(temperature, 1667, 2222);
        double t = temperature;
        double x = -0.2661239e9 / (t * t * t) - 0.2343589e6 / (t * t) + 0.8776956e3 / t + 0.179910;
        double y = -1.1063814 * x * x * x - 1.34811020 * x * x + 2.18555832 * x - 0.20219683;
        return (x, y);
    }

    /// <summary>Hue angle of a chromaticity around the D65 white point (0.3127, 0.3290; CIE 15 and IEC 61966-2-1), degrees.</summary>
    private static double HueAroundD65((double X, double Y) chromaticity) =>
        Math.Atan2(chromaticity.Y - 0.3290, chromaticity.X - 0.3127) * 180 / Math.PI;

    /// <summary>
    /// The exposed linear value behind an 8-bit code: IEC 61966-2-1 decoding, then the inverse of the extended
    /// Reinhard curve t = x (1 + x/W²) / (1 + x) (Reinhard et al. 2002, eq. 4), solved as a quadratic in x.
    /// </summary>
    private static double Exposed(byte code)
    {
        double t = SrgbTransfer.Decode(code / 255.0), inverseWhiteSquared = 1.0 / (ToneMapper.White * ToneMapper.White);
        return (-(1 - t) + Math.Sqrt((1 - t) * (1 - t) + 4 * t * inverseWhiteSquared)) / (2 * inverseWhiteSquared);
    }

    /// <summary>CIE 1931 chromaticity of linear sRGB, with the IEC 61966-2-1 primaries matrix.</summary>
    private static (double X, double Y) Chromaticity(double r, double g, double b)
    {
        double x = 0.4124 * r + 0.3576 * g + 0.1805 * b, y = 0.2126 * r + 0.7152 * g + 0.0722 * b, z = 0.0193 * r + 0.1192 * g + 0.9505 * b;
        return (x / (x + y + z), y / (x + y + z));
    }

    [Fact]
    public void RecedingGlowingBodyKeepsTheHueOfABlackbodyAtTheShiftedTemperature()
    {
        // A surface glowing like a 6500 K blackbody, flying straight away at 0.85 c; its light left 20 ls away.
        const double beta = 0.85, temperature = 6500;
        var body = new NearFieldBody("ember", MeshShapes.Sphere(3, bands: 32),
            NearFieldImages.Passing(new Vec3(0, 0, 20), -20, new Vec3(0, 0, beta)), BodySurface.Blackbody(temperature));
        var layer = new NearFieldLayer([body], null);
        var camera = new Camera(ProjectionKind.Perspective, 200, 200, 30 * Math.PI / 180, 0, Exposure.Auto);
        RgbaImage image = RenderFrame(layer, camera);

        // Einstein (1905), §7: a source receding along the line of sight is seen with D = √((1 − β)/(1 + β)), and
        // (Rybicki & Lightman 1979, ch. 4) a blackbody at T seen with factor D is a blackbody at D·T (here 1851 K).
        double doppler = layer.LastViews[0].Appearance!.Value.Doppler;
        Assert.Equal(Math.Sqrt((1 - beta) / (1 + beta)), doppler, 1e-9);

        double r = 0, g = 0, b = 0;
        for (int y = 90; y < 110; y++)
            for (int x = 90; x < 110; x++)
            {
                (byte cr, byte cg, byte cb) = image[x, y];
                // The reported fault: channels pushed past the tone curve's shoulder, turning the body yellow or magenta.
                Assert.True(cr < 250 && cg < 250 && cb < 250, $"pixel ({x}, {y}) = ({cr}, {cg}, {cb}) is clipped");
                r += Exposed(cr); g += Exposed(cg); b += Exposed(cb);
            }
        Assert.True(r / 400 > 0.2, "the body is exposed bright enough to see");
        // CIE 1931 Planckian locus (Kim et al. 2002; Wyszecki & Stiles): below ~2000 K a blackbody is orange-red.
        // The rendered hue must be the locus hue at D·T (the renderer may only desaturate toward white to fit sRGB).
        double expected = HueAroundD65(PlanckianChromaticity(doppler * temperature)), rendered = HueAroundD65(Chromaticity(r, g, b));
        Assert.Equal(expected, rendered, 1.0);
    }

    [Fact]
    public void FastBodyWithAWideSpreadOfDopplerFactorsShowsNoClippedChannelPairs()
    {
        // A large glowing body close by, receding at 0.97 c and seen from 35° behind its line of flight: across its
        // face D·T runs from about 1150 K down to 800 K, across the temperature (~900 K) below which a blackbody's
        // deep red lies outside sRGB on the blue side of its red primary. The reported fault showed such a body one
        // side yellow (255, 255, 0) and the other magenta (255, 0, 255).
        Vec3 direction = new(Math.Cos(35 * Math.PI / 180), 0, Math.Sin(35 * Math.PI / 180));
        var body = new NearFieldBody("ember", MeshShapes.Sphere(4, bands: 32),
            NearFieldImages.Passing(6 * direction, -6, new Vec3(0.97, 0, 0)), BodySurface.Blackbody(6500));
        var layer = new NearFieldLayer([body], null);
        var camera = new Camera(ProjectionKind.Perspective, 240, 160, 100 * Math.PI / 180, 0, Exposure.Auto);
        RgbaImage image = RenderFrame(layer, camera, new Observer(NearFieldImages.ShipAtRest(), NearFieldImages.LookingAlong(direction)));
        int lit = 0;
        for (int y = 0; y < image.Height; y++)
            for (int x = 0; x < image.Width; x++)
            {
                (byte r, byte g, byte b) = image[x, y];
                if (r > 20) lit++;
                int clipped = (r >= 250 ? 1 : 0) + (g >= 250 ? 1 : 0) + (b >= 250 ? 1 : 0);
                Assert.True(clipped < 2, $"pixel ({x}, {y}) = ({r}, {g}, {b})");
            }
        Assert.True(lit > 2000, $"{lit} lit pixels");
    }

    [Fact]
    public void GridBrightnessIsSetByTheDisplayNotByTheExposure()
    {
        // A grid's lines are a guide drawn on the picture (our own rule, see LineShader): the same picture at any exposure.
        ShipState ship = NearFieldImages.ShipAtRest() with { Frame = new LorentzFrame(new Velocity(2, Vec3.UnitZ), Rotation.Identity) };
        var observer = new Observer(ship, Rotation.Identity);
        var dark = new Scene(new StarCatalog([], [], [], [], []), ShowCosmicBackground: false);
        var layer = new NearFieldLayer([], SpaceGrid.AtRestInHome(1, 10));
        RgbaImage low = RenderFrame(layer, new Camera(ProjectionKind.Perspective, 160, 90, Math.PI / 2, 0, Exposure.Manual(-20)), observer, dark);
        RgbaImage high = RenderFrame(layer, new Camera(ProjectionKind.Perspective, 160, 90, Math.PI / 2, 0, Exposure.Manual(20)), observer, dark);
        int lit = 0;
        for (int i = 0; i < low.ReadOnlyPixels.Length; i++)
        {
            Assert.InRange(high.ReadOnlyPixels[i] - low.ReadOnlyPixels[i], -1, 1);
            if (i % 4 != 3 && low.ReadOnlyPixels[i] > 0) lit++;
        }
        Assert.True(lit > 1000, $"{lit} lit channels");
    }

    [Fact]
    public void GridAtHighRapidityNeitherBurnsOutAheadNorVanishesBehind()
    {
        // Rapidity 3: the Doppler factor runs from e³ ≈ 20 ahead to e⁻³ ≈ 0.05 behind (Einstein 1905, §7), which would
        // change real light's luminance by many orders of magnitude; the lines stay within the display's range.
        ShipState ship = NearFieldImages.ShipAtRest() with { Frame = new LorentzFrame(new Velocity(3, Vec3.UnitZ), Rotation.Identity) };
        var layer = new NearFieldLayer([], SpaceGrid.AtRestInHome(1, 10));
        var camera = new Camera(ProjectionKind.Perspective, 320, 180, Math.PI / 2, 0, Exposure.Auto);
        var dark = new Scene(new StarCatalog([], [], [], [], []), ShowCosmicBackground: false);
        RgbaImage ahead = RenderFrame(layer, camera, new Observer(ship, Rotation.Identity), dark);
        RgbaImage behind = RenderFrame(layer, camera, new Observer(ship, Rotation.FromAxisAngle(Vec3.UnitY, Math.PI)), dark);
        Assert.True(ahead.ReadOnlyPixels.ToArray().Where((value, i) => i % 4 != 3).Max() < 255, "no channel of a line ahead is clipped");
        Assert.True(behind.ReadOnlyPixels.ToArray().Where((value, i) => i % 4 != 3).Max() > 40, "lines behind are still visible");
    }

    [Fact]
    public void ExposureFollowsABodyThatFillsThePictureButNotASpeck()
    {
        // Photographic metering (common practice, no published source): a glowing body that fills much of the picture
        // is exposed for, so that it is not clipped; a distant speck of it may clip rather than black out the sky.
        var camera = new Camera(ProjectionKind.Perspective, 320, 180, Math.PI / 2, 0, Exposure.Auto);
        double Stops(double radius)
        {
            var renderer = new FrameRenderer();
            if (radius > 0)
                renderer.Layers.Add(new NearFieldLayer([new NearFieldBody("ember", MeshShapes.Sphere(radius, bands: 16),
                    NearFieldImages.Passing(new Vec3(0, 0, 20), -20, Vec3.Zero), BodySurface.Blackbody(6500))], null));
            renderer.Render(StarSky, AtOrigin, camera);
            return renderer.LastExposureStops;
        }
        double sky = Stops(0), speck = Stops(0.1), large = Stops(8);
        Assert.True(speck < sky && speck > sky - 1, $"sky {sky:F2} stops, with a speck {speck:F2}");
        Assert.True(large < sky - 10, $"sky {sky:F1} stops, with a large body {large:F1}");
    }
}
