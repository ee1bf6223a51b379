using Lightward.Spacetime;

namespace Lightward.Audio;

/// <summary>
/// Constant-power panning of a source direction in ship axes (+Z forward, +X right, +Y up) onto the speakers of a
/// layout: the squared gains always sum to 1, so a source keeps its loudness as it moves around the ship.
/// </summary>
public static class SpeakerPanner
{
    // Loudspeaker azimuths of the 5.1 ring, clockwise from ahead, in degrees (ITU-R BS.775-3: C 0°, L/R ±30°,
    // Ls/Rs ±110°), with the interleaved channel each one feeds. The LFE channel is not part of the ring.
    private static readonly (double Azimuth, int Channel)[] SurroundRing =
        [(0, 2), (30, 1), (110, 5), (250, 4), (330, 0), (360, 2)];

    /// <summary>The interleaved index of the LFE channel in <see cref="SpeakerLayout.Surround51"/>.</summary>
    public const int LowFrequencyChannel = 3;

    /// <summary>
    /// Fills <paramref name="gains"/> (one per channel) for a source toward <paramref name="direction"/>. The part
    /// of the direction in the horizontal plane is panned pairwise between neighbouring speakers by the sine/cosine
    /// law; the vertical part is spread evenly over all ring speakers, so a source overhead comes from everywhere.
    /// A zero direction counts as straight ahead.
    /// </summary>
    public static void Gains(SpeakerLayout layout, Vec3 direction, Span<float> gains)
    {
        int channels = SoundFormat.ChannelCount(layout);
        if (gains.Length < channels) throw new ArgumentException($"need {channels} gains", nameof(gains));
        gains.Clear();
        Vec3 unit = direction.NormalizedOr(Vec3.UnitZ);
        // Clamped: for a level unit vector the root can round to 1 + 2⁻⁵², and the vertical share below must not go negative.
        double horizontal = Math.Min(1, Math.Sqrt(unit.X * unit.X + unit.Z * unit.Z));
        double azimuthDegrees = horizontal > 0 ? Math.Atan2(unit.X, unit.Z) * (180 / Math.PI) : 0;
        Span<double> power = stackalloc double[channels];
        int ringSize;
        if (layout == SpeakerLayout.Stereo)
        {
            ringSize = 2;
            // The pan position is the sideways component (sin of the azimuth), so sources behind fold onto the
            // front arc: a two-speaker image can only say "how far right".
            double position = horizontal > 0 ? unit.X / horizontal : 0;
            double angle = (position + 1) * (Math.PI / 4);
            AddPair(power, 0, 1, Math.Cos(angle), Math.Sin(angle));
        }
        else
        {
            ringSize = SurroundRing.Length - 1;
            double azimuth = azimuthDegrees < 0 ? azimuthDegrees + 360 : azimuthDegrees;
            int segment = 0;
            while (segment < SurroundRing.Length - 2 && azimuth >= SurroundRing[segment + 1].Azimuth) segment++;
            (double startAzimuth, int startChannel) = SurroundRing[segment];
            (double endAzimuth, int endChannel) = SurroundRing[segment + 1];
            double fraction = Math.Clamp((azimuth - startAzimuth) / (endAzimuth - startAzimuth), 0, 1) * (Math.PI / 2);
            AddPair(power, startChannel, endChannel, Math.Cos(fraction), Math.Sin(fraction));
        }
        double horizontalPower = horizontal * horizontal;
        double spread = (1 - horizontalPower) / ringSize;
        for (int channel = 0; channel < channels; channel++)
        {
            if (layout == SpeakerLayout.Surround51 && channel == LowFrequencyChannel) continue;
            gains[channel] = (float)Math.Sqrt(horizontalPower * power[channel] + spread);
        }
    }

    private static void AddPair(Span<double> power, int first, int second, double firstGain, double secondGain)
    {
        power[first] += firstGain * firstGain;
        power[second] += secondGain * secondGain;
    }
}
