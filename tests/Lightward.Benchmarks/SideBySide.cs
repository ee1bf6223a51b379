using System.Diagnostics;

namespace Lightward.Benchmarks;

/// <summary>
/// The speed goals measured side by side: each goal's baseline and candidate run in alternating blocks of frames in
/// one process, so that both see the same phases of a shared, drifting machine, and the medians of the block times
/// are compared. BenchmarkDotNet runs one case after another, minutes apart, and its means take in every slow phase
/// of the host; here the ratio of medians is what a goal is read from (the frame goals are stated for median frames).
/// </summary>
internal static class SideBySide
{
    /// <summary>Frames per timed block, and blocks per case.</summary>
    private const int FramesPerBlock = 10, Blocks = 40;
    /// <summary>Frames per timed block of the SkiaSharp baseline, whose frames take tens of milliseconds each.</summary>
    private const int SkiaFramesPerBlock = 2;

    public static void Run(TextWriter output)
    {
        output.WriteLine($"Side by side: alternating blocks of {FramesPerBlock} frames (SkiaSharp: {SkiaFramesPerBlock}), each after one untimed frame; {Blocks} blocks each; medians of the block means.");
        output.WriteLine($"{"goal",-58} {"baseline",12} {"candidate",12} {"result",12}");

        var frames = new RenderFrameBenchmarks();
        frames.Setup();
        (double skia, double atRest) = Compare(frames.SkiaCirclePerStar, frames.PipelineAtRest, baselineFrames: SkiaFramesPerBlock);
        Report(output, "1080p Hipparcos + CMB at rest vs SkiaSharp per star (≥ 30×)", skia, atRest, $"{skia / atRest:F1}×");
        (skia, double turning) = Compare(frames.SkiaCirclePerStar, frames.PipelineTurning, baselineFrames: SkiaFramesPerBlock);
        Report(output, "same, turning view vs SkiaSharp per star (≥ 30×)", skia, turning, $"{skia / turning:F1}×");
        frames.Cleanup();

        var speed = new RelativisticCostBenchmarks();
        speed.Setup();
        (double rest, double fast) = Compare(speed.FullSkyAtRest, speed.FullSkyAtRapidity3);
        Report(output, "full sky: rapidity 3 vs rest (≤ 1.15×)", rest, fast, $"{fast / rest:F2}×");
        (rest, fast) = Compare(speed.PerspectiveAtRest, speed.PerspectiveAtRapidity3);
        Report(output, "90° perspective: rapidity 3 vs rest", rest, fast, $"{fast / rest:F2}×");

        foreach (int bands in new[] { 24, 48, 96 })
        {
            var nearField = new NearFieldBenchmarks { Bands = bands };
            nearField.Setup();
            (double without, double with) = Compare(nearField.FrameWithoutNearField, nearField.FrameWithBodiesAndGrid);
            int triangles = Rendering.NearField.MeshShapes.Sphere(1, bands).TriangleCount;
            Report(output, $"three bodies of {triangles:N0} triangles + grid, added (≤ 4 ms)", without, with, $"+{with - without:F2} ms");
        }
    }

    /// <summary>Median milliseconds per frame of <paramref name="baseline"/> and <paramref name="candidate"/>, timed in alternating blocks after a warm-up.</summary>
    private static (double Baseline, double Candidate) Compare(Action baseline, Action candidate, int baselineFrames = FramesPerBlock)
    {
        for (int frame = 0; frame < 10; frame++)
        {
            baseline();
            candidate();
        }
        var baselineTimes = new double[Blocks];
        var candidateTimes = new double[Blocks];
        for (int block = 0; block < Blocks; block++)
        {
            baselineTimes[block] = BlockMean(baseline, baselineFrames);
            candidateTimes[block] = BlockMean(candidate, FramesPerBlock);
        }
        return (Median(baselineTimes), Median(candidateTimes));
    }

    /// <summary>
    /// Mean time of <paramref name="frames"/> frames, after one untimed frame that brings back the caches and wakes the
    /// threads the other case left cold: a live view renders frame after frame.
    /// </summary>
    private static double BlockMean(Action frame, int frames)
    {
        frame();
        long start = Stopwatch.GetTimestamp();
        for (int i = 0; i < frames; i++) frame();
        return Stopwatch.GetElapsedTime(start).TotalMilliseconds / frames;
    }

    private static double Median(double[] values)
    {
        Array.Sort(values);
        int middle = values.Length / 2;
        return values.Length % 2 == 1 ? values[middle] : (values[middle - 1] + values[middle]) / 2;
    }

    private static void Report(TextWriter output, string goal, double baseline, double candidate, string result) =>
        output.WriteLine($"{goal,-58} {baseline,9:F3} ms {candidate,9:F3} ms {result,12}");
}
