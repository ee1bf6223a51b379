using System.Globalization;

namespace Lightward.Spacetime;

/// <summary>
/// Physical constants and unit conversions. Inside the core c = 1, time is in seconds and length in
/// light-seconds, so a speed is β, an acceleration is in 1/s and a rapidity is a plain number.
/// </summary>
public static class Units
{
    /// <summary>Speed of light, m/s (exact, SI 2019).</summary>
    public const double SpeedOfLight = 299_792_458.0;
    /// <summary>Standard gravity, m/s² (CGPM 1901).</summary>
    public const double StandardGravity = 9.80665;
    /// <summary>Julian year, s (IAU: 365.25 d of 86 400 s).</summary>
    public const double JulianYear = 365.25 * 86_400.0;
    /// <summary>Light-year in light-seconds: c × Julian year (IAU).</summary>
    public const double LightYear = JulianYear;
    /// <summary>Astronomical unit, m (IAU 2012 Resolution B2, exact).</summary>
    public const double AstronomicalUnitMetres = 149_597_870_700.0;
    /// <summary>Parsec in light-seconds: 648000/π au (IAU 2015 Resolution B2).</summary>
    public const double Parsec = AstronomicalUnitMetres * 648_000.0 / Math.PI / SpeedOfLight;
    public const double Day = 86_400.0;

    /// <summary>1 g as a proper acceleration in internal units (1/s).</summary>
    public const double G = StandardGravity / SpeedOfLight;
    public const double Kilometre = 1000.0 / SpeedOfLight;
    public const double Metre = 1.0 / SpeedOfLight;
}

public enum Dimension { Length, Time, Speed, Acceleration, Angle, AngularRate, Frequency, Temperature }

/// <summary>A quantity string that cannot be read; the message names the field, the text and what is allowed.</summary>
public sealed class QuantityFormatException(string message) : UserInputException(message);

/// <summary>
/// Reads quantities with explicit units, such as <c>4.2 ly</c>, <c>1 g</c>, <c>0.8 c</c>, <c>30 d</c>,
/// <c>12 km/s</c>, <c>3 yr</c>, and converts them to internal units (c = 1, seconds, light-seconds).
/// </summary>
public static class Quantity
{
    private static readonly Dictionary<Dimension, (string Unit, double Factor)[]> Table = new()
    {
        [Dimension.Length] =
        [
            ("m", Units.Metre), ("km", Units.Kilometre), ("au", Units.AstronomicalUnitMetres / Units.SpeedOfLight),
            ("ls", 1), ("lmin", 60), ("lh", 3600), ("ld", Units.Day), ("ly", Units.LightYear), ("pc", Units.Parsec),
        ],
        [Dimension.Time] =
        [
            ("s", 1), ("min", 60), ("h", 3600), ("d", Units.Day), ("yr", Units.JulianYear), ("y", Units.JulianYear),
        ],
        [Dimension.Speed] = [("c", 1), ("m/s", Units.Metre), ("km/s", Units.Kilometre)],
        [Dimension.Acceleration] = [("g", Units.G), ("m/s^2", Units.Metre), ("m/s2", Units.Metre)],
        [Dimension.Angle] = [("deg", Math.PI / 180), ("rad", 1), ("arcmin", Math.PI / 10800), ("arcsec", Math.PI / 648000)],
        [Dimension.AngularRate] = [("deg/s", Math.PI / 180), ("rad/s", 1), ("rpm", 2 * Math.PI / 60)],
        [Dimension.Frequency] = [("Hz", 1), ("kHz", 1000), ("/s", 1), ("/min", 1.0 / 60)],
        [Dimension.Temperature] = [("K", 1)],
    };

    /// <summary>The units accepted for a dimension, for messages and documentation.</summary>
    public static IReadOnlyList<string> UnitsOf(Dimension dimension) => Table[dimension].Select(u => u.Unit).ToArray();

    /// <summary>Parses "number unit" into internal units, or throws <see cref="QuantityFormatException"/> naming <paramref name="field"/>.</summary>
    public static double Parse(string? text, Dimension dimension, string field)
    {
        if (TryParse(text, dimension, out double value, out string? error)) return value;
        throw new QuantityFormatException($"{field}: {error}");
    }

    public static bool TryParse(string? text, Dimension dimension, out double value, out string? error)
    {
        value = double.NaN;
        string allowed = string.Join(", ", UnitsOf(dimension));
        string trimmed = (text ?? "").Trim();
        if (trimmed.Length == 0)
        {
            error = $"missing value; expected a number with a unit ({allowed})";
            return false;
        }
        int split = 0;
        while (split < trimmed.Length && (char.IsDigit(trimmed[split]) || "+-.eE".Contains(trimmed[split])))
        {
            // An 'e' followed by a letter starts a unit, not an exponent.
            if ((trimmed[split] is 'e' or 'E') && (split + 1 >= trimmed.Length || !(char.IsDigit(trimmed[split + 1]) || trimmed[split + 1] is '+' or '-')))
                break;
            split++;
        }
        string number = trimmed[..split], unit = trimmed[split..].Trim();
        if (!double.TryParse(number, NumberStyles.Float, CultureInfo.InvariantCulture, out double magnitude) || !double.IsFinite(magnitude))
        {
            error = $"'{trimmed}' does not start with a finite number; expected e.g. '1.5 {UnitsOf(dimension)[0]}'";
            return false;
        }
        if (unit.Length == 0)
        {
            error = $"'{trimmed}' has no unit; expected one of {allowed}";
            return false;
        }
        foreach ((string name, double factor) in Table[dimension])
        {
            if (string.Equals(name, unit, StringComparison.Ordinal))
            {
                value = magnitude * factor;
                error = null;
                return true;
            }
        }
        error = $"unknown unit '{unit}' in '{trimmed}'; expected one of {allowed}";
        return false;
    }

    /// <summary>
    /// Reads how fast something goes as a rapidity: a speed below c (<c>0.8 c</c>, <c>12 km/s</c>), a rapidity
    /// (<c>2.5 rapidity</c>) or a Lorentz factor (<c>10 gamma</c>). Rapidity and γ stay exact where β would round to 1.
    /// </summary>
    public static double ParseRapidity(string? text, string field)
    {
        string trimmed = (text ?? "").Trim();
        const string allowed = "a speed below c such as '0.8 c' or '12 km/s', a rapidity such as '2.5 rapidity', or a Lorentz factor such as '10 gamma'";
        foreach ((string suffix, Func<double, double?> toRapidity) in RapidityForms)
        {
            if (!trimmed.EndsWith(suffix, StringComparison.Ordinal)) continue;
            string number = trimmed[..^suffix.Length].Trim();
            if (double.TryParse(number, NumberStyles.Float, CultureInfo.InvariantCulture, out double magnitude) && double.IsFinite(magnitude)
                && toRapidity(magnitude) is double rapidity)
                return rapidity;
            throw new QuantityFormatException($"{field}: '{trimmed}' is not a valid{suffix}; expected {allowed} (rapidity ≥ 0, gamma ≥ 1)");
        }
        if (!TryParse(trimmed, Dimension.Speed, out double speed, out _))
            throw new QuantityFormatException($"{field}: cannot read '{trimmed}'; expected {allowed}");
        if (!(speed >= 0 && speed < 1))
            throw new QuantityFormatException($"{field}: speed '{trimmed}' must be at least 0 and below c; for speeds too close to c to write, use '<n> rapidity' or '<n> gamma'");
        return Math.Atanh(speed);
    }

    private static readonly (string Suffix, Func<double, double?> ToRapidity)[] RapidityForms =
    [
        (" rapidity", r => r >= 0 ? r : null),
        (" gamma", g => g >= 1 ? HyperbolicMath.AcoshOnePlus(g - 1) : null),
    ];

    /// <summary>Formats an internal value in the given unit, e.g. Format(x, Dimension.Length, "ly").</summary>
    public static double In(double internalValue, Dimension dimension, string unit)
    {
        foreach ((string name, double factor) in Table[dimension])
            if (name == unit) return internalValue / factor;
        throw new ArgumentException($"unknown unit '{unit}' for {dimension}");
    }
}
