using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>
/// The cosmic microwave background: a blackbody at <see cref="Temperature"/> filling the sky, at rest in the home
/// frame. Seen along a direction with Doppler factor D it is a blackbody at D·T₀ (Rybicki &amp; Lightman 1979, ch. 4;
/// see <see cref="Beaming"/>): invisible at rest (its visual luminance is about e⁻⁹⁵⁰⁰ cd/m²), it glows into view ahead
/// once D·T₀ reaches several hundred kelvin (φ ≳ 5) and blazes blue-white at high rapidity.
/// Radiance is in V = 0 units per steradian (<see cref="Photometry"/>), so radiance × pixel solid angle adds to star
/// irradiance in the same buffer.
/// </summary>
public static class CosmicBackground
{
    /// <summary>T₀ = 2.72548 ± 0.00057 K, Fixsen (2009), ApJ 707, 916.</summary>
    public const double Temperature = 2.72548;

    /// <summary>Linear sRGB radiance of the background seen with Doppler factor <paramref name="dopplerFactor"/>.</summary>
    public static LinearSrgb Radiance(double dopplerFactor)
    {
        double apparentTemperature = dopplerFactor * Temperature;
        double logRadiance = Photometry.LogRadianceOfLogLuminance(BlackbodyColor.LogLuminance(apparentTemperature));
        return Math.Exp(logRadiance) * BlackbodyColor.ColorOfUnitLuminance(apparentTemperature);
    }

    /// <summary>Radiance arriving from apparent direction <paramref name="apparentShip"/> (ship axes).</summary>
    public static LinearSrgb Radiance(Vec3 apparentShip, LorentzFrame shipFrame) =>
        Radiance(Doppler.FactorFromShipAxes(apparentShip, shipFrame));

    /// <summary>
    /// Single-precision radiance for per-pixel loops, from ln D: the shared <see cref="BlackbodyTable"/> lookup
    /// (zero where D·T₀ is below the table, i.e. black to float precision).
    /// </summary>
    public static void Radiance(float logDopplerFactor, out float r, out float g, out float b)
    {
        float logLuminance = BlackbodyTable.Shared.Sample(LogTemperature + logDopplerFactor, out r, out g, out b);
        float radiance = MathF.Exp((float)Photometry.LogRadianceOfLogLuminance(logLuminance));
        r *= radiance; g *= radiance; b *= radiance;
    }

    private static readonly float LogTemperature = (float)Math.Log(Temperature);
}
