namespace Lightward.Optics;

/// <summary>CIE 1931 tristimulus values (2° observer).</summary>
public readonly record struct CieXyz(double X, double Y, double Z)
{
    /// <summary>Chromaticity coordinate x = X / (X + Y + Z).</summary>
    public double ChromaticityX => X / (X + Y + Z);
    /// <summary>Chromaticity coordinate y = Y / (X + Y + Z).</summary>
    public double ChromaticityY => Y / (X + Y + Z);

    /// <summary>Tristimulus values of luminance Y = 1 at chromaticity (x, y).</summary>
    public static CieXyz FromChromaticity(double x, double y) => new(x / y, 1, (1 - x - y) / y);
}

/// <summary>
/// Linear (not gamma-encoded) sRGB with the IEC 61966-2-1 primaries and D65 white. Luminance uses the standard's
/// Y row, so R = G = B = 1 is D65 white of luminance 1.
/// </summary>
public readonly record struct LinearSrgb(double R, double G, double B)
{
    public static readonly LinearSrgb Black = new(0, 0, 0);

    public double Luminance => 0.2126 * R + 0.7152 * G + 0.0722 * B;

    public static LinearSrgb operator *(double scale, LinearSrgb c) => new(scale * c.R, scale * c.G, scale * c.B);

    /// <summary>IEC 61966-2-1:1999, eq. (1) inverse: XYZ (D65) → linear sRGB, may leave the gamut (negative channels).</summary>
    public static LinearSrgb FromXyz(CieXyz c) => new(
        3.2406 * c.X - 1.5372 * c.Y - 0.4986 * c.Z,
        -0.9689 * c.X + 1.8758 * c.Y + 0.0415 * c.Z,
        0.0557 * c.X - 0.2040 * c.Y + 1.0570 * c.Z);

    /// <summary>
    /// Brings an out-of-gamut colour into the gamut by mixing it with the grey of the same luminance, just enough
    /// that no channel is negative. The hue stays put and luminance is unchanged, which is what brightness on a dome
    /// must preserve; saturation is what gives way (deep-red blackbodies lie outside the sRGB triangle).
    /// </summary>
    public LinearSrgb DesaturatedIntoGamut()
    {
        double grey = Luminance;
        double lowest = Math.Min(R, Math.Min(G, B));
        if (lowest >= 0 || grey <= 0) return lowest >= 0 ? this : Black;
        double keep = grey / (grey - lowest);
        return new LinearSrgb(grey + keep * (R - grey), grey + keep * (G - grey), grey + keep * (B - grey));
    }
}
