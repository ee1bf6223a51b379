using System.Numerics;
using Lightward.Optics;

namespace Lightward.Rendering.NearField;

/// <summary>
/// Turns a rest-frame blackbody surface into HDR frame values for a given Doppler factor: the camera sees a
/// blackbody at D·T whose luminance is the rest luminance × L_bb(D·T) / L_bb(T) (I_ν/ν³ invariance, Rybicki &amp;
/// Lightman 1979, ch. 4, as in <see cref="Beaming"/>), converted to radiance in V = 0 units per steradian
/// (<see cref="Photometry"/>) and multiplied by the projection's reference pixel solid angle, as the HDR frame expects.
/// </summary>
public readonly struct SurfaceShader
{
    private readonly float _logTemperature;
    private readonly float _logValueAtRest;
    private readonly float _restLogBlackbody;

    private SurfaceShader(double temperature, double logValueAtRest)
    {
        _logTemperature = (float)Math.Log(temperature);
        _logValueAtRest = (float)logValueAtRest;
        _restLogBlackbody = BlackbodyTable.Shared.Sample(_logTemperature, out _, out _, out _);
    }

    /// <summary>A surface of rest-frame <paramref name="luminance"/> (cd/m²) drawn on a projection with the given reference pixel.</summary>
    public static SurfaceShader OfLuminance(double temperature, double luminance, double referencePixelSolidAngle) =>
        new(temperature, Photometry.LogRadianceOfLogLuminance(Math.Log(luminance)) + Math.Log(referencePixelSolidAngle));

    /// <summary>HDR value (linear sRGB) of a surface element with unit tint seen with Doppler factor <paramref name="doppler"/>.</summary>
    public Vector3 Shade(double doppler)
    {
        float logBlackbody = BlackbodyTable.Shared.Sample(_logTemperature + (float)Math.Log(doppler), out float r, out float g, out float b);
        float value = MathF.Exp(_logValueAtRest + logBlackbody - _restLogBlackbody);
        return float.IsFinite(value) ? value * new Vector3(r, g, b) : Vector3.Zero;
    }
}
