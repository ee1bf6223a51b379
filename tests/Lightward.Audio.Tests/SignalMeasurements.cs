namespace Lightward.Audio.Tests;

/// <summary>Plain measurements on rendered samples: channels, pulse onsets, tone pitch by zero crossings, steps, loudness.</summary>
internal static class SignalMeasurements
{
    public static float[] Render(SoundScene scene, double seconds)
    {
        var samples = new float[(int)Math.Round(seconds * scene.SampleRate) * scene.Channels];
        scene.Render(samples);
        return samples;
    }

    public static float[] Channel(float[] interleaved, int channels, int channel)
    {
        var result = new float[interleaved.Length / channels];
        for (int i = 0; i < result.Length; i++) result[i] = interleaved[i * channels + channel];
        return result;
    }

    /// <summary>Sample indices where sound starts after at least <paramref name="minimumGap"/> samples of silence.</summary>
    public static List<int> Onsets(float[] mono, int minimumGap, float threshold = 1e-4f)
    {
        var onsets = new List<int>();
        int quiet = minimumGap;
        for (int i = 0; i < mono.Length; i++)
        {
            if (Math.Abs(mono[i]) > threshold)
            {
                if (quiet >= minimumGap) onsets.Add(i);
                quiet = 0;
            }
            else quiet++;
        }
        return onsets;
    }

    /// <summary>Pulses per second from the first to the last onset.</summary>
    public static double PulseRate(float[] mono, int sampleRate, int minimumGap)
    {
        List<int> onsets = Onsets(mono, minimumGap);
        Assert.True(onsets.Count >= 3, $"only {onsets.Count} pulses found");
        return (onsets.Count - 1) * (double)sampleRate / (onsets[^1] - onsets[0]);
    }

    /// <summary>
    /// Tone frequency from upward zero crossings (interpolated linearly between samples), measured inside each burst
    /// of sound separately and averaged, so silent gaps between pulses do not count.
    /// </summary>
    public static double Pitch(float[] mono, int sampleRate)
    {
        var crossings = new List<double>();
        for (int i = 1; i < mono.Length; i++)
            if (mono[i - 1] < 0 && mono[i] > 0) crossings.Add(i - 1 + mono[i - 1] / (mono[i - 1] - mono[i]));
        Assert.True(crossings.Count >= 3, "no tone found");
        double typicalPeriod = Median(crossings.Zip(crossings.Skip(1), (a, b) => b - a).ToList());
        var pitches = new List<double>();
        int start = 0;
        for (int i = 1; i <= crossings.Count; i++)
        {
            bool burstEnds = i == crossings.Count || crossings[i] - crossings[i - 1] > 1.5 * typicalPeriod;
            if (!burstEnds) continue;
            int count = i - start;
            if (count >= 3) pitches.Add((count - 1) * (double)sampleRate / (crossings[i - 1] - crossings[start]));
            start = i;
        }
        return pitches.Average();
    }

    public static double MaxStep(float[] mono)
    {
        double max = 0;
        for (int i = 1; i < mono.Length; i++) max = Math.Max(max, Math.Abs(mono[i] - mono[i - 1]));
        return max;
    }

    public static double Rms(ReadOnlySpan<float> mono)
    {
        double sum = 0;
        foreach (float sample in mono) sum += sample * sample;
        return Math.Sqrt(sum / mono.Length);
    }

    private static double Median(List<double> values)
    {
        values.Sort();
        return values[values.Count / 2];
    }
}
