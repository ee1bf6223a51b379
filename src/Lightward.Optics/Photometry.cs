namespace Lightward.Optics;

/// <summary>
/// The bridge between the magnitude scale and photometric units. Star irradiance in Lightward is counted in
/// "V = 0 units": a star of visual magnitude V delivers luminance Y = 10^(−0.4 V) (see <see cref="ApparentStars"/>).
/// Radiance of extended sources is in the same units per steradian, so a renderer adds radiance × pixel solid angle.
/// </summary>
public static class Photometry
{
    /// <summary>
    /// Illuminance of a V = 0 star outside the atmosphere, 2.54 × 10⁻⁶ lux (Allen's Astrophysical Quantities,
    /// 4th ed., 2000, photometric conversions; from memory).
    /// </summary>
    public const double ZeroMagnitudeIlluminanceLux = 2.54e-6;

    private static readonly double LogZeroMagnitudeIlluminance = Math.Log(ZeroMagnitudeIlluminanceLux);
    private const double PogsonScale = 2.5 / 2.302585092994046; // 2.5 / ln 10: magnitudes per unit of ln flux.

    /// <summary>Irradiance in V = 0 units of a star of visual magnitude <paramref name="magnitude"/>.</summary>
    public static double IrradianceOfMagnitude(double magnitude) => Math.Pow(10, -0.4 * magnitude);

    /// <summary>Visual magnitude of a star delivering <paramref name="irradiance"/> V = 0 units.</summary>
    public static double MagnitudeOfIrradiance(double irradiance) => -2.5 * Math.Log10(irradiance);

    /// <summary>The magnitude change for a flux ratio given as its natural log: Δm = −2.5 log₁₀(ratio).</summary>
    public static double MagnitudeChangeOfLogRatio(double logRatio) => -PogsonScale * logRatio;

    /// <summary>Natural log of a luminance (cd/m²) expressed as radiance in V = 0 units per steradian.</summary>
    public static double LogRadianceOfLogLuminance(double logCandelaPerSquareMetre) =>
        logCandelaPerSquareMetre - LogZeroMagnitudeIlluminance;
}
