using System.Numerics;

namespace Lightward.Rendering.Projections;

/// <summary>
/// atan2 for the per-star projection loops, a vector of directions at a time (the runtime has no vector arctangent).
/// The angle is folded into the first octant, a = min(|x|, |y|) / max(|x|, |y|) ∈ [0, 1], where
/// atan a = a (1 + Σ c_k a^2k) by Abramowitz &amp; Stegun, Handbook of Mathematical Functions (1964), eq. 4.4.49
/// (|error| ≤ 2 × 10⁻⁸ rad), and unfolded by which of |x|, |y| is larger and by the signs, as Math.Atan2 does.
/// In single precision it stays within a few 10⁻⁷ rad of Math.Atan2 (tested): a hundredth of a pixel even on a
/// 16384-pixel equirectangular image.
/// </summary>
public static class VectorAngles
{
    // Abramowitz & Stegun 4.4.49: a2 … a16.
    private const float C2 = -0.3333314528f, C4 = 0.1999355085f, C6 = -0.1420889944f, C8 = 0.1065626393f;
    private const float C10 = -0.0752896400f, C12 = 0.0429096138f, C14 = -0.0161657367f, C16 = 0.0028662257f;

    /// <summary>The angle of (x, y) from the +x axis, in (−π, π], lane by lane; NaN in either gives NaN.</summary>
    public static Vector<float> Atan2(Vector<float> y, Vector<float> x)
    {
        Vector<float> absX = Vector.Abs(x), absY = Vector.Abs(y);
        Vector<float> larger = Vector.Max(absX, absY), smaller = Vector.Min(absX, absY);
        // 0/0 at the origin: atan2(±0, +0) = ±0 and atan2(±0, −0) = ±π, as Math.Atan2 gives.
        Vector<float> a = Vector.ConditionalSelect(Vector.GreaterThan(larger, Vector<float>.Zero), smaller / larger, Vector<float>.Zero);
        Vector<float> s = a * a;
        Vector<float> series = new Vector<float>(C16) * s + new Vector<float>(C14);
        series = series * s + new Vector<float>(C12);
        series = series * s + new Vector<float>(C10);
        series = series * s + new Vector<float>(C8);
        series = series * s + new Vector<float>(C6);
        series = series * s + new Vector<float>(C4);
        series = series * s + new Vector<float>(C2);
        Vector<float> angle = a + a * s * series;
        angle = Vector.ConditionalSelect(Vector.GreaterThan(absY, absX), new Vector<float>(MathF.PI / 2) - angle, angle);
        // x's sign bit, so that −0 counts as negative.
        angle = Vector.ConditionalSelect(Vector.LessThan(x.As<float, int>(), Vector<int>.Zero), new Vector<float>(MathF.PI) - angle, angle);
        angle = Vector.CopySign(angle, y);
        // x == x and y == y fail only for NaN, which must not come out as an angle.
        return Vector.ConditionalSelect(Vector.Equals(x, x) & Vector.Equals(y, y), angle, new Vector<float>(float.NaN));
    }
}
