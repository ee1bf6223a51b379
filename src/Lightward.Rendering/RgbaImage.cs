namespace Lightward.Rendering;

/// <summary>
/// An 8-bit sRGB image, 4 bytes per pixel in memory order R, G, B, A (alpha 255), rows top to bottom.
/// <para>
/// The renderer keeps a note of which pixel groups of a star field it left lit, so the next frame need only write
/// black over those instead of over the whole image (most of a star field is black, and writing 8 MB of black per
/// 1080p frame costs about as much memory bandwidth as everything else). The note holds only while nobody else has
/// had the pixels to write: taking <see cref="Pixels"/> drops it; code that only reads uses <see cref="ReadOnlyPixels"/>.
/// </para>
/// </summary>
public sealed class RgbaImage
{
    /// <summary>Groups of <see cref="HdrFrame.GroupWidth"/> pixels noted per entry of <see cref="LitGroups"/>.</summary>
    internal const int GroupsPerLitEntry = 16;

    /// <summary>
    /// The pixels' memory: a pinned array with room to start the image on a 64-byte boundary (<see cref="_offset"/>
    /// bytes in), so that each row of an image whose width is a multiple of 16 pixels starts a cache line and the tone
    /// map can write whole lines without first reading them in.
    /// </summary>
    private readonly byte[] _memory;
    private readonly int _offset, _length;

    /// <summary>Bytes per cache line, the alignment of the first pixel.</summary>
    internal const int LineBytes = 64;

    public unsafe RgbaImage(int width, int height)
    {
        if (width <= 0 || height <= 0) throw new ArgumentOutOfRangeException(nameof(width), "image size must be positive");
        Width = width;
        Height = height;
        _length = checked(width * height * 4);
        _memory = GC.AllocateArray<byte>(checked(_length + LineBytes - 1), pinned: true);
        fixed (byte* memory = _memory) _offset = (int)(-(nint)memory & (LineBytes - 1));
        LitEntriesPerRow = (width + GroupsPerLitEntry * HdrFrame.GroupWidth - 1) / (GroupsPerLitEntry * HdrFrame.GroupWidth);
        LitGroups = new ushort[LitEntriesPerRow * ((height + LitBandRows - 1) / LitBandRows * LitBandRows)];
    }

    public int Width { get; }
    public int Height { get; }

    /// <summary>The pixels, to write (or read): taking them drops the renderer's note of which groups are lit.</summary>
    public Span<byte> Pixels
    {
        get
        {
            LitGroupsKnown = false;
            return RendererPixels;
        }
    }

    /// <summary>The pixels, to read only: the renderer's note stays.</summary>
    public ReadOnlySpan<byte> ReadOnlyPixels => RendererPixels;

    /// <summary>The pixels for the renderer, which keeps <see cref="LitGroups"/> true itself; they start on a <see cref="LineBytes"/> boundary.</summary>
    internal Span<byte> RendererPixels => _memory.AsSpan(_offset, _length);

    /// <summary>
    /// Per row, one entry per <see cref="GroupsPerLitEntry"/> groups: bit g set unless group g of the entry is known
    /// to be all black. Meaningful only while <see cref="LitGroupsKnown"/>. Laid out band by band of
    /// <see cref="LitBandRows"/> rows, and within a band entry column by entry column, so that a star tile's rows
    /// are one run of entries (see <see cref="LitEntry"/>).
    /// </summary>
    internal ushort[] LitGroups { get; }

    internal int LitEntriesPerRow { get; }

    /// <summary>Rows of a band of the note of lit groups: a star tile's height.</summary>
    internal const int LitBandRows = StarSplatter.BandHeight;

    /// <summary>Where entry <paramref name="entry"/> of the band's first row <paramref name="bandFirstRow"/> (a multiple of <see cref="LitBandRows"/>) is; row r of the band follows at + r.</summary>
    internal int LitEntry(int bandFirstRow, int entry) => bandFirstRow * LitEntriesPerRow + entry * LitBandRows;

    /// <summary>True while the pixels are exactly as the renderer's last tone map left them, so that <see cref="LitGroups"/> holds.</summary>
    internal bool LitGroupsKnown { get; set; }

    /// <summary>(R, G, B) of one pixel.</summary>
    public (byte R, byte G, byte B) this[int x, int y]
    {
        get
        {
            ReadOnlySpan<byte> pixel = ReadOnlyPixels.Slice((y * Width + x) * 4, 3);
            return (pixel[0], pixel[1], pixel[2]);
        }
    }
}
