using BenchmarkDotNet.Attributes;
using Lightward.Host.Shows;
using Lightward.Rendering;
using Lightward.Rendering.Safety;

namespace Lightward.Benchmarks;

/// <summary>
/// The flash check reads every delivered frame once more; the goal is that it costs a small fraction of encoding the
/// frame as PNG (the baseline), so checking a show never dominates its delivery.
/// </summary>
[MemoryDiagnoser]
public class ShowCautionsBenchmarks
{
    [Params(2048)]
    public int Size { get; set; }

    private RgbaImage _frame = null!;
    private FlashAnalyser _analyser = null!;

    [GlobalSetup]
    public void Setup()
    {
        _frame = new RgbaImage(Size, Size);
        var random = new Random(7);
        random.NextBytes(_frame.Pixels);
        _analyser = new FlashAnalyser(ShowRenderJob.AnalysisCells, ShowRenderJob.AnalysisCells, 30, 200, ScreenArea.Domemaster(ShowRenderJob.AnalysisCells, Math.PI));
    }

    [Benchmark(Baseline = true)]
    public long EncodePng()
    {
        using var stream = new MemoryStream();
        PngWriter.Encode(_frame, stream);
        return stream.Length;
    }

    [Benchmark]
    public int CheckFlashes()
    {
        _analyser.AddFrame(_frame.Pixels, _frame.Width, _frame.Height);
        return _analyser.FrameCount;
    }
}
