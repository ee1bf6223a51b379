using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>One star as seen from the ship, in double precision (the reference for <see cref="SkyTransform"/>).</summary>
/// <param name="Comoving">Unit direction toward where the star appears, comoving axes parallel to the home axes.</param>
/// <param name="Ship">The same direction in the ship's own axes (+Z forward, +X right, +Y up).</param>
/// <param name="DopplerFactor">ν_observed / ν_emitted.</param>
/// <param name="FluxFactor">Bolometric flux relative to a ship at rest at the same event (D²).</param>
/// <param name="ApparentTemperature">Colour temperature of the received light, D·T, in kelvin.</param>
/// <param name="ApparentMagnitude">Visual magnitude of the received light (may be +∞ when redshifted to black).</param>
/// <param name="Irradiance">Linear sRGB irradiance in V = 0 units (luminance 10^(−0.4 m)).</param>
public readonly record struct ApparentStar(
    Vec3 Comoving, Vec3 Ship, double DopplerFactor, double FluxFactor,
    double ApparentTemperature, double ApparentMagnitude, LinearSrgb Irradiance);

/// <summary>Aberration, Doppler shift and beaming of a blackbody star at rest in the home frame.</summary>
public static class Starlight
{
    /// <param name="homeDirection">Unit vector toward the star in home (ICRS) axes.</param>
    /// <param name="magnitude">Visual magnitude V seen from a ship at rest.</param>
    /// <param name="temperature">The star's colour temperature in kelvin.</param>
    /// <param name="shipFrame">The ship's frame: its velocity and orientation.</param>
    public static ApparentStar Observe(Vec3 homeDirection, double magnitude, double temperature, LorentzFrame shipFrame)
    {
        Vec3 comoving = Aberration.Apparent(homeDirection, shipFrame.Velocity);
        double doppler = Doppler.Factor(homeDirection, shipFrame.Velocity);
        double apparentTemperature = doppler * temperature;
        double apparentMagnitude = magnitude
            + Photometry.MagnitudeChangeOfLogRatio(Beaming.LogStarLuminanceFactor(doppler, temperature));
        LinearSrgb irradiance = Photometry.IrradianceOfMagnitude(apparentMagnitude)
            * BlackbodyColor.ColorOfUnitLuminance(apparentTemperature);
        return new ApparentStar(comoving, shipFrame.Orientation.Inverse.Rotate(comoving), doppler,
            Beaming.StarFluxFactor(doppler), apparentTemperature, apparentMagnitude, irradiance);
    }
}
