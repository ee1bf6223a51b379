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

    // Pinned (never moved by the collector) so SIMD gathers can address them directly.
    /// <summary>ln of luminance in cd/m², and its step to the next entry.</summary>
    public float[] LogLuminance { get; } = GC.AllocateArray<float>(Length, pinned: true);
    public float[] LogLuminanceSlope { get; } = GC.AllocateArray<float>(Length, pinned: true);
    /// <summary>Linear sRGB of unit luminance, and the steps to the next entry.</summary>
    public float[] R { get; } = GC.AllocateArray<float>(Length, pinned: true);
    public float[] G { get; } = GC.AllocateArray<float>(Length, pinned: true);
    public float[] B { get; } = GC.AllocateArray<float>(Length, pinned: true);
    public float[] RSlope { get; } = GC.AllocateArray<float>(Length, pinned: true);
    public float[] GSlope { get; } = GC.AllocateArray<float>(Length, pinned: true);
    public float[] BSlope { get; } = GC.AllocateArray<float>(Length, pinned: true);

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
            LogLuminance[i] = (float)logLuminance[i];
            LogLuminanceSlope[i] = (float)(logLuminance[i + 1] - logLuminance[i]);
            R[i] = (float)colors[i].R; RSlope[i] = (float)(colors[i + 1].R - colors[i].R);
            G[i] = (float)colors[i].G; GSlope[i] = (float)(colors[i + 1].G - colors[i].G);
            B[i] = (float)colors[i].B; BSlope[i] = (float)(colors[i + 1].B - colors[i].B);
        }
        // Past the last entry: ln L grows like ln T (Rayleigh–Jeans) and the colour no longer changes.
        LogLuminanceSlope[Length - 1] = (float)LogStep;
        RSlope[Length - 1] = GSlope[Length - 1] = BSlope[Length - 1] = 0;
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
        r = R[index] + colorFraction * RSlope[index];
        g = G[index] + colorFraction * GSlope[index];
        b = B[index] + colorFraction * BSlope[index];
        return LogLuminance[index] + fraction * LogLuminanceSlope[index];
    }
}
