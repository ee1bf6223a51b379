namespace Lightward.Optics;

/// <summary>
/// Colour and luminance of blackbodies: Planck's law integrated against the CIE 1931 observer (<see cref="CieObserver"/>),
/// converted to linear sRGB. Everything is computed with the exponential factored out so that it stays finite from
/// 1 K (a deep red, Wien-tail glow whose log-luminance is still exact) to 10¹² K and beyond (the Rayleigh–Jeans
/// blue-white limit), and never returns NaN for a positive temperature.
/// </summary>
public static class BlackbodyColor
{
    // SI 2019 exact defining constants (BIPM, The International System of Units, 9th ed., 2019).
    private const double PlanckConstant = 6.62607015e-34;
    private const double BoltzmannConstant = 1.380649e-23;
    private const double SpeedOfLight = 299_792_458.0;

    /// <summary>Second radiation constant c₂ = hc/k in metre-kelvin.</summary>
    public const double SecondRadiationConstant = PlanckConstant * SpeedOfLight / BoltzmannConstant;

    /// <summary>Maximum luminous efficacy K_m of photopic vision, lm/W (CIE 15; SI definition of the candela).</summary>
    public const double LuminousEfficacy = 683;

    private const double FirstRadiationConstant = 2 * PlanckConstant * SpeedOfLight * SpeedOfLight;
    private const double NanometreInMetres = 1e-9;

    /// <summary>Planck's law: spectral radiance B_λ(T) in W·m⁻²·sr⁻¹ per metre of wavelength.</summary>
    public static double SpectralRadiance(double wavelengthMetres, double temperature)
    {
        double x = SecondRadiationConstant / (wavelengthMetres * temperature);
        return FirstRadiationConstant / Math.Pow(wavelengthMetres, 5) * Math.Exp(-x) / OneMinusExpNegative(x);
    }

    /// <summary>Natural log of the luminance (cd/m²) of a blackbody surface at <paramref name="temperature"/> kelvin.</summary>
    public static double LogLuminance(double temperature)
    {
        if (!(temperature > 0)) return double.NegativeInfinity;
        (CieXyz scaled, double logScale) = ScaledTristimulus(temperature);
        return Math.Log(LuminousEfficacy * scaled.Y) + logScale;
    }

    /// <summary>Tristimulus values of a blackbody's light normalised to luminance Y = 1.</summary>
    public static CieXyz Chromaticity(double temperature)
    {
        // Zero kelvin has no light; its limit is the colour of the cold tail, the long-wavelength end of the observer,
        // which any temperature far below 1 K already shows exactly (1e-300 K keeps c₂/(λT) finite).
        (CieXyz scaled, _) = ScaledTristimulus(Math.Max(temperature, 1e-300));
        return new CieXyz(scaled.X / scaled.Y, 1, scaled.Z / scaled.Y);
    }

    /// <summary>Linear sRGB of a blackbody with luminance exactly 1, desaturated into the gamut where needed.</summary>
    public static LinearSrgb ColorOfUnitLuminance(double temperature)
    {
        LinearSrgb color = LinearSrgb.FromXyz(Chromaticity(temperature)).DesaturatedIntoGamut();
        return (1 / color.Luminance) * color;
    }

    /// <summary>
    /// Effective temperature from the Johnson B−V colour index, Ballesteros (2012), EPL 97, 34008 (formula from memory of the paper):
    /// T = 4600 K · (1/(0.92 (B−V) + 1.7) + 1/(0.92 (B−V) + 0.62)). The formula diverges at B−V = −0.674, so indices
    /// bluer than −0.4 (the bluest in the Hipparcos catalogue) are clamped there.
    /// </summary>
    public static double TemperatureFromColorIndex(double bMinusV)
    {
        double index = Math.Max(bMinusV, -0.4);
        return 4600 * (1 / (0.92 * index + 1.7) + 1 / (0.92 * index + 0.62));
    }

    /// <summary>
    /// Σ B_λ(T) · (x̄, ȳ, z̄) · Δλ, multiplied by e^(c₂/(λ_last T)) so that the longest wavelength's exponential is 1 and
    /// no term underflows at low T; returns that product and the log of the factor taken out.
    /// </summary>
    private static (CieXyz Scaled, double LogScale) ScaledTristimulus(double temperature)
    {
        double inverseTemperature = 1 / temperature;
        double referenceExponent = ExponentPerKelvin[^1] * inverseTemperature;
        double x = 0, y = 0, z = 0;
        for (int i = 0; i < CieObserver.Count; i++)
        {
            double exponent = ExponentPerKelvin[i] * inverseTemperature;
            double radiance = RadiancePrefactor[i] * Math.Exp(referenceExponent - exponent) / OneMinusExpNegative(exponent);
            x += radiance * CieObserver.Xbar(i);
            y += radiance * CieObserver.Ybar(i);
            z += radiance * CieObserver.Zbar(i);
        }
        double step = CieObserver.StepNm * NanometreInMetres;
        return (new CieXyz(x * step, y * step, z * step), -referenceExponent);
    }

    // Per tabulated wavelength: c₂/λ (Planck's exponent times T) and 2hc²/λ⁵.
    private static readonly double[] ExponentPerKelvin = Enumerable.Range(0, CieObserver.Count)
        .Select(i => SecondRadiationConstant / (CieObserver.WavelengthNm(i) * NanometreInMetres)).ToArray();
    private static readonly double[] RadiancePrefactor = Enumerable.Range(0, CieObserver.Count)
        .Select(i => FirstRadiationConstant / Math.Pow(CieObserver.WavelengthNm(i) * NanometreInMetres, 5)).ToArray();

    /// <summary>1 − e^(−x) without cancellation for small x (the hot, Rayleigh–Jeans end).</summary>
    private static double OneMinusExpNegative(double x) =>
        x < 1e-3 ? x * (1 - x / 2 * (1 - x / 3 * (1 - x / 4))) : 1 - Math.Exp(-x);
}
