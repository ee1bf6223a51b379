using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;

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
    /// <see cref="StepBits"/> mantissa bits, i.e. 1024 steps per octave from <see cref="DarkestExposed"/> (whose code,
    /// and every darker value's, is 0) up to <see cref="White"/>. Each entry holds the code at its step's geometric
    /// middle; across a step of 1/1024 of an octave the code moves by under a tenth, so the written code is within
    /// one of the exact one (tested). No division per pixel, one gather per channel.
    /// </summary>
    private const int StepBits = 10;
    private const float DarkestExposed = 1f / 65536;
    private static readonly int FirstStep = BitConverter.SingleToInt32Bits(DarkestExposed) >> (23 - StepBits);
    private static readonly int LastEntry = (BitConverter.SingleToInt32Bits(White) >> (23 - StepBits)) - FirstStep;

    /// <summary>The 8-bit code for each step of exposed values, as ints so that whole vectors gather at once.</summary>
    private static readonly int[] EncodedTable = BuildEncodedTable();

    /// <summary>The tone curve for one exposed linear value, in [0, 1]; the mapper's table holds it, encoded.</summary>
    public static double Curve(double exposed)
    {
        // Clamping the input first keeps huge and infinite values white (the curve is exactly 1 at W); NaN goes to 0.
        double x = exposed > 0 ? Math.Min(exposed, White) : 0;
        return Math.Min(1, x * (1 + x / (White * White)) / (1 + x));
    }

    /// <summary>The 8-bit sRGB code the mapper writes for an exposed linear value (HDR × exposure scale).</summary>
    public static byte Code(float exposed) => (byte)EncodedTable[TableIndex(exposed)];

    /// <summary>
    /// Tone maps rows [<paramref name="firstRow"/>, <paramref name="endRow"/>) of <paramref name="hdr"/> into RGBA8
    /// pixels (R, G, B, A bytes in memory order; alpha 255) at <paramref name="rgba"/>, which holds the whole image,
    /// and zeroes those HDR rows while their cache lines are at hand, which saves the next frame a clearing pass.
    /// Unless the frame is <see cref="HdrFrame.WhollyTouched"/>, only the touched pixel groups are read (the rest are
    /// zero, so they map to black and are written as black) and their marks are cleared; <paramref name="lit"/> (laid
    /// out like the image's note of lit groups, row for row with <paramref name="rgba"/>; null for none) is used and
    /// updated as in <see cref="MapMarkedRow"/>.
    /// </summary>
    public static unsafe void MapAndClearRows(HdrFrame hdr, float exposureScale, uint* rgba, ushort* lit, bool litKnown, int firstRow, int endRow)
    {
        fixed (float* red = hdr.Red, green = hdr.Green, blue = hdr.Blue)
        fixed (byte* touched = hdr.Touched)
        {
            if (hdr.WhollyTouched)
            {
                int start = firstRow * hdr.Width;
                MapAndClear(red + start, green + start, blue + start, rgba + start, (endRow - firstRow) * hdr.Width, exposureScale);
                new Span<byte>(touched + firstRow * hdr.GroupsPerRow, (endRow - firstRow) * hdr.GroupsPerRow).Clear();
                return;
            }
            int litPerRow = (hdr.GroupsPerRow + MarkBlock - 1) / MarkBlock;
            for (int row = firstRow; row < endRow; row++)
            {
                int rowStart = row * hdr.Width;
                MapMarkedRow(red + rowStart, green + rowStart, blue + rowStart, touched + row * hdr.GroupsPerRow, rgba + rowStart, hdr.Width, exposureScale,
                    lit == null ? null : lit + row * litPerRow, litKnown);
            }
        }
    }

    private const uint OpaqueBlack = 0xFF000000u;

    /// <summary>
    /// One row of <paramref name="width"/> pixels with a mark per <see cref="HdrFrame.GroupWidth"/>-pixel group: each
    /// marked group is mapped, its HDR values zeroed and its mark cleared, and every other group is black (what an
    /// untouched, all-zero group maps to). When <paramref name="litKnown"/>, the row's groups not noted in
    /// <paramref name="lit"/> (one entry per <see cref="RgbaImage.GroupsPerLitEntry"/> groups) are black already and
    /// only the noted ones are written black; otherwise the whole row is. Either way <paramref name="lit"/> (unless
    /// null) is left noting the marked groups.
    /// </summary>
    internal static unsafe void MapMarkedRow(float* red, float* green, float* blue, byte* marks, uint* rgba, int width, float exposureScale,
        ushort* lit, bool litKnown)
    {
        litKnown &= lit != null;
        if (!litKnown) new Span<uint>(rgba, width).Fill(OpaqueBlack);
        int wholeGroups = width / HdrFrame.GroupWidth, groups = (width + HdrFrame.GroupWidth - 1) / HdrFrame.GroupWidth;
        fixed (int* table = EncodedTable)
        {
            bool vectorized = Avx2.IsSupported && HdrFrame.GroupWidth == Vector256<float>.Count;
            var scale = Vector256.Create(exposureScale);
            // Marks are scattered (a star touches a few groups), so they are read a block at a time and the marked
            // groups visited through the block's bit mask: one hard-to-predict branch per block, not per group.
            for (int block = 0; block < groups; block += MarkBlock)
            {
                int blockLength = Math.Min(MarkBlock, groups - block);
                uint marked = MarkedGroups(marks + block, blockLength);
                ushort* noted = lit == null ? null : lit + block / MarkBlock;
                if (litKnown)
                    for (uint dark = *noted & ~marked; dark != 0; dark &= dark - 1)
                        WriteBlack(rgba, (block + BitOperations.TrailingZeroCount(dark)) * HdrFrame.GroupWidth, width);
                if (lit != null) *noted = (ushort)marked;
                for (; marked != 0; marked &= marked - 1)
                {
                    int group = block + BitOperations.TrailingZeroCount(marked), first = group * HdrFrame.GroupWidth;
                    if (vectorized && group < wholeGroups) MapVector(red + first, green + first, blue + first, rgba + first, scale, table);
                    else MapAndClear(red + first, green + first, blue + first, rgba + first, Math.Min(HdrFrame.GroupWidth, width - first), exposureScale);
                }
                new Span<byte>(marks + block, blockLength).Clear();
            }
        }
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

    /// <summary>Bit g set when group g of the <paramref name="count"/> (≤ <see cref="MarkBlock"/>) at <paramref name="marks"/> is marked.</summary>
    private static unsafe uint MarkedGroups(byte* marks, int count)
    {
        if (count == MarkBlock) return ~Vector128.Equals(Vector128.Load(marks), Vector128<byte>.Zero).ExtractMostSignificantBits() & 0xFFFF;
        uint marked = 0;
        for (int group = 0; group < count; group++)
            if (marks[group] != 0) marked |= 1u << group;
        return marked;
    }

    /// <summary>Eight pixels at once (AVX2): gather the encoded curve, pack RGBA, zero the HDR values.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void MapVector(float* red, float* green, float* blue, uint* rgba, Vector256<float> scale, int* table)
    {
        Vector256<int> r = Avx2.GatherVector256(table, TableIndex(Avx.LoadVector256(red) * scale), 4);
        Vector256<int> g = Avx2.GatherVector256(table, TableIndex(Avx.LoadVector256(green) * scale), 4);
        Vector256<int> b = Avx2.GatherVector256(table, TableIndex(Avx.LoadVector256(blue) * scale), 4);
        Avx.Store(red, Vector256<float>.Zero);
        Avx.Store(green, Vector256<float>.Zero);
        Avx.Store(blue, Vector256<float>.Zero);
        Avx.Store((int*)rgba, r | Avx2.ShiftLeftLogical(g, 8) | Avx2.ShiftLeftLogical(b, 16) | Vector256.Create(unchecked((int)OpaqueBlack)));
    }

    /// <summary>Tone maps <paramref name="count"/> pixels of three HDR planes into RGBA8 and zeroes the HDR values read.</summary>
    internal static unsafe void MapAndClear(float* red, float* green, float* blue, uint* rgba, int count, float exposureScale)
    {
        int pixel = 0;
        fixed (int* table = EncodedTable)
        {
            if (Avx2.IsSupported)
            {
                var scale = Vector256.Create(exposureScale);
                for (; pixel + Vector256<float>.Count <= count; pixel += Vector256<float>.Count)
                    MapVector(red + pixel, green + pixel, blue + pixel, rgba + pixel, scale, table);
            }
            for (; pixel < count; pixel++)
            {
                uint r = (uint)table[TableIndex(red[pixel] * exposureScale)];
                uint g = (uint)table[TableIndex(green[pixel] * exposureScale)];
                uint b = (uint)table[TableIndex(blue[pixel] * exposureScale)];
                rgba[pixel] = r | g << 8 | b << 16 | OpaqueBlack;
                red[pixel] = green[pixel] = blue[pixel] = 0;
            }
        }
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
    private static int[] BuildEncodedTable()
    {
        var table = new int[LastEntry + 1];
        for (int i = 0; i <= LastEntry; i++)
        {
            int bits = (FirstStep + i) << (23 - StepBits);
            double low = BitConverter.Int32BitsToSingle(bits), high = BitConverter.Int32BitsToSingle(bits + (1 << (23 - StepBits)));
            table[i] = (int)Math.Round(255 * SrgbTransfer.Encode(Curve(Math.Sqrt(low * high))), MidpointRounding.AwayFromZero);
        }
        return table;
    }
}
