using MathNet.Numerics;

namespace Lightward.Optics.Tests;

public class BeamingTests
{
    private const double PlanckConstant = 6.62607015e-34, BoltzmannConstant = 1.380649e-23, SpeedOfLight = 299_792_458.0;

    /// <summary>Planck's law per unit frequency, B_ν(T) = (2hν³/c²) / (e^(hν/kT) − 1) (Rybicki &amp; Lightman 1979, eq. 1.51).</summary>
    private static double PlanckPerFrequency(double frequency, double temperature) =>
        2 * PlanckConstant * Math.Pow(frequency, 3) / (SpeedOfLight * SpeedOfLight)
        / (Math.Exp(PlanckConstant * frequency / (BoltzmannConstant * temperature)) - 1);

    [Theory]
    [InlineData(0.3)]
    [InlineData(2.0)]
    [InlineData(7.0)]
    public void Star_flux_grows_as_D_squared_by_integrating_the_shifted_spectrum(double doppler)
    {
        const double temperature = 5772;
        // Rybicki & Lightman (1979) ch. 4: I_ν/ν³ is invariant, so the received spectrum is I′(ν′) = D³ I(ν′/D);
        // the star's solid angle shrinks by D². Integrate both spectra numerically over frequency.
        double scale = BoltzmannConstant * temperature / PlanckConstant;
        double atRest = Integrate.DoubleExponential(nu => PlanckPerFrequency(nu, temperature), 1e-4 * scale, 60 * scale, 1e-10);
        double moving = Integrate.DoubleExponential(nu => Math.Pow(doppler, 3) * PlanckPerFrequency(nu / doppler, temperature),
            1e-4 * scale * doppler, 60 * scale * doppler, 1e-10) / (doppler * doppler);
        Assert.Equal(doppler * doppler, moving / atRest, 6);
        Assert.Equal(doppler * doppler, Beaming.StarFluxFactor(doppler), 12);
        // The shifted spectrum is itself a blackbody at D·T (same reference): compare at one frequency.
        Assert.Equal(1, Math.Pow(doppler, 3) * PlanckPerFrequency(scale, temperature) / PlanckPerFrequency(doppler * scale, doppler * temperature), 9);
    }

    [Fact]
    public void Surface_brightness_grows_as_D_to_the_fourth()
    {
        // Stefan–Boltzmann applied to the blackbody at D·T (Rybicki & Lightman 1979, ch. 4): σ(DT)⁴/σT⁴ = D⁴.
        Assert.Equal(16, Beaming.SurfaceBrightnessFactor(2), 12);
        Assert.Equal(8, Beaming.SpecificIntensityFactor(2), 12);
    }

    [Fact]
    public void Visual_factor_is_one_at_rest_and_follows_the_shifted_blackbody()
    {
        Assert.Equal(0, Beaming.LogStarLuminanceFactor(1, 5772), 12);
        // Rayleigh–Jeans end (Rybicki & Lightman 1979, eq. 1.53): in-band luminance ∝ D·T, so L(DT)/(D² L(T)) → 1/D
        // once both temperatures are far above the visible band.
        Assert.Equal(-Math.Log(10), Beaming.LogStarLuminanceFactor(10, 1e10), 4);
    }
}
