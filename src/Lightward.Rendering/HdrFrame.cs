using System.Runtime.CompilerServices;

namespace Lightward.Rendering;

/// <summary>
/// The high-dynamic-range accumulation buffer: planar linear-sRGB floats, row-major, one plane per channel, in units
/// where a V = 0 star landing on the projection's reference pixel sums to luminance 1 (radiance × reference pixel
/// solid angle). Reused across frames; only a change of size reallocates.
/// Writers record what they touched, so the tone map reads only those pixels and writes black elsewhere: a stage that
/// adds a few pixels marks their <see cref="GroupWidth"/>-pixel groups (<see cref="MarkTouched"/>); a stage that
/// writes everywhere, or does not keep track, sets <see cref="WhollyTouched"/>.
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
        GroupsPerRow = (width + GroupWidth - 1) / GroupWidth;
        Touched = new byte[GroupsPerRow * height];
    }

    /// <summary>Pixels per coverage group: the tone map's vector width.</summary>
    public const int GroupWidth = 8;

    public int Width { get; }
    public int Height { get; }
    public float[] Red { get; }
    public float[] Green { get; }
    public float[] Blue { get; }

    public int GroupsPerRow { get; }

    /// <summary>Per row, one byte per group of <see cref="GroupWidth"/> pixels: nonzero where light may have been added since the last tone map.</summary>
    public byte[] Touched { get; }

    /// <summary>True once a stage has written without marking groups: the next tone map then reads every pixel.</summary>
    public bool WhollyTouched { get; set; }

    /// <summary>Marks columns [<paramref name="firstColumn"/>, <paramref name="endColumn"/>) of <paramref name="row"/> (non-empty, inside the frame) as touched.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void MarkTouched(int row, int firstColumn, int endColumn)
    {
        int rowStart = row * GroupsPerRow;
        for (int group = firstColumn / GroupWidth; group <= (endColumn - 1) / GroupWidth; group++) Touched[rowStart + group] = 1;
    }

    /// <summary>Zeroes rows [<paramref name="firstRow"/>, <paramref name="endRow"/>) of every channel.</summary>
    public void ClearRows(int firstRow, int endRow)
    {
        int start = firstRow * Width, length = (endRow - firstRow) * Width;
        Array.Clear(Red, start, length);
        Array.Clear(Green, start, length);
        Array.Clear(Blue, start, length);
        Array.Clear(Touched, firstRow * GroupsPerRow, (endRow - firstRow) * GroupsPerRow);
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
