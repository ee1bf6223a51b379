using Lightward.Spacetime;

namespace Lightward.Audio;

/// <summary>
/// Per-channel gains of one voice that glide toward their target sample by sample, so a source that jumps from
/// one side of the ship to the other sweeps across the speakers instead of clicking.
/// </summary>
internal sealed class ChannelGains
{
    private const double GlideSeconds = 0.02;
    private const float SettledGain = 1e-6f;
    private readonly float[] _current;
    private readonly float[] _target;
    private readonly float _glide;

    public ChannelGains(SpeakerLayout layout, int sampleRate)
    {
        Layout = layout;
        _current = new float[SoundFormat.ChannelCount(layout)];
        _target = new float[_current.Length];
        _glide = Smoothing.Coefficient(GlideSeconds, sampleRate);
    }

    public SpeakerLayout Layout { get; }

    /// <summary>Aims at <paramref name="direction"/> (ship axes); the first aim is taken at once, later ones glide.</summary>
    public void Aim(Vec3 direction, bool immediately)
    {
        SpeakerPanner.Gains(Layout, direction, _target);
        if (immediately) _target.CopyTo(_current, 0);
    }

    /// <summary>Adds <paramref name="mono"/> into the interleaved <paramref name="output"/> through the gliding gains.</summary>
    public void MixInto(ReadOnlySpan<float> mono, Span<float> output)
    {
        int channels = _current.Length;
        if (_current.AsSpan().SequenceEqual(_target))
        {
            for (int frame = 0, index = 0; frame < mono.Length; frame++, index += channels)
                for (int channel = 0; channel < channels; channel++) output[index + channel] += mono[frame] * _current[channel];
            return;
        }
        for (int frame = 0, index = 0; frame < mono.Length; frame++, index += channels)
        {
            float sample = mono[frame];
            for (int channel = 0; channel < channels; channel++)
            {
                float difference = _target[channel] - _current[channel];
                // Snap the last hair of the glide so the gains settle exactly and the fast path above takes over.
                float gain = _current[channel] = Math.Abs(difference) < SettledGain ? _target[channel] : _current[channel] + difference * _glide;
                output[index + channel] += sample * gain;
            }
        }
    }
}

/// <summary>One-pole smoothing toward a target, the standard way to move a synthesis parameter without zipper noise or clicks.</summary>
internal static class Smoothing
{
    /// <summary>Per-sample coefficient of a one-pole glide with time constant <paramref name="seconds"/>: 1 − e^(−1/(τ·fs)).</summary>
    public static float Coefficient(double seconds, int sampleRate) => (float)(1 - Math.Exp(-1.0 / (seconds * sampleRate)));
}
