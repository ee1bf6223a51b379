using System.Numerics;
using System.Runtime.Intrinsics;

namespace Lightward.Rendering;

/// <summary>
/// Automatic exposure from luminance percentiles, metered before the stars are splatted (their footprints depend on
/// the exposure) and after the layers have drawn their surfaces into their own buffers. Three keys are taken: the
/// stars' — the luminance exceeded by the brightest <see cref="StarKeyFraction"/> of the stars on the image, mapped
/// to exposed flux <see cref="StarKeyLevel"/> so that the top of the sky just starts to bloom — the background's —
/// the <see cref="BackgroundPercentile"/> of the painted background luminance on a sparse pixel grid, mapped to
/// <see cref="BackgroundKeyLevel"/> so a glowing sky stays mid-bright — and the surfaces' — the brightest channel
/// exceeded by the brightest <see cref="SurfaceKeyFraction"/> of the pixels the layers cover, mapped to
/// <see cref="SurfaceKeyLevel"/> so a body is shown bright but unclipped, keeping its hue (a channel pushed past the
/// tone curve's shoulder while the others are not turns an orange-red surface yellow). The darker of the stars' and
/// the background's exposures wins; the surfaces' darkens it further in full once they cover
/// <see cref="SurfaceFullWeightShare"/> of the image, and less (in stops) below that, so a distant speck may clip
/// while the sky stays visible. Percentiles come from histograms with four bins per stop, so metering is
/// linear-time and deterministic. The key levels and weights are common practice (photographic metering), no
/// published source.
/// </summary>
public sealed class ExposureMeter
{
    public const float StarKeyFraction = 0.02f;
    public const float StarKeyLevel = 1;
    public const float BackgroundPercentile = 0.95f;
    public const float BackgroundKeyLevel = 0.5f;
    public const float SurfaceKeyFraction = 0.05f;
    public const float SurfaceKeyLevel = 1;
    /// <summary>Share of the image the surfaces must cover for their key to count in full.</summary>
    public const double SurfaceFullWeightShare = 0.001;

    /// <summary>Exposure used when there is nothing to meter (an empty, black sky), in stops.</summary>
    public const double DefaultStops = 6;

    /// <summary>Pixels between background samples in each direction.</summary>
    private const int BackgroundSampleSpacing = 8;

    private readonly LevelHistogram _histogram = new();

    /// <summary>
    /// The exposure scale (display = HDR × scale) for this frame; <paramref name="stars"/> holds the pixel luminances
    /// of the stars on the image, <paramref name="surfaces"/> the levels of the layers' surfaces.
    /// </summary>
    public float Meter(Exposure exposure, HdrFrame frame, bool backgroundPainted, LevelHistogram stars, LevelHistogram surfaces)
    {
        if (!exposure.Automatic) return (float)Math.Pow(2, exposure.Stops);
        double scale = double.PositiveInfinity;
        float starKey = stars.Count == 0 ? 0 : stars.LevelWithCountAbove((int)Math.Ceiling(StarKeyFraction * stars.Count));
        if (starKey > 0) scale = StarKeyLevel / starKey;
        if (backgroundPainted)
        {
            float backgroundKey = BackgroundKey(frame);
            if (backgroundKey > 0) scale = Math.Min(scale, BackgroundKeyLevel / backgroundKey);
        }
        float surfaceKey = surfaces.Count == 0 ? 0 : surfaces.LevelWithCountAbove((int)Math.Ceiling(SurfaceKeyFraction * surfaces.Count));
        if (surfaceKey > 0)
        {
            double surfaceScale = SurfaceKeyLevel / surfaceKey;
            // A speck does not black out the sky: below full weight the surfaces pull the exposure down (in stops) by
            // the square of their share of the full-weight area, so the sky dims gradually as a body grows in view.
            double share = Math.Min(1, surfaces.Count / (SurfaceFullWeightShare * frame.Width * frame.Height));
            double weight = double.IsInfinity(scale) ? 1 : share * share;
            if (double.IsInfinity(scale)) scale = surfaceScale;
            else if (surfaceScale < scale) scale *= Math.Pow(surfaceScale / scale, weight);
        }
        if (double.IsInfinity(scale)) scale = Math.Pow(2, DefaultStops);
        return (float)(scale * Math.Pow(2, exposure.Stops));
    }

    private float BackgroundKey(HdrFrame frame)
    {
        _histogram.Clear();
        int samples = 0;
        for (int row = BackgroundSampleSpacing / 2; row < frame.Height; row += BackgroundSampleSpacing)
            for (int column = BackgroundSampleSpacing / 2; column < frame.Width; column += BackgroundSampleSpacing)
            {
                samples++;
                _histogram.Add(frame.Luminance(column, row));
            }
        int above = (int)Math.Ceiling((1 - BackgroundPercentile) * samples);
        return _histogram.Count < above ? 0 : _histogram.LevelWithCountAbove(above);
    }
}

/// <summary>
/// A histogram of positive levels (luminances, channel values) with four bins per stop, for percentiles in linear
/// time with a deterministic result. Zero, negative and NaN levels are not counted.
/// </summary>
public sealed class LevelHistogram
{
    /// <summary>Float bits shifted right by this keep the exponent and two mantissa bits: four bins per stop.</summary>
    private const int BinShift = 21;

    private readonly int[] _bins = new int[1 << (31 - BinShift)];

    /// <summary>Levels counted since the last <see cref="Clear"/>.</summary>
    public int Count { get; private set; }

    /// <summary>Adds every level counted in <paramref name="other"/>.</summary>
    public void Add(LevelHistogram other)
    {
        if (other.Count == 0) return;
        // A vector of bins at a time: merges run while other threads wait (a frame's per-thread star histograms, the
        // near field's per-band surface histograms).
        Span<int> bins = _bins;
        ReadOnlySpan<int> added = other._bins;
        for (int bin = 0; bin < bins.Length; bin += Vector<int>.Count)
            (new Vector<int>(bins[bin..]) + new Vector<int>(added[bin..])).CopyTo(bins[bin..]);
        Count += other.Count;
    }

    public void Clear()
    {
        Array.Clear(_bins);
        Count = 0;
    }

    public void Add(float level)
    {
        if (!(level > 0)) return;
        _bins[Math.Min(BitConverter.SingleToInt32Bits(level) >> BinShift, _bins.Length - 1)]++;
        Count++;
    }

    /// <summary>Adds the levels of the lanes whose bits are set in <paramref name="lanes"/> (bit i: lane i).</summary>
    public void Add(Vector256<float> levels, uint lanes)
    {
        lanes &= Vector256.GreaterThan(levels, Vector256<float>.Zero).ExtractMostSignificantBits();
        if (lanes == 0) return;
        // All eight bins at once, and the count once: a count kept in memory and raised per level made a chain of
        // dependent writes.
        Vector256<int> bins = Vector256.Min(Vector256.ShiftRightArithmetic(levels.AsInt32(), BinShift), Vector256.Create(_bins.Length - 1));
        int count = BitOperations.PopCount(lanes), first = bins.GetElement(BitOperations.TrailingZeroCount(lanes));
        // A surface's neighbouring pixels mostly share a bin: one addition then, not a chain of increments of one counter.
        if ((Vector256.Equals(bins, Vector256.Create(first)).AsSingle().ExtractMostSignificantBits() & lanes) == lanes) _bins[first] += count;
        else
            for (uint rest = lanes; rest != 0; rest &= rest - 1) _bins[bins.GetElement(BitOperations.TrailingZeroCount(rest))]++;
        Count += count;
    }

    /// <summary>The level of the bin where the count from the bright end first reaches <paramref name="count"/> (0 when it never does).</summary>
    public float LevelWithCountAbove(int count)
    {
        int seen = 0;
        for (int bin = _bins.Length - 1; bin >= 0; bin--)
        {
            seen += _bins[bin];
            if (seen >= Math.Max(count, 1)) return BitConverter.Int32BitsToSingle(bin << BinShift | 1 << (BinShift - 1));
        }
        return 0;
    }
}
