using System.Numerics;
using Lightward.Optics;
using Lightward.Rendering.NearField;

namespace Lightward.Rendering.Tests.NearField;

public class LineShaderTests
{
    [Fact]
    public void TabulatedBrighteningFollowsTheLimitingCurve()
    {
        // The curve 2^(S·tanh(s/S)) is our own display rule (common practice for a guide, no published source); the
        // check is that the table reproduces it: within 2·10⁻⁵ (relative) everywhere, the
        // table's ends included.
        for (double stops = -40; stops <= 40; stops += 0.0037)
        {
            double curve = Math.Pow(2, LineShader.StopsLimit * Math.Tanh(stops / LineShader.StopsLimit));
            Assert.InRange(LineShader.LimitedBrightening((float)stops) / curve - 1, -2e-5, 2e-5);
        }
        Assert.Equal(LineShader.LimitedBrightening(float.NegativeInfinity), LineShader.LimitedBrightening(float.NaN));
        Assert.True(LineShader.LimitedBrightening(float.PositiveInfinity) <= Math.Pow(2, LineShader.StopsLimit));
    }

    [Theory]
    [InlineData(6500, 0.25, 1.0)]
    [InlineData(6500, 0.25, 0.1)]
    [InlineData(4000, 1.0, 7.0)]
    [InlineData(6500, 0.25, 1e5)]
    public void ShadeIsTheShiftedBlackbodyHueAtTheLimitedBrightening(double temperature, double level, double doppler)
    {
        // Hue: a blackbody at D·T (the table Optics tests against CIE 15); brightness: level × the curve above at the
        // blackbody's luminance ratio in stops, written out here the long way.
        var shader = new LineShader(temperature, level);
        float restLog = BlackbodyTable.Shared.Sample((float)Math.Log(temperature), out _, out _, out _);
        float shiftedLog = BlackbodyTable.Shared.Sample((float)Math.Log(temperature) + (float)Math.Log(doppler), out float r, out float g, out float b);
        double stops = (shiftedLog - restLog) / Math.Log(2);
        double brightness = level * Math.Pow(2, LineShader.StopsLimit * Math.Tanh(stops / LineShader.StopsLimit));
        Vector3 shade = shader.Shade(doppler);
        Assert.Equal(brightness * r, shade.X, 5e-5 * brightness);
        Assert.Equal(brightness * g, shade.Y, 5e-5 * brightness);
        Assert.Equal(brightness * b, shade.Z, 5e-5 * brightness);
    }
}
