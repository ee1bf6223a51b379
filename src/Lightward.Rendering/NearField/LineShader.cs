using System.Numerics;
using Lightward.Optics;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Colour of a grid line seen with Doppler factor D, in exposed (display-linear) units. The grid is a guide drawn on
/// the picture, not a light source, so it has no radiance of its own to meter: its hue is that of a blackbody at
/// D·T (as a glowing lattice would show), and its brightness follows that blackbody's luminance ratio
/// L(D·T) / L(T) — brighter ahead, fainter behind, as real light would — softly limited to
/// ±<see cref="StopsLimit"/> stops around <see cref="SpaceGrid.Brightness"/> (s ↦ S·tanh(s/S)), so that a line
/// never burns out to white and never drops out of sight, whatever the exposure.
/// </summary>
internal readonly struct LineShader
{
    /// <summary>Largest brightening or dimming of a line by the Doppler factor, stops (common practice for a display guide, no published source).</summary>
    public const double StopsLimit = 3;

    /// <summary>
    /// The limited brightening 2^(S·tanh(s/S)) tabulated over s ∈ [−<see cref="TabulatedStops"/>,
    /// +<see cref="TabulatedStops"/>], <see cref="EntriesPerStop"/> entries a stop, each with its step to the next. A
    /// grid samples it for every point it traces, and worked out there its power and hyperbolic tangent (with the
    /// logarithm of D) cost about as much as the rest of a point's sight. Read linearly between entries it is within
    /// 2·10⁻⁵ of the curve (relative), and past the ends the curve is within 10⁻⁶ of its limits.
    /// </summary>
    private static readonly float[] Brightening = TabulateBrightening();
    private const int TabulatedStops = 24, EntriesPerStop = 64, LastEntry = 2 * TabulatedStops * EntriesPerStop;
    /// <summary>Stops (factors of 2) in a unit of natural logarithm, 1 / ln 2: a constant, not a logarithm per traced point.</summary>
    private const float StopsPerNeper = 1.44269504f;

    private readonly float _logTemperature;
    private readonly float _restLogLuminance;
    private readonly float _level;

    public LineShader(double temperature, double level)
    {
        _logTemperature = (float)Math.Log(temperature);
        _restLogLuminance = BlackbodyTable.Shared.Sample(_logTemperature, out _, out _, out _);
        _level = (float)level;
    }

    /// <summary>Exposed linear sRGB of a line seen with Doppler factor <paramref name="doppler"/>.</summary>
    public Vector3 Shade(double doppler)
    {
        // Below the table's coldest entry a blackbody is black; the line keeps that entry's deep red at the dimmest level.
        float logTemperature = MathF.Max(_logTemperature + (float)Math.Log(doppler), (float)BlackbodyTable.LogTemperatureMin);
        float logLuminance = BlackbodyTable.Shared.Sample(logTemperature, out float r, out float g, out float b);
        float brightness = _level * LimitedBrightening((logLuminance - _restLogLuminance) * StopsPerNeper);
        return float.IsFinite(brightness) ? brightness * new Vector3(r, g, b) : Vector3.Zero;
    }

    /// <summary>2^(S·tanh(s/S)) for <paramref name="stops"/> s, read from <see cref="Brightening"/> (NaN reads as the dimmest).</summary>
    internal static float LimitedBrightening(float stops)
    {
        float position = (stops + TabulatedStops) * EntriesPerStop;
        if (!(position > 0)) return Brightening[0];
        if (!(position < LastEntry)) return Brightening[2 * LastEntry];
        int index = (int)position;
        return Brightening[2 * index] + (position - index) * Brightening[2 * index + 1];
    }

    /// <summary>The curve at each entry, then its step to the next, side by side.</summary>
    private static float[] TabulateBrightening()
    {
        static double Curve(int entry) => Math.Pow(2, StopsLimit * Math.Tanh(((double)entry / EntriesPerStop - TabulatedStops) / StopsLimit));
        var table = new float[2 * LastEntry + 2];
        for (int entry = 0; entry <= LastEntry; entry++)
        {
            table[2 * entry] = (float)Curve(entry);
            table[2 * entry + 1] = (float)(Curve(entry + 1) - Curve(entry));
        }
        return table;
    }
}
