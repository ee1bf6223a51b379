namespace Lightward.Rendering;

/// <summary>
/// Rows of guides drawn on the picture rather than into the HDR frame (the grid of space): per pixel, 8-bit display
/// codes for red, green and blue already multiplied by the pixel's coverage, and the coverage, packed as
/// R | G &lt;&lt; 8 | B &lt;&lt; 16 | coverage &lt;&lt; 24 (premultiplied, as in Porter &amp; Duff, "Compositing
/// Digital Images", SIGGRAPH 1984), with a mark per <see cref="HdrFrame.GroupWidth"/>-pixel group drawn into. The
/// tone map lays each marked group over what it writes there (display = overlay + (1 − coverage) × tone-mapped, per
/// channel), so a guide costs its own pixels and not a tone map of theirs, and empties the group as it goes.
/// Reused from band to band (all zero and unmarked between them); only a change of size reallocates.
/// </summary>
public sealed class DisplayOverlay
{
    public DisplayOverlay(int width, int height)
    {
        if (width <= 0 || height <= 0) throw new ArgumentOutOfRangeException(nameof(width), "overlay size must be positive");
        Width = width;
        Height = height;
        GroupsPerRow = (width + HdrFrame.GroupWidth - 1) / HdrFrame.GroupWidth;
        Pixels = new uint[width * height];
        Marks = new byte[GroupsPerRow * height];
    }

    public int Width { get; }
    public int Height { get; }
    public int GroupsPerRow { get; }

    /// <summary>Premultiplied display codes and coverage, row-major (see the class summary).</summary>
    public uint[] Pixels { get; }

    /// <summary>Per row, one byte per group of pixels: nonzero where something was drawn since the last tone map.</summary>
    public byte[] Marks { get; }

    /// <summary>Coverage of pixel (<paramref name="x"/>, <paramref name="y"/>), 0–255.</summary>
    public byte Coverage(int x, int y) => (byte)(Pixels[y * Width + x] >> 24);

    /// <summary>The premultiplied display code of one channel (0 red, 1 green, 2 blue) of pixel (<paramref name="x"/>, <paramref name="y"/>).</summary>
    public byte Code(int x, int y, int channel) => (byte)(Pixels[y * Width + x] >> (8 * channel));
}
