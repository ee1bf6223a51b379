using System.Numerics;
using Lightward.Rendering.Projections;

namespace Lightward.Rendering.Tests;

/// <summary>
/// The vector arctangent used by the equirectangular and dome projections, against the runtime's double-precision
/// Math.Atan2 (IEEE 754 atan2, the reference library here) over every direction of the circle and the signed zeros.
/// </summary>
public class VectorAnglesTests
{
    [Fact]
    public void Atan2_matches_the_double_precision_reference_around_the_circle()
    {
        var ys = new List<float>();
        var xs = new List<float>();
        foreach (float radius in new[] { 1e-30f, 1e-3f, 1f, 7.5f, 1e20f })
            for (int step = 0; step < 7200; step++)
            {
                double angle = -Math.PI + step * (2 * Math.PI / 7200);
                ys.Add((float)(radius * Math.Sin(angle)));
                xs.Add((float)(radius * Math.Cos(angle)));
            }
        // Exact axes and signed zeros, where atan2 switches branch.
        float[] edges = [0f, -0f, 1f, -1f];
        foreach (float y in edges)
            foreach (float x in edges) { ys.Add(y); xs.Add(x); }
        while (ys.Count % Vector<float>.Count != 0) { ys.Add(0.25f); xs.Add(-3f); }

        double worst = 0;
        for (int i = 0; i < ys.Count; i += Vector<float>.Count)
        {
            Vector<float> angles = VectorAngles.Atan2(new Vector<float>(ys.ToArray(), i), new Vector<float>(xs.ToArray(), i));
            for (int lane = 0; lane < Vector<float>.Count; lane++)
                worst = Math.Max(worst, Math.Abs(angles[lane] - Math.Atan2(ys[i + lane], xs[i + lane])));
        }
        // Abramowitz & Stegun eq. 4.4.49 errs by ≤ 2e-8 rad; single-precision rounding adds a few 1e-7 near ±π.
        Assert.InRange(worst, 0, 5e-7);
    }

    [Fact]
    public void Atan2_keeps_the_signs_of_zero_and_is_nan_for_nan()
    {
        Vector<float> Angle(float y, float x) => VectorAngles.Atan2(new Vector<float>(y), new Vector<float>(x));
        // IEEE 754 atan2 special cases (as Math.Atan2 returns them).
        Assert.Equal(0f, Angle(0f, 0f)[0]);
        Assert.True(float.IsNegative(Angle(-0f, 0f)[0]));
        Assert.Equal(MathF.PI, Angle(0f, -0f)[0]);
        Assert.Equal(-MathF.PI, Angle(-0f, -0f)[0]);
        Assert.True(float.IsNaN(Angle(float.NaN, 1f)[0]));
        Assert.True(float.IsNaN(Angle(1f, float.NaN)[0]));
    }
}
