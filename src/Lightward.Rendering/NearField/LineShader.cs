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
        double stops = (logLuminance - _restLogLuminance) / Math.Log(2);
        float brightness = _level * (float)Math.Pow(2, StopsLimit * Math.Tanh(stops / StopsLimit));
        return float.IsFinite(brightness) ? brightness * new Vector3(r, g, b) : Vector3.Zero;
    }
}
