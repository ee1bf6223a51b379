namespace Lightward.Rendering;

/// <summary>
/// The sRGB transfer function of IEC 61966-2-1:1999 (§5.2 and §5.3): a linear segment near black joined to a
/// 1/2.4 power law, V = 12.92 L for L ≤ 0.0031308, else V = 1.055 L^(1/2.4) − 0.055.
/// </summary>
public static class SrgbTransfer
{
    public static double Encode(double linear) =>
        linear <= 0.0031308 ? 12.92 * linear : 1.055 * Math.Pow(linear, 1 / 2.4) - 0.055;

    public static double Decode(double encoded) =>
        encoded <= 0.04045 ? encoded / 12.92 : Math.Pow((encoded + 0.055) / 1.055, 2.4);
}
