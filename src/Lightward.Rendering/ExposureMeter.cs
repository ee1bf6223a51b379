using Lightward.Optics;

namespace Lightward.Rendering;

/// <summary>
/// Automatic exposure from luminance percentiles, metered before the stars are splatted (their footprints depend on
/// the exposure). Two keys are taken: the stars' — the luminance exceeded by the brightest <see cref="StarKeyFraction"/>
/// of the stars on the image, mapped to exposed flux <see cref="StarKeyLevel"/> so that the top of the sky just starts
/// to bloom — and the background's — the <see cref="BackgroundPercentile"/> of the painted background luminance on a
/// sparse pixel grid, mapped to <see cref="BackgroundKeyLevel"/> so a glowing sky stays mid-bright. The darker of the
/// two exposures wins. Percentiles come from a histogram with four bins per stop, so metering is linear-time and
/// deterministic. The key levels are common practice (photographic metering), no published source.
/// </summary>
public sealed class ExposureMeter
{
    public const float StarKeyFraction = 0.02f;
    public const float StarKeyLevel = 1;
    public const float BackgroundPercentile = 0.95f;
    public const float BackgroundKeyLevel = 0.5f;

    /// <summary>Exposure used when there is nothing to meter (an empty, black sky), in stops.</summary>
    public const double DefaultStops = 6;

    /// <summary>Pixels between background samples in each direction.</summary>
    private const int BackgroundSampleSpacing = 8;

    /// <summary>Float bits shifted right by this keep the exponent and two mantissa bits: four bins per stop.</summary>
    private const int BinShift = 21;

    private readonly int[] _histogram = new int[1 << (31 - BinShift)];

    /// <summary>The exposure scale (display = HDR × scale) for this frame.</summary>
    public float Meter(Exposure exposure, HdrFrame frame, bool backgroundPainted, ApparentStars stars,
        ReadOnlySpan<float> x, ReadOnlySpan<float> y, ReadOnlySpan<float> radianceScale)
    {
        if (!exposure.Automatic) return (float)Math.Pow(2, exposure.Stops);
        double scale = double.PositiveInfinity;
        float starKey = StarKey(frame, stars, x, y, radianceScale);
        if (starKey > 0) scale = StarKeyLevel / starKey;
        if (backgroundPainted)
        {
            float backgroundKey = BackgroundKey(frame);
            if (backgroundKey > 0) scale = Math.Min(scale, BackgroundKeyLevel / backgroundKey);
        }
        if (double.IsInfinity(scale)) scale = Math.Pow(2, DefaultStops);
        return (float)(scale * Math.Pow(2, exposure.Stops));
    }

    private float StarKey(HdrFrame frame, ApparentStars stars, ReadOnlySpan<float> x, ReadOnlySpan<float> y, ReadOnlySpan<float> radianceScale)
    {
        Array.Clear(_histogram);
        int onImage = 0;
        for (int i = 0; i < stars.Count; i++)
        {
            // NaN x fails both comparisons.
            if (!(x[i] >= 0 && x[i] < frame.Width && y[i] >= 0 && y[i] < frame.Height)) continue;
            float luminance = (ColorWeights.Red * stars.R[i] + ColorWeights.Green * stars.G[i] + ColorWeights.Blue * stars.B[i]) * radianceScale[i];
            if (!(luminance > 0)) continue;
            _histogram[Bin(luminance)]++;
            onImage++;
        }
        return onImage == 0 ? 0 : LevelWithCountAbove((int)Math.Ceiling(StarKeyFraction * onImage));
    }

    private float BackgroundKey(HdrFrame frame)
    {
        Array.Clear(_histogram);
        int samples = 0, lit = 0;
        for (int row = BackgroundSampleSpacing / 2; row < frame.Height; row += BackgroundSampleSpacing)
            for (int column = BackgroundSampleSpacing / 2; column < frame.Width; column += BackgroundSampleSpacing)
            {
                samples++;
                float luminance = frame.Luminance(column, row);
                if (!(luminance > 0)) continue;
                _histogram[Bin(luminance)]++;
                lit++;
            }
        int above = (int)Math.Ceiling((1 - BackgroundPercentile) * samples);
        return lit < above ? 0 : LevelWithCountAbove(above);
    }

    /// <summary>The luminance of the histogram bin where the count from the bright end first reaches <paramref name="count"/>.</summary>
    private float LevelWithCountAbove(int count)
    {
        int seen = 0;
        for (int bin = _histogram.Length - 1; bin >= 0; bin--)
        {
            seen += _histogram[bin];
            if (seen >= Math.Max(count, 1)) return BitConverter.Int32BitsToSingle(bin << BinShift | 1 << (BinShift - 1));
        }
        return 0;
    }

    private static int Bin(float positive) => Math.Min(BitConverter.SingleToInt32Bits(positive) >> BinShift, (1 << (31 - BinShift)) - 1);
}
