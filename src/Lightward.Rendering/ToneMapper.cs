using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;
// Whether the rows being mapped have a display overlay: the stars-only frame's loops carry no trace of it.
using WithOverlay = Lightward.Rendering.FlagSet;
using WithoutOverlay = Lightward.Rendering.FlagUnset;

namespace Lightward.Rendering;

/// <summary>
/// HDR → display. Each linear channel is scaled by the exposure, compressed by the extended Reinhard curve
/// t = x (1 + x / W²) / (1 + x) (Reinhard et al., "Photographic Tone Reproduction for Digital Images", SIGGRAPH 2002,
/// eq. 4) with white point W = <see cref="White"/>, clipped to 1, and encoded with the IEC 61966-2-1 transfer
/// function to 8-bit sRGB. Applied per channel, the curve keeps faint colours and lets a bright star's channels
/// converge to white as it saturates, instead of clipping it into a flat coloured disc.
/// </summary>
public static class ToneMapper
{
    /// <summary>Exposed linear value that reaches display white.</summary>
    public const float White = 16;

    /// <summary>
    /// The curve and the sRGB encoding are one table indexed by the exposed value's float bits: its exponent and top
    /// <see cref="StepBits"/> mantissa bits, i.e. 256 steps per octave from <see cref="DarkestExposed"/> (whose code,
    /// and every darker value's, is 0) up to <see cref="White"/>. Each entry holds the code at its step's geometric
    /// middle; across a step of 1/256 of an octave the code moves by under a third, so the written code is within
    /// 0.6 of the exact one (tested to within one). No division per pixel, one gather per channel. 1024 steps an
    /// octave came within 0.52, no closer where it shows, with a 20 KB table that crowded a 24 KB star tile in the
    /// first-level cache; the 5 KB table made the 1080p star frame 1–4 % faster in one process.
    /// </summary>
    private const int StepBits = 8;
    private const float DarkestExposed = 1f / 65536;
    private static readonly int FirstStep = BitConverter.SingleToInt32Bits(DarkestExposed) >> (23 - StepBits);
    private static readonly int LastEntry = (BitConverter.SingleToInt32Bits(White) >> (23 - StepBits)) - FirstStep;

    /// <summary>The 8-bit code for each step of exposed values.</summary>
    private static readonly byte[] EncodedTable = BuildEncodedTable();

    /// <summary>Bytes after the last entry, so that a four-byte gather at the last entry stays inside the table.</summary>
    private const int TablePadding = sizeof(int) - 1;

    /// <summary>The tone curve for one exposed linear value, in [0, 1]; the mapper's table holds it, encoded.</summary>
    public static double Curve(double exposed)
    {
        // Clamping the input first keeps huge and infinite values white (the curve is exactly 1 at W); NaN goes to 0.
        double x = exposed > 0 ? Math.Min(exposed, White) : 0;
        return Math.Min(1, x * (1 + x / (White * White)) / (1 + x));
    }

    /// <summary>The 8-bit sRGB code the mapper writes for an exposed linear value (HDR × exposure scale).</summary>
    public static byte Code(float exposed) => EncodedTable[TableIndex(exposed)];

    /// <summary>
    /// Tone maps rows [<paramref name="firstRow"/>, <paramref name="endRow"/>) of <paramref name="hdr"/> into RGBA8
    /// pixels (R, G, B, A bytes in memory order; alpha 255) at <paramref name="rgba"/>, which holds the whole image,
    /// and zeroes those HDR rows while their cache lines are at hand, which saves the next frame a clearing pass.
    /// Unless the frame is <see cref="HdrFrame.WhollyTouched"/>, only the touched pixel groups are read (the rest are
    /// zero, so they map to black and are written as black) and their marks are cleared; <paramref name="lit"/> (laid
    /// out like the image's note of lit groups, from the band holding HDR row 0 of <paramref name="rgba"/>, with
    /// <paramref name="firstRow"/> a band's first; null for none) is used and updated as in <see cref="MapMarkedRows"/>.
    /// The marked groups of <paramref name="overlay"/> (unless null; of the frame's width, its row
    /// <paramref name="overlayFirstRow"/> holding HDR row <paramref name="firstRow"/>) are laid over the mapped pixels
    /// and emptied. The writes are fenced before it returns, so another thread may read the image then.
    /// </summary>
    public static unsafe void MapAndClearRows(HdrFrame hdr, float exposureScale, uint* rgba, ushort* lit, bool litKnown, int firstRow, int endRow,
        DisplayOverlay? overlay = null, int overlayFirstRow = 0)
    {
        if (overlay is not null && (overlay.Width != hdr.Width || overlayFirstRow + endRow - firstRow > overlay.Height))
            throw new ArgumentException("overlay and HDR rows differ in size", nameof(overlay));
        if (lit != null && firstRow % RgbaImage.LitBandRows != 0)
            throw new ArgumentException("rows noted in the image's note of lit groups must start a band", nameof(firstRow));
        fixed (float* red = hdr.Red, green = hdr.Green, blue = hdr.Blue)
        fixed (byte* touched = hdr.Touched)
        fixed (uint* overlayPixels = overlay?.Pixels)
        fixed (byte* overlayMarks = overlay?.Marks)
        {
            // The overlay's pointers shifted so that HDR row r's pixels and marks sit where the HDR planes have them.
            uint* laidPixels = overlay is null ? null : overlayPixels + (long)(overlayFirstRow - firstRow) * hdr.Width;
            byte* laidMarks = overlay is null ? null : overlayMarks + (long)(overlayFirstRow - firstRow) * hdr.GroupsPerRow;
            if (hdr.WhollyTouched)
            {
                int start = firstRow * hdr.Width;
                // Without an overlay the rows are one run; with one, each row starts its groups (and their marks) afresh.
                if (overlay is null) MapAndClear(red + start, green + start, blue + start, rgba + start, (endRow - firstRow) * hdr.Width, exposureScale);
                else
                    for (int row = firstRow; row < endRow; row++, start += hdr.Width)
                        MapAndClear(red + start, green + start, blue + start, rgba + start, hdr.Width, exposureScale, laidPixels + start, laidMarks + row * hdr.GroupsPerRow);
                new Span<byte>(touched + firstRow * hdr.GroupsPerRow, (endRow - firstRow) * hdr.GroupsPerRow).Clear();
                FinishWrites();
                return;
            }
            int litPerRow = (hdr.GroupsPerRow + MarkBlock - 1) / MarkBlock;
            // A few rows at a time, which bounds the masks kept on the stack.
            for (int row = firstRow; row < endRow; row += RowsAtOnce)
            {
                int start = row * hdr.Width;
                var planes = new MarkedPlanes(red + start, green + start, blue + start, hdr.Width, touched + row * hdr.GroupsPerRow, hdr.GroupsPerRow,
                    overlay is null ? null : laidPixels + start, overlay is null ? null : laidMarks + row * hdr.GroupsPerRow);
                MapMarkedRows(planes, rgba + start, hdr.Width, hdr.Width, Math.Min(RowsAtOnce, endRow - row), exposureScale, lit == null ? null : lit + row * litPerRow, litKnown);
            }
            FinishWrites();
        }
    }

    /// <summary>Premultiplied <paramref name="over"/> laid over the opaque pixel <paramref name="under"/>: per channel over + (1 − coverage) × under, rounded.</summary>
    private static uint LayOver(uint over, uint under)
    {
        // The same float steps as LayOverGroup, so that a pixel comes out alike on either path.
        float keep = (255 - (float)(over >> 24)) * (1f / 255);
        uint result = OpaqueBlack;
        for (int shift = 0; shift < 24; shift += 8)
            result |= ((over >> shift & 0xFF) + (uint)MathF.Round((under >> shift & 0xFF) * keep)) << shift;
        return result;
    }

    /// <summary>
    /// <see cref="LayOver"/> for a group of eight pixels at <paramref name="overlay"/>, which it empties; when
    /// <paramref name="underIsBlack"/> the overlay's codes are the result as they are. Premultiplied codes never
    /// exceed their coverage, so no channel's sum passes 255.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe Vector256<int> LayOverGroup(Vector256<int> under, uint* overlay, bool underIsBlack)
    {
        Vector256<int> over = Vector256.Load((int*)overlay), black = Vector256.Create(unchecked((int)OpaqueBlack));
        Vector256<int>.Zero.Store((int*)overlay);
        if (underIsBlack) return over | black;
        Vector256<int> channel = Vector256.Create(0xFF);
        Vector256<float> keep = (Vector256.Create(255f) - Vector256.ConvertToSingle(Vector256.ShiftRightLogical(over, 24))) * Vector256.Create(1f / 255);
        Vector256<int> red = VectorRounding.Round(Vector256.ConvertToSingle(under & channel) * keep);
        Vector256<int> green = VectorRounding.Round(Vector256.ConvertToSingle(Vector256.ShiftRightLogical(under, 8) & channel) * keep);
        Vector256<int> blue = VectorRounding.Round(Vector256.ConvertToSingle(Vector256.ShiftRightLogical(under, 16) & channel) * keep);
        return (over + (red | Vector256.ShiftLeft(green, 8) | Vector256.ShiftLeft(blue, 16))) | black;
    }

    private const uint OpaqueBlack = 0xFF000000u;

    /// <summary>Rows <see cref="MapAndClearRows"/> hands to <see cref="MapMarkedRows"/> at once: a star band's height.</summary>
    private const int RowsAtOnce = RgbaImage.LitBandRows;

    /// <summary>
    /// Rows of HDR planes (<see cref="Stride"/> floats apart) with a mark per <see cref="HdrFrame.GroupWidth"/>-pixel
    /// group (<see cref="MarkStride"/> bytes apart), and the same rows of a display overlay laid out alike (null for none).
    /// </summary>
    internal readonly unsafe struct MarkedPlanes(float* red, float* green, float* blue, int stride, byte* marks, int markStride,
        uint* overlay = null, byte* overlayMarks = null)
    {
        public readonly float* Red = red, Green = green, Blue = blue;
        public readonly int Stride = stride, MarkStride = markStride;
        public readonly byte* Marks = marks;
        public readonly uint* Overlay = overlay;
        public readonly byte* OverlayMarks = overlayMarks;
    }

    /// <summary>
    /// <paramref name="rows"/> rows of <paramref name="width"/> pixels, written to <paramref name="rgba"/> (rows
    /// <paramref name="rgbaStride"/> pixels apart): each marked group is mapped, its HDR values zeroed and its mark
    /// cleared, and every other group is black (what an untouched, all-zero group maps to). When
    /// <paramref name="litKnown"/>, the groups not noted in <paramref name="lit"/> (per row, one entry per
    /// <see cref="RgbaImage.GroupsPerLitEntry"/> groups; laid out as in <see cref="RgbaImage.LitGroups"/>, row r's
    /// block b at r + b × <see cref="RgbaImage.LitBandRows"/>, so at most that many rows) are black
    /// already and only the noted ones are written black; otherwise every group is written. Either way
    /// <paramref name="lit"/> (unless null) is left noting the groups written other than black. Each marked group of
    /// the planes' overlay is laid over its group (mapped, or black) and emptied. Lines written whole go out with
    /// non-temporal stores, which the caller fences (<see cref="FinishWrites"/>) before the image is handed on.
    /// <para>
    /// Marks are scattered (a star touches a few groups), so they are first read into bit masks, 16 groups to a mask,
    /// and the groups to write are then visited four masks at a time: a loop exit the processor cannot predict per 64
    /// groups instead of per row, and the gathers of many groups in flight at once. Where the rows start on cache lines
    /// and span whole lines (see <see cref="MapWholeLines"/>), each line holding a group to write is written whole.
    /// </para>
    /// </summary>
    internal static unsafe void MapMarkedRows(in MarkedPlanes planes, uint* rgba, int rgbaStride, int width, int rows, float exposureScale,
        ushort* lit, bool litKnown)
    {
        if (planes.Overlay == null) MapMarkedRows<WithoutOverlay>(planes, rgba, rgbaStride, width, rows, exposureScale, lit, litKnown);
        else MapMarkedRows<WithOverlay>(planes, rgba, rgbaStride, width, rows, exposureScale, lit, litKnown);
    }

    private static unsafe void MapMarkedRows<TOverlay>(in MarkedPlanes planes, uint* rgba, int rgbaStride, int width, int rows, float exposureScale,
        ushort* lit, bool litKnown) where TOverlay : struct, ITypeFlag
    {
        litKnown &= lit != null;
        int groups = (width + HdrFrame.GroupWidth - 1) / HdrFrame.GroupWidth, blocksPerRow = (groups + MarkBlock - 1) / MarkBlock;
        // Per block of 16 groups: the marked ones, and those to write black, in 64-bit words of four blocks. A row of one
        // block shares a word with the next three rows; longer rows start a word of their own, so a word is in one row.
        int maskRowStride = blocksPerRow == 1 ? 1 : (blocksPerRow + 3) & ~3;
        int paddedBlocks = (rows * maskRowStride + 3) & ~3;
        bool wholeLines = Avx2.IsSupported && HdrFrame.GroupWidth == Vector256<float>.Count && ((nint)rgba & (RgbaImage.LineBytes - 1)) == 0
            && rgbaStride % PixelsPerLine == 0 && width % PixelsPerLine == 0;
        // Otherwise a tile's few dozen output lines are asked for ahead of their writes; a whole band's (about a thousand
        // under the grid of space) would queue behind one another, and asking for them made the near-field frame 7 % slower.
        bool prefetch = !wholeLines && litKnown && blocksPerRow == 1;
        ushort* marked = stackalloc ushort[paddedBlocks], dark = stackalloc ushort[paddedBlocks], laid = stackalloc ushort[TOverlay.IsSet ? paddedBlocks : 0];
        new Span<ushort>(marked, paddedBlocks).Clear();
        new Span<ushort>(dark, paddedBlocks).Clear();
        if (TOverlay.IsSet) new Span<ushort>(laid, paddedBlocks).Clear();
        if (!TOverlay.IsSet && !prefetch && groups == MarkBlock && planes.MarkStride == MarkBlock && rows % 4 == 0) TakeTileMasks(planes.Marks, rows, marked, dark, lit, litKnown);
        else
            for (int row = 0; row < rows; row++)
            {
                uint* rowPixels = rgba + (long)row * rgbaStride;
                byte* rowMarks = planes.Marks + row * planes.MarkStride;
                byte* rowOverlayMarks = planes.OverlayMarks + row * planes.MarkStride;
                ushort* rowLit = lit + row;
                for (int block = 0, at = row * maskRowStride; block < blocksPerRow; block++, at++)
                {
                    int count = Math.Min(MarkBlock, groups - block * MarkBlock);
                    ushort mask = TakeMarks(rowMarks + block * MarkBlock, count);
                    ushort overlaid = TOverlay.IsSet ? TakeMarks(rowOverlayMarks + block * MarkBlock, count) : (ushort)0;
                    marked[at] = mask;
                    if (TOverlay.IsSet) laid[at] = overlaid;
                    dark[at] = (ushort)((litKnown ? rowLit[block * RgbaImage.LitBandRows] : (1u << count) - 1) & ~(mask | overlaid));
                    if (prefetch) PrefetchGroups(rowPixels + block * MarkBlock * HdrFrame.GroupWidth, (uint)(mask | overlaid | dark[at]));
                    if (lit != null) rowLit[block * RgbaImage.LitBandRows] = (ushort)(mask | overlaid);
                }
            }
        var scale = Vector256.Create(exposureScale);
        fixed (byte* table = EncodedTable)
        {
            if (wholeLines)
            {
                MapWholeLines<TOverlay>(planes, rgba, rgbaStride, marked, dark, laid, paddedBlocks, maskRowStride, scale, table);
                return;
            }
            int wholeGroups = width / HdrFrame.GroupWidth;
            bool vectorized = Avx2.IsSupported && HdrFrame.GroupWidth == Vector256<float>.Count;
            for (int word = 0; word < paddedBlocks; word += 4)
            {
                (int wordRow, int wordBlock) = WordStart(word, maskRowStride);
                for (ulong bits = *(ulong*)(dark + word); bits != 0; bits &= bits - 1)
                {
                    (int row, int group) = Locate(wordRow, wordBlock, BitOperations.TrailingZeroCount(bits), maskRowStride);
                    WriteBlack(rgba + (long)row * rgbaStride, group * HdrFrame.GroupWidth, width);
                }
                ulong mappedBits = *(ulong*)(marked + word), laidBits = TOverlay.IsSet ? *(ulong*)(laid + word) : 0;
                for (ulong bits = mappedBits | laidBits; bits != 0; bits &= bits - 1)
                {
                    int bit = BitOperations.TrailingZeroCount(bits);
                    (int row, int group) = Locate(wordRow, wordBlock, bit, maskRowStride);
                    int first = group * HdrFrame.GroupWidth, pixel = row * planes.Stride + first;
                    uint* output = rgba + (long)row * rgbaStride + first;
                    bool mapped = (mappedBits >> bit & 1) != 0, overlaid = (laidBits >> bit & 1) != 0;
                    // An overlay group on an unmarked one is laid over black: its HDR pixels are zero, which map to black.
                    if (vectorized && group < wholeGroups)
                    {
                        Vector256<int> pixels = mapped ? MapGroup(planes.Red + pixel, planes.Green + pixel, planes.Blue + pixel, scale, table) : Vector256.Create(unchecked((int)OpaqueBlack));
                        Avx.Store((int*)output, overlaid ? LayOverGroup(pixels, planes.Overlay + pixel, underIsBlack: !mapped) : pixels);
                        continue;
                    }
                    // The group's overlay mark was taken into the masks above; a mark of its own tells the partial group's mapping.
                    byte laidMark = overlaid ? (byte)1 : (byte)0;
                    MapAndClear(planes.Red + pixel, planes.Green + pixel, planes.Blue + pixel, output, Math.Min(HdrFrame.GroupWidth, width - first), exposureScale,
                        overlaid ? planes.Overlay + pixel : null, overlaid ? &laidMark : null);
                }
            }
        }
    }

    /// <summary>
    /// Makes the whole lines written so far with non-temporal stores (see <see cref="MapWholeLines"/>) visible to
    /// other threads: such stores are weakly ordered, so a thread must fence them before it hands the image on. The
    /// fence waits for them to reach memory, so it goes once per band or once per thread, not after every tile (where
    /// the next tile's stores waited on it: the 1080p star frame 0.94–0.95× without).
    /// </summary>
    internal static void FinishWrites()
    {
        if (Sse.IsSupported) Sse.StoreFence();
    }

    /// <summary>RGBA pixels per cache line: two groups.</summary>
    private const int PixelsPerLine = RgbaImage.LineBytes / sizeof(uint);

    /// <summary>
    /// The output written a cache line at a time: every line that holds a group to map or to blacken is written whole
    /// with non-temporal stores, its other group (mapped if marked, else black, which is what an unmarked group
    /// holds) beside it. A line written whole need not be read in first, which a partial write must wait for: the
    /// lines a frame writes were last written a frame ago and are far from the core by now (on a 2-core AMD EPYC this
    /// took 3–4 % off the 1080p star frame at rest and 7–10 % off a turning one). Needs rows that start on lines. The
    /// caller fences these stores (<see cref="FinishWrites"/>) once it has written its band.
    /// </summary>
    private static unsafe void MapWholeLines<TOverlay>(in MarkedPlanes planes, uint* rgba, int rgbaStride, ushort* marked, ushort* dark, ushort* laid, int paddedBlocks,
        int maskRowStride, Vector256<float> scale, byte* table) where TOverlay : struct, ITypeFlag
    {
        const ulong FirstOfEachPair = 0x5555_5555_5555_5555;
        // The planes' pointers in locals: read through the struct, they were fetched again for every group, since the
        // stores into the planes might have changed them as far as the compiler knows.
        float* red = planes.Red, green = planes.Green, blue = planes.Blue;
        uint* overlay = planes.Overlay;
        int planeStride = planes.Stride;
        // From a word's first group to the next block's: a row down when rows are a block each, else along the row.
        int planeBlockStep = maskRowStride == 1 ? planeStride : MarkBlock * HdrFrame.GroupWidth;
        int imageBlockStep = maskRowStride == 1 ? rgbaStride : MarkBlock * HdrFrame.GroupWidth;
        var black = Vector256.Create(unchecked((int)OpaqueBlack));
        for (int word = 0; word < paddedBlocks; word += 4)
        {
            (int wordRow, int wordBlock) = WordStart(word, maskRowStride);
            int wordFirstPixel = wordBlock * MarkBlock * HdrFrame.GroupWidth;
            int wordPixel = wordRow * planeStride + wordFirstPixel;
            int* wordLine = (int*)(rgba + (long)wordRow * rgbaStride + wordFirstPixel);
            ulong mapped = *(ulong*)(marked + word), overlaid = TOverlay.IsSet ? *(ulong*)(laid + word) : 0, written = mapped | overlaid | *(ulong*)(dark + word);
            // Bit 2k stands for the line of groups 2k and 2k + 1; a block holds 16 groups, so no line spans two blocks.
            ulong mappedLines = (mapped | mapped >> 1) & FirstOfEachPair;
            // Lines without a group to map first: black under the overlay's codes, and since an unmarked overlay group is
            // empty, that is the overlay's two groups as they are (made opaque) whichever of them is marked. Taken
            // apart from the mapped lines they need no test per group (the turning star frame, which blacks out the
            // last frame's stars, 0.97–0.99× in one process).
            for (ulong lines = (written | written >> 1) & FirstOfEachPair & ~mappedLines; lines != 0; lines &= lines - 1)
            {
                int* line = GroupOf(BitOperations.TrailingZeroCount(lines), wordPixel, wordLine, planeBlockStep, imageBlockStep, out int pixel);
                Avx.StoreAlignedNonTemporal(line, TOverlay.IsSet ? LayOverGroup(black, overlay + pixel, underIsBlack: true) : black);
                Avx.StoreAlignedNonTemporal(line + HdrFrame.GroupWidth, TOverlay.IsSet ? LayOverGroup(black, overlay + pixel + HdrFrame.GroupWidth, underIsBlack: true) : black);
            }
            for (ulong lines = mappedLines; lines != 0; lines &= lines - 1)
            {
                int bit = BitOperations.TrailingZeroCount(lines);
                int* line = GroupOf(bit, wordPixel, wordLine, planeBlockStep, imageBlockStep, out int pixel);
                int pair = (int)(mapped >> bit) & 3;
                if (pair != 3 && (!TOverlay.IsSet || ((overlaid >> bit) & 3) == 0))
                {
                    // One group of the two to map and no overlay on either (as with most stars): which one is as likely
                    // as not, so it is picked by arithmetic, not by a branch the processor would miss every other line;
                    // the other is black.
                    int mappedOffset = (pair >> 1) * HdrFrame.GroupWidth, at = pixel + mappedOffset;
                    Vector256<int> codes = MapGroup(red + at, green + at, blue + at, scale, table);
                    Avx.StoreAlignedNonTemporal(line + (HdrFrame.GroupWidth - mappedOffset), black);
                    Avx.StoreAlignedNonTemporal(line + mappedOffset, codes);
                    continue;
                }
                Avx.StoreAlignedNonTemporal(line, GroupToWrite<TOverlay>(red, green, blue, overlay, pixel, mapped >> bit, overlaid >> bit, scale, table));
                Avx.StoreAlignedNonTemporal(line + HdrFrame.GroupWidth,
                    GroupToWrite<TOverlay>(red, green, blue, overlay, pixel + HdrFrame.GroupWidth, mapped >> bit >> 1, overlaid >> bit >> 1, scale, table));
            }
        }
    }

    /// <summary>
    /// Bit <paramref name="bit"/> of a word of masks (see <see cref="Locate"/>): its group's output line, and its first
    /// pixel in the planes, from those of the word's first group and the steps from one block of the word to the next.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe int* GroupOf(int bit, int wordPixel, int* wordLine, int planeBlockStep, int imageBlockStep, out int pixel)
    {
        // A bit number is never negative: unsigned, the division and remainder are a shift and a mask.
        int block = (int)((uint)bit / MarkBlock), along = (int)((uint)bit % MarkBlock) * HdrFrame.GroupWidth;
        pixel = wordPixel + block * planeBlockStep + along;
        return wordLine + block * imageBlockStep + along;
    }

    /// <summary>
    /// The group at <paramref name="pixel"/> as written: mapped when bit 0 of <paramref name="mapped"/> is set, else
    /// black (what an unmarked group holds), with its overlay laid over it when bit 0 of <paramref name="overlaid"/> is.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe Vector256<int> GroupToWrite<TOverlay>(float* red, float* green, float* blue, uint* overlay, int pixel, ulong mapped, ulong overlaid,
        Vector256<float> scale, byte* table) where TOverlay : struct, ITypeFlag
    {
        bool isMapped = (mapped & 1) != 0;
        Vector256<int> pixels = isMapped ? MapGroup(red + pixel, green + pixel, blue + pixel, scale, table) : Vector256.Create(unchecked((int)OpaqueBlack));
        return TOverlay.IsSet && (overlaid & 1) != 0 ? LayOverGroup(pixels, overlay + pixel, underIsBlack: !isMapped) : pixels;
    }

    /// <summary>
    /// Asks for the output lines of the groups in <paramref name="groups"/> (bit g: group g from
    /// <paramref name="firstPixel"/>) ahead of their writes. Those lines were last written a frame ago and are no
    /// longer near the core; writes that miss fill the store queue and stall the core, while prefetches let the misses
    /// overlap (on a 2-core AMD EPYC this took a sixth to a quarter off the 1080p star frame).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void PrefetchGroups(uint* firstPixel, uint groups)
    {
        if (!Sse.IsSupported) return;
        for (; groups != 0; groups &= groups - 1)
            Sse.Prefetch0(firstPixel + BitOperations.TrailingZeroCount(groups) * HdrFrame.GroupWidth);
    }

    /// <summary>Row and first block of the word of masks at <paramref name="word"/> (a star tile's rows are a block each: no division).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static (int Row, int Block) WordStart(int word, int maskRowStride) => maskRowStride == 1 ? (word, 0) : Math.DivRem(word, maskRowStride);

    /// <summary>Row and group of bit <paramref name="bit"/> of a word of masks whose first block is block <paramref name="wordBlock"/> of row <paramref name="wordRow"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static (int Row, int Group) Locate(int wordRow, int wordBlock, int bit, int maskRowStride)
    {
        // A bit number is never negative: unsigned, the division and remainder are a shift and a mask.
        int block = (int)((uint)bit / MarkBlock), group = (int)((uint)bit % MarkBlock);
        return maskRowStride == 1 ? (wordRow + block, group) : (wordRow, (wordBlock + block) * MarkBlock + group);
    }

    /// <summary>
    /// The masks of a star tile's rows: one whole block a row, and the rows' marks, masks and lit entries each one
    /// after another, so four rows are one word throughout (a load, a compare and a store where a row at a time took
    /// a loop per row and a load of the note per row, from lines far apart when the note was laid out row by row).
    /// </summary>
    private static unsafe void TakeTileMasks(byte* marks, int rows, ushort* marked, ushort* dark, ushort* lit, bool litKnown)
    {
        for (int word = 0; word < rows; word += 4)
        {
            ulong mask = TakeMarkWord(marks + word * MarkBlock);
            *(ulong*)(marked + word) = mask;
            *(ulong*)(dark + word) = (litKnown ? *(ulong*)(lit + word) : ulong.MaxValue) & ~mask;
            if (lit != null) *(ulong*)(lit + word) = mask;
        }
    }

    /// <summary>Bit g set when group g of the 4 × <see cref="MarkBlock"/> at <paramref name="marks"/> is marked; the marks are cleared as they are read.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe ulong TakeMarkWord(byte* marks)
    {
        if (Vector512.IsHardwareAccelerated)
        {
            Vector512<byte> block = Vector512.Load(marks);
            Vector512<byte>.Zero.Store(marks);
            return ~Vector512.Equals(block, Vector512<byte>.Zero).ExtractMostSignificantBits();
        }
        ulong word = 0;
        for (int block = 0; block < 4; block++) word |= (ulong)TakeMarks(marks + block * MarkBlock, MarkBlock) << (block * MarkBlock);
        return word;
    }

    /// <summary>Groups whose marks are read at once: a 128-bit vector of mark bytes, noted as one lit entry.</summary>
    private const int MarkBlock = RgbaImage.GroupsPerLitEntry;

    /// <summary>The group of pixels from <paramref name="first"/> written black (cut at the row's end).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void WriteBlack(uint* rgba, int first, int width)
    {
        if (first + HdrFrame.GroupWidth <= width && HdrFrame.GroupWidth == Vector256<uint>.Count) Vector256.Store(Vector256.Create(OpaqueBlack), rgba + first);
        else new Span<uint>(rgba + first, Math.Min(HdrFrame.GroupWidth, width - first)).Fill(OpaqueBlack);
    }

    /// <summary>
    /// Bit g set when group g of the <paramref name="count"/> (≤ <see cref="MarkBlock"/>) at <paramref name="marks"/>
    /// is marked; the marks are cleared as they are read.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe ushort TakeMarks(byte* marks, int count)
    {
        if (count == MarkBlock)
        {
            Vector128<byte> block = Vector128.Load(marks);
            Vector128<byte>.Zero.Store(marks);
            return (ushort)~Vector128.Equals(block, Vector128<byte>.Zero).ExtractMostSignificantBits();
        }
        uint marked = 0;
        for (int group = 0; group < count; group++)
        {
            if (marks[group] != 0) marked |= 1u << group;
            marks[group] = 0;
        }
        return (ushort)marked;
    }

    /// <summary>
    /// Eight pixels at once (AVX2): look up the encoded curve, pack RGBA, zero the HDR values. The table is bytes (5 KB,
    /// which stays in the first-level cache beside a tile, where ints would take 20 KB), gathered as ints at byte
    /// offsets and cut to their low byte, so it carries <see cref="TablePadding"/> bytes past its last entry. Most
    /// groups show one star or one line across them, lit in two pixels or fewer: those two are looked up one by one,
    /// since a gather costs as much as a dozen single lookups here whatever it gathers (unlit pixels have index 0,
    /// whose code is 0, so they are black either way).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe Vector256<int> MapGroup(float* red, float* green, float* blue, Vector256<float> scale, byte* table)
    {
        Vector256<int> r = TableIndex(Avx.LoadVector256(red) * scale), g = TableIndex(Avx.LoadVector256(green) * scale), b = TableIndex(Avx.LoadVector256(blue) * scale);
        Avx.Store(red, Vector256<float>.Zero);
        Avx.Store(green, Vector256<float>.Zero);
        Avx.Store(blue, Vector256<float>.Zero);
        Vector256<int> litLanes = Vector256.GreaterThan(r | g | b, Vector256<int>.Zero);
        uint lit = litLanes.ExtractMostSignificantBits();
        var black = Vector256.Create(unchecked((int)OpaqueBlack));
        if (BitOperations.PopCount(lit) <= 2)
        {
            if (Avx512F.VL.IsSupported) return EncodeLitPair(r, g, b, litLanes, table);
            // The first and last lit pixel (the same one when only one is lit; pixel 0, black, when none is).
            int first = BitOperations.TrailingZeroCount(lit | 1u << 31) & 7, last = 31 - BitOperations.LeadingZeroCount(lit | 1);
            Vector256<int> lanes = Vector256.Create(0, 1, 2, 3, 4, 5, 6, 7);
            return Vector256.ConditionalSelect(Vector256.Equals(lanes, Vector256.Create(first)), Vector256.Create(Encode(r, g, b, first, table)),
                Vector256.ConditionalSelect(Vector256.Equals(lanes, Vector256.Create(last)), Vector256.Create(Encode(r, g, b, last, table)), black));
        }
        Vector256<int> lowByte = Vector256.Create(0xFF);
        r = Avx2.GatherVector256((int*)table, r, 1) & lowByte;
        g = Avx2.GatherVector256((int*)table, g, 1) & lowByte;
        b = Avx2.GatherVector256((int*)table, b, 1) & lowByte;
        return r | Avx2.ShiftLeftLogical(g, 8) | Avx2.ShiftLeftLogical(b, 16) | black;
    }

    /// <summary>
    /// The group's codes when at most two of its pixels are lit (AVX-512): their entries packed into the low lanes,
    /// looked up one by one, and put back in place over black. Entries are under 2¹⁶, so red and green share a lane
    /// and each channel of both pixels leaves the vector unit in one move, where picking each pixel's lane out of each
    /// channel took a permute and a move apiece.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe Vector256<int> EncodeLitPair(Vector256<int> red, Vector256<int> green, Vector256<int> blue, Vector256<int> litLanes, byte* table)
    {
        Vector256<uint> lanes = litLanes.AsUInt32();
        ulong redGreen = Avx512F.VL.Compress(Vector256<uint>.Zero, lanes, (red | Vector256.ShiftLeft(green, 16)).AsUInt32()).AsUInt64().ToScalar();
        ulong blues = Avx512F.VL.Compress(Vector256<uint>.Zero, lanes, blue.AsUInt32()).AsUInt64().ToScalar();
        uint first = table[(ushort)redGreen] | (uint)table[(ushort)(redGreen >> 16)] << 8 | (uint)table[(uint)blues] << 16 | OpaqueBlack;
        uint second = table[(ushort)(redGreen >> 32)] | (uint)table[redGreen >> 48] << 8 | (uint)table[blues >> 32] << 16 | OpaqueBlack;
        Vector256<uint> codes = Vector128.CreateScalarUnsafe(first | (ulong)second << 32).AsUInt32().ToVector256Unsafe();
        return Avx512F.VL.Expand(Vector256.Create(OpaqueBlack), lanes, codes).AsInt32();
    }

    /// <summary>The RGBA code of pixel <paramref name="lane"/> of a group, from its table entries.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe int Encode(Vector256<int> red, Vector256<int> green, Vector256<int> blue, int lane, byte* table)
    {
        // Indices are never negative: unsigned, they index the table without a sign extension each.
        Vector256<uint> pick = Vector256.Create((uint)lane);
        return table[Avx2.PermuteVar8x32(red.AsUInt32(), pick).ToScalar()] | table[Avx2.PermuteVar8x32(green.AsUInt32(), pick).ToScalar()] << 8
            | table[Avx2.PermuteVar8x32(blue.AsUInt32(), pick).ToScalar()] << 16 | unchecked((int)OpaqueBlack);
    }

    /// <summary>
    /// Tone maps <paramref name="count"/> pixels of three HDR planes, from the start of a group, into RGBA8 and zeroes
    /// the HDR values read; where <paramref name="overlayMarks"/> (one per group; null for none) marks a group, the
    /// overlay at <paramref name="overlay"/> is laid over it and both are emptied. Whole lines go out with
    /// non-temporal stores: the caller fences them (<see cref="FinishWrites"/>).
    /// </summary>
    internal static unsafe void MapAndClear(float* red, float* green, float* blue, uint* rgba, int count, float exposureScale, uint* overlay = null, byte* overlayMarks = null)
    {
        int pixel = 0;
        fixed (byte* table = EncodedTable)
        {
            if (Avx2.IsSupported)
            {
                var scale = Vector256.Create(exposureScale);
                // Whole cache lines are written without being read in first (see MapWholeLines).
                if (((nint)rgba & (RgbaImage.LineBytes - 1)) == 0 && count % PixelsPerLine == 0 && HdrFrame.GroupWidth == Vector256<float>.Count)
                {
                    for (; pixel < count; pixel += Vector256<float>.Count)
                        Avx.StoreAlignedNonTemporal((int*)(rgba + pixel), MappedWithOverlay(MapGroup(red + pixel, green + pixel, blue + pixel, scale, table), overlay, overlayMarks, pixel));
                    return;
                }
                for (; pixel + Vector256<float>.Count <= count; pixel += Vector256<float>.Count)
                    Avx.Store((int*)(rgba + pixel), MappedWithOverlay(MapGroup(red + pixel, green + pixel, blue + pixel, scale, table), overlay, overlayMarks, pixel));
            }
            int tail = pixel;
            for (; pixel < count; pixel++)
            {
                uint r = (uint)table[TableIndex(red[pixel] * exposureScale)];
                uint g = (uint)table[TableIndex(green[pixel] * exposureScale)];
                uint b = (uint)table[TableIndex(blue[pixel] * exposureScale)];
                rgba[pixel] = r | g << 8 | b << 16 | OpaqueBlack;
                red[pixel] = green[pixel] = blue[pixel] = 0;
                if (overlayMarks == null || overlayMarks[pixel / HdrFrame.GroupWidth] == 0) continue;
                rgba[pixel] = LayOver(overlay[pixel], rgba[pixel]);
                overlay[pixel] = 0;
            }
            // The marks of the groups laid one pixel at a time go once their last pixel is done.
            if (overlayMarks != null && tail < count)
                new Span<byte>(overlayMarks + tail / HdrFrame.GroupWidth, (count - 1) / HdrFrame.GroupWidth - tail / HdrFrame.GroupWidth + 1).Clear();
        }
    }

    /// <summary>The mapped group from <paramref name="pixel"/> with its overlay laid over it (and emptied, mark and all) if it has one.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe Vector256<int> MappedWithOverlay(Vector256<int> mapped, uint* overlay, byte* overlayMarks, int pixel)
    {
        if (overlayMarks == null || overlayMarks[pixel / HdrFrame.GroupWidth] == 0) return mapped;
        overlayMarks[pixel / HdrFrame.GroupWidth] = 0;
        return LayOverGroup(mapped, overlay + pixel, underIsBlack: false);
    }

    /// <summary>The table entry for eight exposed values: NaN and negatives go to 0 (black), anything past white to the last.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static Vector256<int> TableIndex(Vector256<float> exposed)
    {
        // Comparisons are false for NaN, so NaN falls to 0 like a negative value.
        Vector256<float> x = Vector256.ConditionalSelect(Vector256.GreaterThan(exposed, Vector256<float>.Zero), exposed, Vector256<float>.Zero);
        x = Vector256.Min(x, Vector256.Create(White));
        Vector256<int> step = Vector256.ShiftRightArithmetic(x.AsInt32(), 23 - StepBits) - Vector256.Create(FirstStep);
        return Vector256.Max(step, Vector256<int>.Zero);
    }

    private static int TableIndex(float exposed)
    {
        float x = exposed > 0 ? MathF.Min(exposed, White) : 0;
        return Math.Max((BitConverter.SingleToInt32Bits(x) >> (23 - StepBits)) - FirstStep, 0);
    }

    /// <summary>Entry i: the code for the geometric middle of step i (the last entry is white itself).</summary>
    private static byte[] BuildEncodedTable()
    {
        var table = new byte[LastEntry + 1 + TablePadding];
        for (int i = 0; i <= LastEntry; i++)
        {
            int bits = (FirstStep + i) << (23 - StepBits);
            double low = BitConverter.Int32BitsToSingle(bits), high = BitConverter.Int32BitsToSingle(bits + (1 << (23 - StepBits)));
            table[i] = (byte)Math.Round(255 * SrgbTransfer.Encode(Curve(Math.Sqrt(low * high))), MidpointRounding.AwayFromZero);
        }
        return table;
    }
}
