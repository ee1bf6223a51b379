using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Columns;
using BenchmarkDotNet.Configs;
using BenchmarkDotNet.Reports;
using BenchmarkDotNet.Running;
using Lightward.Host;
using Lightward.Host.Frames;
using Lightward.Host.Input;
using Lightward.Host.Simulation;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.Instruments;

namespace Lightward.Benchmarks;

/// <summary>
/// One frame of the flight loop (input → fixed-step physics → render → instruments → present) at 1280×720 over the
/// Hipparcos sky, in a scripted flight that keeps the engine on, turns and raises the time compression. Goal: the
/// frame with instruments at ≥ 60 fps, i.e. median and 99th percentile ≤ 16.7 ms. The baseline is the same frame
/// without instruments, so the ratio is the overlay's cost.
/// </summary>
[Config(typeof(FrameTimeConfig))]
public class HostFrameBenchmarks
{
    private FrameLoop _withInstruments = null!, _skyOnly = null!;
    private InstrumentOverlay _overlay = null!;

    [GlobalSetup]
    public void Setup()
    {
        var scene = new Scene(StarCatalog.LoadHipparcos());
        _overlay = new InstrumentOverlay();
        _withInstruments = Build(scene, instruments: true);
        _skyOnly = Build(scene, instruments: false);
    }

    private FrameLoop Build(Scene scene, bool instruments)
    {
        var session = new FlightSession(FlightSetup.Demo) { Instruments = instruments };
        var host = new HeadlessHost(1280, 720, script: ScriptedPilot);
        var renderer = new FrameComposer(new SkyRenderer(scene, new FrameRenderer(), Math.PI / 2), _overlay);
        return new FrameLoop(host, session, renderer);
    }

    /// <summary>Full throttle, a slow yaw back and forth, and a step of time compression every two seconds up to ×10⁶.</summary>
    private static void ScriptedPilot(long frame, PilotInput input)
    {
        if (frame == 0) input.AddPress(PilotAction.ThrottleFull);
        if (frame % 120 == 60 && frame < 120 * 6) input.AddPress(PilotAction.TimeFaster);
        input.SetHeld(PilotAction.YawRight, frame % 240 < 60);
        input.SetHeld(PilotAction.YawLeft, frame % 240 is >= 120 and < 180);
    }

    [Benchmark(Baseline = true)]
    public void FrameWithoutInstruments() => _skyOnly.RunFrame(1.0 / 60);

    [Benchmark]
    public void FrameWithInstruments() => _withInstruments.RunFrame(1.0 / 60);

    [GlobalCleanup]
    public void Cleanup() => _overlay.Dispose();

    private sealed class FrameTimeConfig : ManualConfig
    {
        public FrameTimeConfig()
        {
            AddColumn(StatisticColumn.Median, new PercentileColumn(99));
            // The generated benchmark project can take minutes to build on a busy two-core machine.
            WithBuildTimeout(TimeSpan.FromMinutes(10));
        }
    }

    /// <summary>A percentile of the measured frame times, in milliseconds (BenchmarkDotNet's built-in columns stop at P95).</summary>
    private sealed class PercentileColumn(int percentile) : IColumn
    {
        public string Id => $"P{percentile}";
        public string ColumnName => $"P{percentile} (ms)";
        public bool AlwaysShow => true;
        public ColumnCategory Category => ColumnCategory.Statistics;
        public int PriorityInCategory => 10;
        public bool IsNumeric => true;
        public UnitType UnitType => UnitType.Dimensionless;
        public string Legend => $"{percentile}th percentile of the frame time, ms";
        public bool IsDefault(Summary summary, BenchmarkCase benchmarkCase) => false;
        public bool IsAvailable(Summary summary) => true;
        public string GetValue(Summary summary, BenchmarkCase benchmarkCase) => GetValue(summary, benchmarkCase, summary.Style);

        public string GetValue(Summary summary, BenchmarkCase benchmarkCase, SummaryStyle style)
        {
            var statistics = summary[benchmarkCase]?.ResultStatistics;
            return statistics is null ? "n/a" : (statistics.Percentiles.Percentile(percentile) / 1e6).ToString("0.00", System.Globalization.CultureInfo.InvariantCulture);
        }
    }
}
