namespace Lightward.Rendering;

/// <summary>
/// The high-dynamic-range accumulation buffer: planar linear-sRGB floats, row-major, one plane per channel, in units
/// where a V = 0 star landing on the projection's reference pixel sums to luminance 1 (radiance × reference pixel
/// solid angle). Reused across frames; only a change of size reallocates.
/// </summary>
public sealed class HdrFrame
{
    public HdrFrame(int width, int height)
    {
        if (width <= 0 || height <= 0) throw new ArgumentOutOfRangeException(nameof(width), "frame size must be positive");
        Width = width;
        Height = height;
        Red = new float[width * height];
        Green = new float[width * height];
        Blue = new float[width * height];
    }

    public int Width { get; }
    public int Height { get; }
    public float[] Red { get; }
    public float[] Green { get; }
    public float[] Blue { get; }

    /// <summary>Zeroes rows [<paramref name="firstRow"/>, <paramref name="endRow"/>) of every channel.</summary>
    public void ClearRows(int firstRow, int endRow)
    {
        int start = firstRow * Width, length = (endRow - firstRow) * Width;
        Array.Clear(Red, start, length);
        Array.Clear(Green, start, length);
        Array.Clear(Blue, start, length);
    }

    /// <summary>Adds linear RGB to one pixel (for layers that draw a few pixels; hot loops index the planes directly).</summary>
    public void Add(int x, int y, float red, float green, float blue)
    {
        int index = y * Width + x;
        Red[index] += red;
        Green[index] += green;
        Blue[index] += blue;
    }

    /// <summary>Photopic luminance of a pixel (IEC 61966-2-1 / ITU-R BT.709 weights).</summary>
    public float Luminance(int x, int y)
    {
        int index = y * Width + x;
        return ColorWeights.Red * Red[index] + ColorWeights.Green * Green[index] + ColorWeights.Blue * Blue[index];
    }
}

/// <summary>Luminance weights of linear sRGB primaries, ITU-R BT.709 / IEC 61966-2-1: Y = 0.2126 R + 0.7152 G + 0.0722 B.</summary>
public static class ColorWeights
{
    public const float Red = 0.2126f, Green = 0.7152f, Blue = 0.0722f;
}
