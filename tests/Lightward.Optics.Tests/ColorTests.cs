namespace Lightward.Optics.Tests;

public class ColorTests
{
    [Fact]
    public void Planckian_at_illuminant_A_has_the_CIE_chromaticity()
    {
        // CIE 15:2004 Colorimetry, Table T.3: standard illuminant A, x = 0.44757, y = 0.40745. A is Planckian:
        // defined at 2848 K with c₂ = 1.435e-2 m·K, which is the same spectrum as 2856 K with the present c₂.
        CieXyz a = BlackbodyColor.Chromaticity(2856);
        Assert.Equal(0.44757, a.ChromaticityX, 0.0002);
        Assert.Equal(0.40745, a.ChromaticityY, 0.0002);
    }

    [Fact]
    public void D65_white_maps_to_equal_sRGB_channels()
    {
        // IEC 61966-2-1:1999: reference white D65 at x = 0.3127, y = 0.3290 maps to R = G = B = 1 at Y = 1.
        LinearSrgb white = LinearSrgb.FromXyz(CieXyz.FromChromaticity(0.3127, 0.3290));
        Assert.Equal(1, white.R, 0.002);
        Assert.Equal(1, white.G, 0.002);
        Assert.Equal(1, white.B, 0.002);
        Assert.Equal(1, white.Luminance, 0.002);
    }

    [Fact]
    public void sRGB_red_primary_is_pure_red()
    {
        // IEC 61966-2-1:1999: red primary at x = 0.64, y = 0.33 with luminance 0.2126.
        LinearSrgb red = LinearSrgb.FromXyz(CieXyz.FromChromaticity(0.64, 0.33));
        Assert.Equal(1 / 0.2126, red.R, 0.01);
        Assert.Equal(0, red.G, 0.002);
        Assert.Equal(0, red.B, 0.002);
    }

    [Theory]
    // Sun: B−V = 0.65 (from memory), T_eff = 5772 K (IAU 2015 Resolution B3 nominal solar value).
    [InlineData(0.65, 5772, 100)]
    // Arcturus: B−V = 1.23, T_eff = 4286 K (Ramírez & Allende Prieto 2011, ApJ 743, 135; from memory).
    [InlineData(1.23, 4286, 100)]
    public void Ballesteros_temperature_matches_published_stars(double bMinusV, double temperature, double tolerance)
    {
        Assert.Equal(temperature, BlackbodyColor.TemperatureFromColorIndex(bMinusV), tolerance);
    }

    [Fact]
    public void Cold_blackbodies_fade_along_the_Wien_tail_without_NaN()
    {
        // Wien's approximation of Planck's law (valid for λT ≪ c₂): at 1–2 K only the longest tabulated wavelength
        // (780 nm) counts, so ln L(1 K) − ln L(2 K) = −c₂/(780 nm) · (1/1 − 1/2).
        double expected = -BlackbodyColor.SecondRadiationConstant / 780e-9 * 0.5;
        Assert.Equal(expected, BlackbodyColor.LogLuminance(1) - BlackbodyColor.LogLuminance(2), 6);
        LinearSrgb cold = BlackbodyColor.ColorOfUnitLuminance(1);
        Assert.True(cold.R > cold.G && cold.G >= 0 && cold.B >= 0);
        Assert.Equal(1, cold.Luminance, 9);
    }

    [Fact]
    public void Hot_blackbodies_reach_the_Rayleigh_Jeans_limit()
    {
        // Rayleigh–Jeans law (λT ≫ c₂): B_λ ∝ T, so doubling T doubles the luminance and fixes the colour.
        Assert.Equal(Math.Log(2), BlackbodyColor.LogLuminance(2e12) - BlackbodyColor.LogLuminance(1e12), 6);
        LinearSrgb hot = BlackbodyColor.ColorOfUnitLuminance(1e12), hotter = BlackbodyColor.ColorOfUnitLuminance(1e15);
        Assert.Equal(hot.B, hotter.B, 6);
        Assert.True(hot.B > hot.G && hot.G > hot.R && hot.R > 0);
    }

    [Fact]
    public void Every_temperature_from_0_K_to_1e15_K_gives_finite_colour()
    {
        LinearSrgb absoluteZero = BlackbodyColor.ColorOfUnitLuminance(0);
        Assert.Equal(double.NegativeInfinity, BlackbodyColor.LogLuminance(0));
        Assert.True(absoluteZero.R > 0 && double.IsFinite(absoluteZero.R + absoluteZero.G + absoluteZero.B));
        for (double logT = 0; logT <= 15 * Math.Log(10); logT += 0.05)
        {
            double temperature = Math.Exp(logT);
            LinearSrgb color = BlackbodyColor.ColorOfUnitLuminance(temperature);
            Assert.True(double.IsFinite(BlackbodyColor.LogLuminance(temperature)));
            Assert.True(color.R >= 0 && color.G >= 0 && color.B >= 0 && double.IsFinite(color.R + color.G + color.B));
            Assert.Equal(1, color.Luminance, 9);
        }
    }

    [Fact]
    public void Planck_spectrum_integrates_to_the_Stefan_Boltzmann_law()
    {
        // Stefan–Boltzmann: ∫ B_λ dλ = σ T⁴ / π, σ = 5.670374419e-8 W m⁻² K⁻⁴ (CODATA 2018).
        const double temperature = 5772, sigma = 5.670374419e-8;
        double integral = MathNet.Numerics.Integrate.DoubleExponential(
            wavelength => BlackbodyColor.SpectralRadiance(wavelength, temperature), 1e-8, 1e-3, 1e-10);
        Assert.Equal(1, integral / (sigma * Math.Pow(temperature, 4) / Math.PI), 6);
    }

    [Fact]
    public void Table_lookup_matches_the_direct_computation()
    {
        // Reference: BlackbodyColor itself (CIE 1931 observer, IEC sRGB matrix); the table must only add interpolation error.
        foreach (double temperature in new[] { 250.0, 1000, 3000, 5772, 10_000, 40_000, 1e6, 1e9 })
        {
            float logLuminance = BlackbodyTable.Shared.Sample((float)Math.Log(temperature), out float r, out float g, out float b);
            LinearSrgb color = BlackbodyColor.ColorOfUnitLuminance(temperature);
            Assert.Equal(BlackbodyColor.LogLuminance(temperature), logLuminance, 1e-3 * Math.Max(1, Math.Abs(logLuminance)));
            Assert.Equal(color.R, r, 1e-4);
            Assert.Equal(color.G, g, 1e-4);
            Assert.Equal(color.B, b, 1e-4);
        }
        Assert.Equal(float.NegativeInfinity, BlackbodyTable.Shared.Sample(MathF.Log(100), out _, out _, out _));
    }
}
