using System.Diagnostics;

namespace Lightward.Benchmarks;

/// <summary>Timing blocks of frames and reading their medians, for the modes that alternate two cases in one process.</summary>
internal static class FrameTiming
{
    /// <summary>
    /// Times <paramref name="frames"/> frames one by one (into <paramref name="times"/> when given) and returns their
    /// mean, after one untimed frame that brings back the caches and wakes the threads the other case left cold: a
    /// live view renders frame after frame.
    /// </summary>
    public static double TimeBlock(Action frame, int frames, List<double>? times = null)
    {
        frame();
        double total = 0;
        for (int i = 0; i < frames; i++)
        {
            long start = Stopwatch.GetTimestamp();
            frame();
            double milliseconds = Stopwatch.GetElapsedTime(start).TotalMilliseconds;
            times?.Add(milliseconds);
            total += milliseconds;
        }
        return total / frames;
    }

    public static double Median(double[] values) => Quantile(values, 0.5);

    /// <summary>The <paramref name="q"/> quantile, interpolated between the two nearest values (so the median of an even count is the mean of the middle two).</summary>
    public static double Quantile(double[] values, double q)
    {
        double[] sorted = [.. values.Order()];
        double at = q * (sorted.Length - 1);
        int below = (int)Math.Floor(at), above = Math.Min(below + 1, sorted.Length - 1);
        return sorted[below] + (at - below) * (sorted[above] - sorted[below]);
    }
}
