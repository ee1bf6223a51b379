using System.Globalization;
using Lightward.Spacetime;

namespace Lightward.Audio;

/// <summary>
/// A video frame rate as an exact fraction of frames per second (29.97 is 30000/1001), so that frame → sample
/// boundaries are computed in integers and never drift, even over hours.
/// </summary>
public readonly record struct FrameRate
{
    public long Numerator { get; }
    public long Denominator { get; }

    public FrameRate(long numerator, long denominator)
    {
        if (numerator <= 0 || denominator <= 0)
            throw new ArgumentOutOfRangeException(nameof(numerator), "a frame rate needs a positive numerator and denominator");
        long divisor = (long)System.Numerics.BigInteger.GreatestCommonDivisor(numerator, denominator);
        Numerator = numerator / divisor;
        Denominator = denominator / divisor;
    }

    public double FramesPerSecond => (double)Numerator / Denominator;

    /// <summary>The rates offered to users, with the NTSC-family rates as their exact fractions (SMPTE ST 12-1).</summary>
    public static readonly IReadOnlyDictionary<string, FrameRate> Named = new Dictionary<string, FrameRate>
    {
        ["23.976"] = new(24_000, 1001),
        ["24"] = new(24, 1),
        ["25"] = new(25, 1),
        ["29.97"] = new(30_000, 1001),
        ["30"] = new(30, 1),
        ["48"] = new(48, 1),
        ["50"] = new(50, 1),
        ["59.94"] = new(60_000, 1001),
        ["60"] = new(60, 1),
    };

    /// <summary>Reads "29.97", "30" or an exact fraction like "30000/1001"; a bad value names <paramref name="field"/>.</summary>
    public static FrameRate Parse(string? text, string field)
    {
        string trimmed = (text ?? "").Trim();
        if (Named.TryGetValue(trimmed, out FrameRate named)) return named;
        string[] parts = trimmed.Split('/');
        if (parts.Length == 2
            && long.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out long numerator)
            && long.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out long denominator)
            && numerator is > 0 and <= 1_000_000 && denominator is > 0 and <= 1_000_000)
            return new FrameRate(numerator, denominator);
        throw new UserInputException(
            $"{field}: '{trimmed}' is not a frame rate; use one of {string.Join(", ", Named.Keys)} or an exact fraction such as 30000/1001");
    }

    /// <summary>
    /// The first sample of <paramref name="frame"/>: round(frame × sampleRate × Denominator / Numerator), halves
    /// rounded up, in 128-bit integers.
    /// </summary>
    public long SampleBoundary(long frame, int sampleRate = SoundFormat.SampleRate)
    {
        if (frame < 0) throw new ArgumentOutOfRangeException(nameof(frame), "frame numbers start at 0");
        Int128 scaled = (Int128)frame * sampleRate * Denominator;
        return (long)((2 * scaled + Numerator) / (2 * (Int128)Numerator));
    }

    /// <summary>How many samples belong to <paramref name="frame"/> (e.g. 1602, 1601, 1602, 1601, 1602 at 29.97 fps, 48 kHz).</summary>
    public int SamplesInFrame(long frame, int sampleRate = SoundFormat.SampleRate) =>
        (int)(SampleBoundary(frame + 1, sampleRate) - SampleBoundary(frame, sampleRate));

    /// <summary>The whole number of frames nearest to <paramref name="seconds"/> of video.</summary>
    public long FramesIn(double seconds) => (long)Math.Round(seconds * Numerator / Denominator, MidpointRounding.AwayFromZero);

    public override string ToString() =>
        Denominator == 1 ? Numerator.ToString(CultureInfo.InvariantCulture) : FormattableString.Invariant($"{Numerator}/{Denominator}");
}
