namespace Lightward.Benchmarks;

/// <summary>
/// The speed goals measured side by side: each goal's baseline and candidate run in alternating blocks of frames in
/// one process, so that both see the same phases of a shared, drifting machine, and every frame is timed on its own.
/// A goal is read from the median frames (the frame goals are stated for median frames); the medians of the block
/// means are printed beside them, since a block's mean takes in any frame the host stalled. BenchmarkDotNet runs one
/// case after another, minutes apart, and its means take in every slow phase of the host.
/// </summary>
internal static class SideBySide
{
    /// <summary>Frames per timed block, and blocks per case.</summary>
    private const int FramesPerBlock = 10, Blocks = 40;
    /// <summary>Frames per timed block of the SkiaSharp baseline, whose frames take tens of milliseconds each.</summary>
    private const int SkiaFramesPerBlock = 2;

    public static void Run(TextWriter output)
    {
        output.WriteLine($"Side by side: alternating blocks of {FramesPerBlock} frames (SkiaSharp: {SkiaFramesPerBlock}), each after one untimed frame; {Blocks} blocks each.");
        output.WriteLine("Times are median frames; the result is read from them, and in brackets from the medians of the block means (which take in every frame's hiccups).");
        output.WriteLine($"Host before: {HostProbe.Measure()}.");
        output.WriteLine($"{"goal",-58} {"baseline",12} {"candidate",12} {"result",22}");

        var frames = new RenderFrameBenchmarks();
        frames.Setup();
        Reading atRest = Compare(frames.SkiaCirclePerStar, frames.PipelineAtRest, baselineFrames: SkiaFramesPerBlock);
        Report(output, "1080p Hipparcos + CMB at rest vs SkiaSharp per star (≥ 30×)", atRest, (skia, ours) => $"{skia / ours:F1}×");
        Reading turning = Compare(frames.SkiaCirclePerStar, frames.PipelineTurning, baselineFrames: SkiaFramesPerBlock);
        Report(output, "same, turning view vs SkiaSharp per star (≥ 30×)", turning, (skia, ours) => $"{skia / ours:F1}×");
        frames.Cleanup();

        var speed = new RelativisticCostBenchmarks();
        speed.Setup();
        Report(output, "full sky: rapidity 3 vs rest (≤ 1.15×)", Compare(speed.FullSkyAtRest, speed.FullSkyAtRapidity3), (rest, fast) => $"{fast / rest:F2}×");
        Report(output, "90° perspective: rapidity 3 vs rest", Compare(speed.PerspectiveAtRest, speed.PerspectiveAtRapidity3), (rest, fast) => $"{fast / rest:F2}×");

        foreach (int bands in new[] { 24, 48, 96 })
        {
            var nearField = new NearFieldBenchmarks { Bands = bands };
            nearField.Setup();
            int triangles = Rendering.NearField.MeshShapes.Sphere(1, bands).TriangleCount;
            Report(output, $"three bodies of {triangles:N0} triangles + grid, added (≤ 4 ms)", Compare(nearField.FrameWithoutNearField, nearField.FrameWithBodiesAndGrid),
                (without, with) => $"+{with - without:F2} ms");
        }
        output.WriteLine($"Host after: {HostProbe.Measure()}.");
    }

    /// <summary>Milliseconds per frame of a baseline and a candidate: the medians of single frames and of block means.</summary>
    private readonly record struct Reading(double BaselineFrame, double CandidateFrame, double BaselineBlock, double CandidateBlock);

    /// <summary><paramref name="baseline"/> and <paramref name="candidate"/> timed in alternating blocks after a warm-up, every frame on its own.</summary>
    private static Reading Compare(Action baseline, Action candidate, int baselineFrames = FramesPerBlock)
    {
        for (int frame = 0; frame < 10; frame++)
        {
            baseline();
            candidate();
        }
        var baselineFrameTimes = new List<double>();
        var candidateFrameTimes = new List<double>();
        var baselineBlocks = new double[Blocks];
        var candidateBlocks = new double[Blocks];
        for (int block = 0; block < Blocks; block++)
        {
            baselineBlocks[block] = FrameTiming.TimeBlock(baseline, baselineFrames, baselineFrameTimes);
            candidateBlocks[block] = FrameTiming.TimeBlock(candidate, FramesPerBlock, candidateFrameTimes);
        }
        return new Reading(FrameTiming.Median([.. baselineFrameTimes]), FrameTiming.Median([.. candidateFrameTimes]), FrameTiming.Median(baselineBlocks), FrameTiming.Median(candidateBlocks));
    }

    private static void Report(TextWriter output, string goal, Reading reading, Func<double, double, string> result) =>
        output.WriteLine($"{goal,-58} {reading.BaselineFrame,9:F3} ms {reading.CandidateFrame,9:F3} ms "
            + $"{$"{result(reading.BaselineFrame, reading.CandidateFrame)} ({result(reading.BaselineBlock, reading.CandidateBlock)})",22}");
}
