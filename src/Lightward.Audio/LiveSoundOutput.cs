using System.Diagnostics;

namespace Lightward.Audio;

/// <summary>Where live sound goes. <see cref="Automatic"/> tries PulseAudio, then ALSA, then plays silently.</summary>
public enum SoundOutputChoice { Automatic, PulseAudio, Alsa, Silent }

/// <summary>A live playback device that accepts interleaved float blocks; writing blocks until the device wants more.</summary>
internal interface ISoundDevice : IDisposable
{
    string Name { get; }
    /// <summary>Plays one block; returns true when the device had run dry before it (an underrun).</summary>
    bool Play(ReadOnlySpan<float> interleaved);
    void Drain();
}

/// <summary>
/// Plays a <see cref="SoundScene"/> live. A background thread pulls fixed blocks (10 ms by default) from the scene and
/// hands them to the device, which paces it, so the frame loop only ever sets state and never waits for sound. When no
/// sound library or server is available it says so in one line and keeps pulling at real-time pace in silence, so a
/// capture still records the flight. Every pulled block can also go to a capture sink (e.g. a 16-bit WAV).
/// </summary>
public sealed class LiveSoundOutput : IDisposable
{
    public const double DefaultBlockSeconds = 0.01;

    private readonly SoundScene _scene;
    private readonly ISoundDevice _device;
    private readonly ISoundBlockSink? _capture;
    private readonly float[] _block;
    private readonly Thread _thread;
    private volatile bool _stopping;
    private long _underruns, _blocks;
    private Exception? _failure;

    private LiveSoundOutput(SoundScene scene, ISoundDevice device, ISoundBlockSink? capture, int blockFrames)
    {
        _scene = scene;
        _device = device;
        _capture = capture;
        _block = new float[blockFrames * scene.Channels];
        _thread = new Thread(Run) { IsBackground = true, Name = "lightward sound", Priority = ThreadPriority.AboveNormal };
        _thread.Start();
    }

    /// <summary>"pulseaudio", "alsa" or "silent".</summary>
    public string DeviceName => _device.Name;
    public bool IsSilent => _device is SilentDevice;
    /// <summary>Times the device ran dry before the next block arrived.</summary>
    public long Underruns => Interlocked.Read(ref _underruns);
    public long BlocksPlayed => Interlocked.Read(ref _blocks);

    /// <summary>
    /// Starts playing <paramref name="scene"/>. <paramref name="info"/> receives one line when sound falls back to
    /// silence (and why); <paramref name="capture"/>, if given, receives every block played. The capture is written
    /// only from the playback thread; commit it after disposing this output.
    /// </summary>
    public static LiveSoundOutput Start(SoundScene scene, Action<string> info, ISoundBlockSink? capture = null,
        SoundOutputChoice choice = SoundOutputChoice.Automatic, double blockSeconds = DefaultBlockSeconds)
    {
        ArgumentNullException.ThrowIfNull(scene);
        ArgumentNullException.ThrowIfNull(info);
        if (!(blockSeconds is > 0 and <= 1)) throw new ArgumentOutOfRangeException(nameof(blockSeconds), blockSeconds, "between 0 and 1 s");
        int blockFrames = (int)Math.Round(blockSeconds * scene.SampleRate);
        ISoundDevice device = OpenDevice(scene, blockFrames, choice, info);
        return new LiveSoundOutput(scene, device, capture, blockFrames);
    }

    private static ISoundDevice OpenDevice(SoundScene scene, int blockFrames, SoundOutputChoice choice, Action<string> info)
    {
        var reasons = new List<string>();
        if (choice is SoundOutputChoice.Automatic or SoundOutputChoice.PulseAudio)
        {
            ISoundDevice? pulse = PulseAudioDevice.TryOpen(scene.SampleRate, scene.Layout, blockFrames, out string? why);
            if (pulse is not null) return pulse;
            reasons.Add(why!);
        }
        if (choice is SoundOutputChoice.Automatic or SoundOutputChoice.Alsa)
        {
            ISoundDevice? alsa = AlsaDevice.TryOpen(scene.SampleRate, scene.Channels, blockFrames, out string? why);
            if (alsa is not null) return alsa;
            reasons.Add(why!);
        }
        if (choice != SoundOutputChoice.Silent)
            info($"no sound output ({string.Join("; ", reasons)}): sound is muted; install pulseaudio (or libasound2 with a sound card) to hear it");
        return new SilentDevice(scene.SampleRate, blockFrames);
    }

    private void Run()
    {
        try
        {
            while (!_stopping)
            {
                _scene.Render(_block);
                _capture?.Write(_block);
                if (_device.Play(_block)) Interlocked.Increment(ref _underruns);
                Interlocked.Increment(ref _blocks);
            }
            _device.Drain();
        }
        catch (Exception e)
        {
            // Sound must never bring the flight down; the failure is reported when the output is disposed.
            _failure = e;
        }
    }

    /// <summary>Stops the playback thread and closes the device. Throws if the playback thread failed (e.g. the capture disk filled).</summary>
    public void Dispose()
    {
        _stopping = true;
        _thread.Join();
        _device.Dispose();
        if (_failure is not null) throw new IOException($"sound playback stopped: {_failure.Message}", _failure);
    }
}

/// <summary>No sound device: waits out each block in real time so that everything downstream keeps its pace.</summary>
internal sealed class SilentDevice(int sampleRate, int blockFrames) : ISoundDevice
{
    private readonly Stopwatch _clock = Stopwatch.StartNew();
    private readonly double _blockSeconds = (double)blockFrames / sampleRate;
    private long _played;

    public string Name => "silent";

    public bool Play(ReadOnlySpan<float> interleaved)
    {
        _played++;
        double ahead = _played * _blockSeconds - _clock.Elapsed.TotalSeconds;
        bool ranDry = ahead < 0;
        if (ranDry) _played = (long)Math.Ceiling(_clock.Elapsed.TotalSeconds / _blockSeconds);
        else Thread.Sleep(TimeSpan.FromSeconds(ahead));
        return ranDry;
    }

    public void Drain() { }
    public void Dispose() { }
}
