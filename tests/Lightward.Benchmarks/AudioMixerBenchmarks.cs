using BenchmarkDotNet.Attributes;
using Lightward.Audio;
using Lightward.Spacetime;

namespace Lightward.Benchmarks;

/// <summary>
/// Cost of mixing one 10 ms block (480 sample frames at 48 kHz), the live output's block size. Real time allows
/// 10 ms per block; the goal is a tiny fraction of that with the engine, 8 beacons and alerts sounding.
/// </summary>
[MemoryDiagnoser]
public class AudioMixerBenchmarks
{
    private const int BlockFrames = SoundFormat.SampleRate / 100;
    private static readonly AlertKind[] AllAlerts = Enum.GetValues<AlertKind>();
    private SoundScene _engineOnly = null!, _fullStereo = null!, _fullSurround = null!;
    private float[] _stereoBlock = null!, _surroundBlock = null!;

    [GlobalSetup]
    public void Setup()
    {
        _engineOnly = new SoundScene();
        _engineOnly.SetEngine(0.8);
        _fullStereo = FullScene(SpeakerLayout.Stereo);
        _fullSurround = FullScene(SpeakerLayout.Surround51);
        _stereoBlock = new float[BlockFrames * 2];
        _surroundBlock = new float[BlockFrames * 6];
    }

    private static SoundScene FullScene(SpeakerLayout layout)
    {
        var scene = new SoundScene(layout);
        scene.SetEngine(0.8);
        for (int i = 0; i < 8; i++)
        {
            double angle = i * Math.PI / 4;
            // Beacons all around, approaching and receding: D from e^(−1) to e^(+1).
            scene.SetBeacon($"beacon {i}", 1 + i, 300 + 60 * i, Math.Exp(Math.Cos(angle)), new Vec3(Math.Sin(angle), 0.2, Math.Cos(angle)));
        }
        return scene;
    }

    private static void RaiseAll(SoundScene scene)
    {
        foreach (AlertKind kind in AllAlerts) scene.RaiseAlert(kind);
    }

    [Benchmark(Baseline = true, Description = "engine only, stereo")]
    public void EngineOnly() => _engineOnly.Render(_stereoBlock);

    [Benchmark(Description = "engine + 8 beacons + alerts, stereo")]
    public void FullStereo()
    {
        RaiseAll(_fullStereo);
        _fullStereo.Render(_stereoBlock);
    }

    [Benchmark(Description = "engine + 8 beacons + alerts, 5.1")]
    public void FullSurround()
    {
        RaiseAll(_fullSurround);
        _fullSurround.Render(_surroundBlock);
    }
}
