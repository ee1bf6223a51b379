using System.Globalization;
using Lightward.Spacetime;

namespace Lightward.Rendering.Instruments;

/// <summary>Formats instrument values with units, switching to larger units as values grow.</summary>
public static class Readout
{
    private static readonly CultureInfo Invariant = CultureInfo.InvariantCulture;

    /// <summary>A clock: h:mm:ss.s below a day, then days, then Julian years.</summary>
    public static string Clock(double seconds)
    {
        string sign = seconds < 0 ? "-" : "";
        double s = Math.Abs(seconds);
        if (s >= Units.JulianYear) return sign + (s / Units.JulianYear).ToString("0.000000", Invariant) + " yr";
        if (s >= Units.Day) return sign + (s / Units.Day).ToString("0.0000", Invariant) + " d";
        var span = TimeSpan.FromSeconds(s);
        return sign + string.Create(Invariant, $"{(int)span.TotalHours}:{span.Minutes:00}:{span.Seconds:00}.{span.Milliseconds / 100}");
    }

    /// <summary>A distance in km, au, or light-years, whichever reads best.</summary>
    public static string Distance(double lightSeconds)
    {
        double au = Units.AstronomicalUnitMetres / Units.SpeedOfLight;
        if (lightSeconds < 0.01 * au) return (lightSeconds / Units.Kilometre).ToString("N0", Invariant) + " km";
        if (lightSeconds < 0.05 * Units.LightYear) return (lightSeconds / au).ToString("0.000", Invariant) + " au";
        return (lightSeconds / Units.LightYear).ToString("0.0000", Invariant) + " ly";
    }

    /// <summary>β with enough digits to see it approach 1; past 0.999 the distance to c is shown as 1 − β.</summary>
    public static string Beta(double beta, double oneMinusBeta) =>
        oneMinusBeta < 1e-3 ? "1 - " + oneMinusBeta.ToString("0.000E+0", Invariant) : beta.ToString("0.000000", Invariant);

    public static string Number(double value) =>
        Math.Abs(value) is >= 1e5 or (< 1e-3 and > 0) ? value.ToString("0.000E+0", Invariant) : value.ToString("0.0000", Invariant);

    public static string Degrees(double radians) => (radians * 180 / Math.PI).ToString("+0.0;-0.0", Invariant) + "°";

    public static string Acceleration(double properAcceleration) => (properAcceleration / Units.G).ToString("0.00", Invariant) + " g";

    public static string Percent(double fraction) => (fraction * 100).ToString("0", Invariant) + "%";
}
