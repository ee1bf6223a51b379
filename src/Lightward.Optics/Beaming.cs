namespace Lightward.Optics;

/// <summary>
/// How brightness changes with the Doppler factor D.
/// <para>
/// Rybicki &amp; Lightman, Radiative Processes in Astrophysics (1979), ch. 4, transformation of specific intensity: the photon
/// phase-space density is Lorentz invariant, so I_ν/ν³ is the same for every observer. Light leaving a source at
/// frequency ν arrives at ν′ = D ν, hence I′_ν′ = D³ I_ν, and integrating over frequency (dν′ = D dν) the bolometric
/// intensity is I′ = D⁴ I. A blackbody of temperature T then looks exactly like a blackbody of temperature D·T:
/// B_ν′(D T) = D³ B_ν(T). That is all there is for extended sources (the CMB, a body's surface): specific intensity
/// ×D³ at the shifted frequency, bolometric surface brightness ×D⁴.
/// </para>
/// <para>
/// A star is an unresolved source: what reaches the eye is surface brightness × solid angle. Seen from a ship moving
/// through the same event as a ship at rest, the star's solid angle is Ω′ = Ω/D² (aberration maps dΩ′ = dΩ/D²; same
/// reference, ch. 4), so its bolometric flux is D⁴ · D⁻² = D² times what the resting ship receives. (The familiar D⁴
/// for a moving source measures distance in the observer's frame at emission; here the star and its distance stay
/// in the home frame, so the two must not be mixed.) In a band such as V the flux follows the shifted spectrum:
/// luminance′ = luminance × L_bb(D·T) / (D² · L_bb(T)), with L_bb the luminance of a unit-area blackbody.
/// </para>
/// </summary>
public static class Beaming
{
    /// <summary>Specific intensity at the shifted frequency, I′_ν′ / I_ν = D³.</summary>
    public static double SpecificIntensityFactor(double dopplerFactor) => dopplerFactor * dopplerFactor * dopplerFactor;

    /// <summary>Bolometric surface brightness of an extended source, I′ / I = D⁴.</summary>
    public static double SurfaceBrightnessFactor(double dopplerFactor)
    {
        double squared = dopplerFactor * dopplerFactor;
        return squared * squared;
    }

    /// <summary>Bolometric flux of a star at rest in the home frame, relative to a ship at rest at the same event: D².</summary>
    public static double StarFluxFactor(double dopplerFactor) => dopplerFactor * dopplerFactor;

    /// <summary>
    /// Natural log of the visual-luminance factor of a blackbody star of temperature <paramref name="temperature"/>:
    /// ln(L_bb(D·T) / (D² L_bb(T))). Kept as a log because it spans hundreds of decades at high rapidity.
    /// </summary>
    public static double LogStarLuminanceFactor(double dopplerFactor, double temperature) =>
        BlackbodyColor.LogLuminance(dopplerFactor * temperature) - BlackbodyColor.LogLuminance(temperature)
        - 2 * Math.Log(dopplerFactor);
}
