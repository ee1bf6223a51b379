namespace Lightward.Optics;

/// <summary>
/// Blackbody luminance and colour tabulated once over log temperature, for per-star and per-pixel lookups in
/// single precision. Entry i is at ln T = <see cref="LogTemperatureMin"/> + i · <see cref="LogStep"/>; each
/// quantity is stored with its slope to the next entry so a lookup is one multiply-add per channel.
/// Below <see cref="TemperatureMin"/> a blackbody is black to single precision (its visual luminance is below
/// e⁻¹²⁵ of a 5800 K surface); above <see cref="TemperatureMax"/> the Rayleigh–Jeans law holds to 0.02 % in the
/// visible band, so ln L continues with slope 1 in ln T and the colour stays at its blue-white limit.
/// </summary>
public sealed class BlackbodyTable
{
    public const double TemperatureMin = 200;
    public const double TemperatureMax = 1e8;
    public const int Length = 2048;

    public static readonly double LogTemperatureMin = Math.Log(TemperatureMin);
    public static readonly double LogStep = (Math.Log(TemperatureMax) - LogTemperatureMin) / (Length - 1);

    /// <summary>The shared table, built on first use (about a millisecond).</summary>
    public static BlackbodyTable Shared { get; } = new();

    /// <summary>
    /// The entries, <see cref="EntryLength"/> floats each, side by side: ln of luminance in cd/m² and its step to the
    /// next entry, then linear sRGB of unit luminance (R, G, B), each with its step to the next entry (fields
    /// <see cref="LogLuminanceField"/> … <see cref="BSlopeField"/>). A vector loop reads a star's whole entry with one
    /// 32-byte load, where a table per quantity took eight gathers. Pinned (never moved by the collector), so those
    /// loads can address it directly.
    /// </summary>
    public float[] Entries { get; } = GC.AllocateArray<float>(Length * EntryLength, pinned: true);

    public const int EntryLength = 8;
    public const int LogLuminanceField = 0, LogLuminanceSlopeField = 1, RField = 2, RSlopeField = 3, GField = 4, GSlopeField = 5, BField = 6, BSlopeField = 7;

    private BlackbodyTable()
    {
        var logLuminance = new double[Length + 1];
        var colors = new LinearSrgb[Length + 1];
        for (int i = 0; i <= Length; i++)
        {
            double temperature = Math.Exp(LogTemperatureMin + i * LogStep);
            logLuminance[i] = BlackbodyColor.LogLuminance(temperature);
            colors[i] = BlackbodyColor.ColorOfUnitLuminance(temperature);
        }
        for (int i = 0; i < Length; i++)
        {
            Span<float> entry = Entries.AsSpan(i * EntryLength, EntryLength);
            entry[LogLuminanceField] = (float)logLuminance[i];
            entry[LogLuminanceSlopeField] = (float)(logLuminance[i + 1] - logLuminance[i]);
            entry[RField] = (float)colors[i].R; entry[RSlopeField] = (float)(colors[i + 1].R - colors[i].R);
            entry[GField] = (float)colors[i].G; entry[GSlopeField] = (float)(colors[i + 1].G - colors[i].G);
            entry[BField] = (float)colors[i].B; entry[BSlopeField] = (float)(colors[i + 1].B - colors[i].B);
        }
        // Past the last entry: ln L grows like ln T (Rayleigh–Jeans) and the colour no longer changes.
        Span<float> last = Entries.AsSpan((Length - 1) * EntryLength, EntryLength);
        last[LogLuminanceSlopeField] = (float)LogStep;
        last[RSlopeField] = last[GSlopeField] = last[BSlopeField] = 0;
    }

    /// <summary>
    /// Looks up a blackbody at ln T = <paramref name="logTemperature"/>: returns ln of its luminance (cd/m²), or
    /// negative infinity below the table, and its unit-luminance colour.
    /// </summary>
    public float Sample(float logTemperature, out float r, out float g, out float b)
    {
        float position = (logTemperature - (float)LogTemperatureMin) * (float)(1 / LogStep);
        if (!(position >= 0))
        {
            r = g = b = 0;
            return float.NegativeInfinity;
        }
        int index = (int)MathF.Min(position, Length - 1);
        float fraction = position - index;
        float colorFraction = MathF.Min(fraction, 1);
        ReadOnlySpan<float> entry = Entries.AsSpan(index * EntryLength, EntryLength);
        r = entry[RField] + colorFraction * entry[RSlopeField];
        g = entry[GField] + colorFraction * entry[GSlopeField];
        b = entry[BField] + colorFraction * entry[BSlopeField];
        return entry[LogLuminanceField] + fraction * entry[LogLuminanceSlopeField];
    }
}
