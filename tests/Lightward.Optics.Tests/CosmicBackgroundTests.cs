using Lightward.Spacetime;

namespace Lightward.Optics.Tests;

public class CosmicBackgroundTests
{
    [Fact]
    public void Solar_motion_gives_the_Planck_dipole_amplitude()
    {
        // Planck 2018 results I (A&A 641, A1), §5: solar velocity 369.82 ± 0.11 km/s toward (l, b) = (264.021°, 48.253°)
        // gives a dipole amplitude of 3362.08 ± 0.99 µK on T₀ (Fixsen 2009). T(θ) = T₀ D(θ) = T₀ / (γ(1 − β cos θ′)).
        var solar = Velocity.FromBeta(new Vec3(369.82e3 / Units.SpeedOfLight, 0, 0));
        double hottest = CosmicBackground.Temperature * Doppler.Factor(Vec3.UnitX, solar);
        double coldest = CosmicBackground.Temperature * Doppler.Factor(-Vec3.UnitX, solar);
        Assert.Equal(3.36208e-3, (hottest - coldest) / 2, 1e-6);
    }

    [Fact]
    public void Background_is_black_at_rest_and_glows_ahead_at_high_rapidity()
    {
        // Wien tail of Planck's law: at 2.7 K the visible band gets e^(−c₂/(λT)) ≈ e^(−6800) of the peak — black.
        Assert.Equal(0, CosmicBackground.Radiance(1).Luminance);
        var ship = new LorentzFrame(new Velocity(8, Vec3.UnitZ), Rotation.Identity);
        LinearSrgb ahead = CosmicBackground.Radiance(Vec3.UnitZ, ship);
        LinearSrgb astern = CosmicBackground.Radiance(-Vec3.UnitZ, ship);
        // D = e^8 ≈ 2981 (Einstein 1905, §7), so the background ahead is a ~8100 K blackbody: bright and white.
        Assert.True(ahead.Luminance > 1e6, $"ahead {ahead}");
        Assert.Equal(0, astern.Luminance);
        foreach (double phi in new[] { 0.0, 3, 6, 10, 25, 40 })
        {
            LinearSrgb radiance = CosmicBackground.Radiance(Math.Exp(phi));
            Assert.True(double.IsFinite(radiance.Luminance) && radiance.R >= 0 && radiance.G >= 0 && radiance.B >= 0);
            CosmicBackground.Radiance((float)phi, out float r, out float g, out float b);
            Assert.True(float.IsFinite(r + g + b));
            Assert.Equal(radiance.Luminance, 0.2126 * r + 0.7152 * g + 0.0722 * b, 2e-3 * radiance.Luminance + 1e-30);
        }
    }

    [Fact]
    public void A_5772_K_disc_of_the_Suns_size_has_the_Suns_magnitude()
    {
        // Checks the photometric chain (Planck → CIE luminance → V zero point). Sun: T_eff = 5772 K and
        // R = 695 700 km (IAU 2015 Resolution B3), at 1 au (IAU 2012 B2); V = −26.74 (Allen's Astrophysical
        // Quantities, 4th ed.; from memory). The Sun is not a perfect blackbody, so allow 0.15 mag.
        double solidAngle = Math.PI * Math.Pow(695_700e3 / 149_597_870_700.0, 2);
        double logIrradiance = Photometry.LogRadianceOfLogLuminance(BlackbodyColor.LogLuminance(5772)) + Math.Log(solidAngle);
        Assert.Equal(-26.74, Photometry.MagnitudeChangeOfLogRatio(logIrradiance), 0.15);
    }
}
