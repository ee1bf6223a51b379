namespace Lightward.Rendering;

/// <summary>An 8-bit sRGB image, 4 bytes per pixel in memory order R, G, B, A (alpha 255), rows top to bottom.</summary>
public sealed class RgbaImage
{
    public RgbaImage(int width, int height)
    {
        if (width <= 0 || height <= 0) throw new ArgumentOutOfRangeException(nameof(width), "image size must be positive");
        Width = width;
        Height = height;
        Pixels = new byte[checked(width * height * 4)];
    }

    public int Width { get; }
    public int Height { get; }
    public byte[] Pixels { get; }

    /// <summary>(R, G, B) of one pixel.</summary>
    public (byte R, byte G, byte B) this[int x, int y]
    {
        get
        {
            int offset = (y * Width + x) * 4;
            return (Pixels[offset], Pixels[offset + 1], Pixels[offset + 2]);
        }
    }
}
