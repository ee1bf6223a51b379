using Lightward.Spacetime;
using NAudio.Wave;

namespace Lightward.Audio;

/// <summary>
/// The ship's sound: engine, beacons and alerts mixed into interleaved float samples. The frame loop sets the
/// current state from its thread (<see cref="SetEngine"/>, <see cref="SetBeacon"/>, <see cref="RaiseAlert"/>);
/// an output pulls fixed-size blocks through <see cref="Render"/> from another. Changes take effect at the next
/// block and every parameter glides per sample, so updates never click. Rendering is deterministic: the same
/// calls between the same blocks give the same samples.
/// </summary>
public sealed class SoundScene : ISampleProvider
{
    /// <summary>The engine is heard from behind the ship, where the exhaust leaves (the main engine pushes along +Z).</summary>
    private static readonly Vec3 EngineDirection = -Vec3.UnitZ;
    /// <summary>Alerts come from ahead (the centre speaker in 5.1).</summary>
    private static readonly Vec3 AlertDirection = Vec3.UnitZ;
    /// <summary>The LFE channel carries the engine below 120 Hz (Dolby/ITU common practice for the LFE band, from memory).</summary>
    private const double LowFrequencyCutoffHz = 120;
    private const int MaxBlockFrames = 1024;

    private readonly object _sync = new();
    // What the frame loop asked for, guarded by _sync; copied into the voices at the start of each block.
    private readonly Dictionary<string, BeaconRequest> _requestedBeacons = new(StringComparer.Ordinal);
    private readonly List<AlertKind> _raisedAlerts = [];
    private double _requestedThrust;
    private bool _beaconsChanged;

    // Owned by the rendering thread.
    private readonly Dictionary<string, BeaconVoice> _beacons = new(StringComparer.Ordinal);
    private readonly List<string> _fadedBeacons = [];
    private readonly EngineVoice _engine;
    private readonly ChannelGains _engineGains;
    private readonly AlertVoice _alerts;
    private readonly float[] _mono = new float[MaxBlockFrames];
    private readonly float _lowFrequencyCoefficient;
    private float _lowFrequencyState;

    private readonly record struct BeaconRequest(double RateHz, double PitchHz, Vec3 Direction);

    public SoundScene(SpeakerLayout layout = SpeakerLayout.Stereo, int sampleRate = SoundFormat.SampleRate)
    {
        if (sampleRate <= 0) throw new ArgumentOutOfRangeException(nameof(sampleRate), "the sample rate must be positive");
        Layout = layout;
        SampleRate = sampleRate;
        Channels = SoundFormat.ChannelCount(layout);
        WaveFormat = WaveFormat.CreateIeeeFloatWaveFormat(sampleRate, Channels);
        _engine = new EngineVoice(sampleRate);
        _engineGains = new ChannelGains(layout, sampleRate);
        _engineGains.Aim(EngineDirection, immediately: true);
        _alerts = new AlertVoice(layout, sampleRate);
        _alerts.Gains.Aim(AlertDirection, immediately: true);
        _lowFrequencyCoefficient = Smoothing.Coefficient(1 / (2 * Math.PI * LowFrequencyCutoffHz), sampleRate);
    }

    public SpeakerLayout Layout { get; }
    public int SampleRate { get; }
    /// <summary>Interleaved channels per sample frame, in the order of <see cref="SoundFormat.ChannelNames"/>.</summary>
    public int Channels { get; }
    /// <summary>IEEE float at <see cref="SampleRate"/> with <see cref="Channels"/> channels, for NAudio pipelines.</summary>
    public WaveFormat WaveFormat { get; }
    /// <summary>Sample frames rendered so far (one frame = one sample per channel).</summary>
    public long FramesRendered { get; private set; }

    /// <summary>Sets the engine's thrust level, 0 (off) … 1 (full); values outside are clamped, NaN counts as off.</summary>
    public void SetEngine(double thrustFraction)
    {
        double thrust = double.IsNaN(thrustFraction) ? 0 : Math.Clamp(thrustFraction, 0, 1);
        lock (_sync) _requestedThrust = thrust;
    }

    /// <summary>
    /// Adds or updates the beacon <paramref name="id"/>: it pulses at <paramref name="properRateHz"/> with a tone of
    /// <paramref name="properPitchHz"/>, both in its own rest frame, and is heard at rate and pitch × <paramref name="doppler"/>
    /// (the Doppler factor D of the direction it is seen in) from <paramref name="directionInShipAxes"/>
    /// (+Z forward, +X right, +Y up; need not be unit length).
    /// </summary>
    public void SetBeacon(string id, double properRateHz, double properPitchHz, double doppler, Vec3 directionInShipAxes)
    {
        ArgumentNullException.ThrowIfNull(id);
        if (!(properRateHz > 0) || !double.IsFinite(properRateHz)) throw new ArgumentOutOfRangeException(nameof(properRateHz), properRateHz, "must be positive and finite");
        if (!(properPitchHz > 0) || !double.IsFinite(properPitchHz)) throw new ArgumentOutOfRangeException(nameof(properPitchHz), properPitchHz, "must be positive and finite");
        if (!(doppler > 0) || !double.IsFinite(doppler)) throw new ArgumentOutOfRangeException(nameof(doppler), doppler, "must be positive and finite");
        lock (_sync)
        {
            _requestedBeacons[id] = new BeaconRequest(properRateHz * doppler, properPitchHz * doppler, directionInShipAxes);
            _beaconsChanged = true;
        }
    }

    /// <summary>Fades the beacon <paramref name="id"/> out and drops it; unknown ids are ignored.</summary>
    public void RemoveBeacon(string id)
    {
        lock (_sync) _beaconsChanged |= _requestedBeacons.Remove(id);
    }

    /// <summary>Starts the pattern of <paramref name="kind"/> at the next block, unless it is already sounding.</summary>
    public void RaiseAlert(AlertKind kind)
    {
        if (!Enum.IsDefined(kind)) throw new ArgumentOutOfRangeException(nameof(kind), kind, null);
        lock (_sync) _raisedAlerts.Add(kind);
    }

    /// <summary>Fills <paramref name="interleaved"/> (a whole number of sample frames) with the next samples.</summary>
    public void Render(Span<float> interleaved)
    {
        if (interleaved.Length % Channels != 0)
            throw new ArgumentException($"the buffer must hold whole sample frames of {Channels} channels", nameof(interleaved));
        lock (_sync) TakeUpdates();
        interleaved.Clear();
        for (int offset = 0; offset < interleaved.Length; offset += MaxBlockFrames * Channels)
            MixBlock(interleaved.Slice(offset, Math.Min(MaxBlockFrames * Channels, interleaved.Length - offset)));
        FramesRendered += interleaved.Length / Channels;
        DropFadedBeacons();
    }

    /// <summary>NAudio's pull interface: always fills the whole buffer (the scene never ends).</summary>
    public int Read(Span<float> buffer)
    {
        int whole = buffer.Length - buffer.Length % Channels;
        Render(buffer[..whole]);
        buffer[whole..].Clear();
        return buffer.Length;
    }

    private void TakeUpdates()
    {
        _engine.TargetThrust = _requestedThrust;
        foreach (AlertKind kind in _raisedAlerts) _alerts.Raise(kind);
        _raisedAlerts.Clear();
        if (!_beaconsChanged) return;
        _beaconsChanged = false;
        foreach ((string id, BeaconRequest request) in _requestedBeacons)
        {
            if (_beacons.TryGetValue(id, out BeaconVoice? beacon))
            {
                beacon.TargetRateHz = request.RateHz;
                beacon.TargetPitchHz = request.PitchHz;
                beacon.Leaving = false;
                beacon.Gains.Aim(request.Direction, immediately: false);
            }
            else
            {
                beacon = new BeaconVoice(Layout, SampleRate, request.RateHz, request.PitchHz);
                beacon.Gains.Aim(request.Direction, immediately: true);
                _beacons.Add(id, beacon);
            }
        }
        foreach ((string id, BeaconVoice beacon) in _beacons)
            if (!_requestedBeacons.ContainsKey(id)) beacon.Leaving = true;
    }

    private void MixBlock(Span<float> block)
    {
        Span<float> mono = _mono.AsSpan(0, block.Length / Channels);
        if (_engine.IsSounding)
        {
            _engine.RenderMono(mono);
            _engineGains.MixInto(mono, block);
            if (Layout == SpeakerLayout.Surround51) AddLowFrequency(mono, block);
        }
        foreach (BeaconVoice beacon in _beacons.Values)
        {
            beacon.RenderMono(mono);
            beacon.Gains.MixInto(mono, block);
        }
        if (_alerts.IsSounding)
        {
            _alerts.RenderMono(mono);
            _alerts.Gains.MixInto(mono, block);
        }
    }

    private void AddLowFrequency(ReadOnlySpan<float> mono, Span<float> block)
    {
        for (int frame = 0; frame < mono.Length; frame++)
        {
            _lowFrequencyState += (mono[frame] - _lowFrequencyState) * _lowFrequencyCoefficient;
            block[frame * Channels + SpeakerPanner.LowFrequencyChannel] += _lowFrequencyState;
        }
    }

    private void DropFadedBeacons()
    {
        foreach ((string id, BeaconVoice beacon) in _beacons)
            if (beacon.HasFadedOut) _fadedBeacons.Add(id);
        foreach (string id in _fadedBeacons) _beacons.Remove(id);
        _fadedBeacons.Clear();
    }
}
