using System.Diagnostics;
using Lightward.Rendering;

namespace Lightward.Benchmarks;

/// <summary>
/// How fast the host is at the moment, for reading a run's figures. A shared VM drifts, and not all work drifts
/// alike: arithmetic keeps its speed while memory that other tenants also use slows down, and a star frame's tone
/// map is mostly writes to scattered lines of the output image. Three readings, each the median of several passes:
/// a chain of dependent arithmetic, and 35,000 writes of 32-byte pixel groups at scattered places of a 1080p RGBA
/// image (about what the 1080p star frame writes), in the frame's tile order, after streaming through 32 MB of
/// other memory as a frame's other stages do; and the same chain run on every core at once (the slowest core's time):
/// a host that lends our second core to other tenants slows the two-core frames while one core alone keeps its speed
/// (seen here: frames 1.5–2× slower, the single chain unchanged), and only this reading shows it.
/// </summary>
internal static class HostProbe
{
    public readonly record struct Reading(double ArithmeticMilliseconds, double AllCoresMilliseconds, double ScatteredWritesMilliseconds)
    {
        public override string ToString() =>
            $"arithmetic chain {ArithmeticMilliseconds:F2} ms ({AllCoresMilliseconds:F2} ms on all {Environment.ProcessorCount} cores at once), scattered image writes {ScatteredWritesMilliseconds:F2} ms";
    }

    private const int Width = 1920, Height = 1080, GroupWidth = HdrFrame.GroupWidth, Groups = 35_000, Passes = 15;
    private const int OtherMemoryBytes = 32 << 20, CacheLine = 64;

    public static Reading Measure()
    {
        uint[] image = new uint[Width * Height];
        byte[] otherMemory = new byte[OtherMemoryBytes];
        int[] groupStarts = ScatteredGroups();
        var arithmetic = new double[Passes];
        var allCores = new double[Passes];
        var writes = new double[Passes];
        var everyCore = new ParallelOptions { MaxDegreeOfParallelism = Environment.ProcessorCount };
        for (int pass = 0; pass < Passes; pass++)
        {
            arithmetic[pass] = Time(() => ArithmeticChain(1_000_000));
            allCores[pass] = Time(() => Parallel.For(0, Environment.ProcessorCount, everyCore, _ => ArithmeticChain(1_000_000)));
            for (int at = 0; at < otherMemory.Length; at += CacheLine) otherMemory[at]++;
            writes[pass] = Time(() => WriteGroups(image, groupStarts, (uint)pass));
        }
        return new Reading(FrameTiming.Median(arithmetic), FrameTiming.Median(allCores), FrameTiming.Median(writes));
    }

    /// <summary>First pixels of the groups to write, in the order a star frame visits them: row band by row band, tile by tile, row by row.</summary>
    private static int[] ScatteredGroups()
    {
        var random = new Random(1);
        int[] starts = [.. Enumerable.Range(0, Groups).Select(_ => random.Next(Height) * Width + random.Next(Width / GroupWidth) * GroupWidth)];
        return [.. starts.OrderBy(start => (start / Width / StarSplatter.BandHeight, start % Width / StarSplatter.TileWidth, start))];
    }

    private static void WriteGroups(uint[] image, int[] groupStarts, uint value)
    {
        foreach (int start in groupStarts) image.AsSpan(start, GroupWidth).Fill(0xFF000000u | value);
    }

    /// <summary>Where the arithmetic chain leaves its result, so that the compiler cannot drop it.</summary>
    private static double _chainEnd;

    /// <summary>Multiply-adds each waiting on the last: a measure of the core's clock alone.</summary>
    private static void ArithmeticChain(int steps)
    {
        double x = 1;
        for (int i = 0; i < steps; i++) x = x * 0.999999 + 1e-7;
        _chainEnd = x;
    }

    private static double Time(Action work)
    {
        long start = Stopwatch.GetTimestamp();
        work();
        return Stopwatch.GetElapsedTime(start).TotalMilliseconds;
    }
}
