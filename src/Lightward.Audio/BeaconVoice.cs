namespace Lightward.Audio;

/// <summary>
/// A beacon heard as a train of tone pulses. The whole signal is received time-scaled by the Doppler factor D of
/// the direction the beacon is seen in: pulse rate, tone pitch and pulse length all change by D, so a receding
/// beacon slows down and drops in pitch. Rate and pitch glide per sample when D changes; each pulse has a
/// sin² envelope so it starts and ends at zero.
/// </summary>
internal sealed class BeaconVoice
{
    /// <summary>The fraction of each pulse period the tone sounds, in the beacon's own frame and therefore in any frame.</summary>
    public const double PulseDuty = 0.25;

    private const double GlideSeconds = 0.025;
    private const double FadeSeconds = 0.02;
    private const float Loudness = 0.2f;

    private readonly int _sampleRate;
    private readonly float _glide;
    private readonly float _fade;
    private double _rate, _pitch, _level;
    private double _pulsePhase, _tonePhase;

    public BeaconVoice(SpeakerLayout layout, int sampleRate, double receivedRateHz, double receivedPitchHz)
    {
        _sampleRate = sampleRate;
        _glide = Smoothing.Coefficient(GlideSeconds, sampleRate);
        _fade = Smoothing.Coefficient(FadeSeconds, sampleRate);
        Gains = new ChannelGains(layout, sampleRate);
        _rate = TargetRateHz = receivedRateHz;
        _pitch = TargetPitchHz = receivedPitchHz;
        _level = 1;
    }

    public ChannelGains Gains { get; }
    public double TargetRateHz { get; set; }
    public double TargetPitchHz { get; set; }
    /// <summary>Set when the beacon leaves the scene: it fades out, then the mixer drops it.</summary>
    public bool Leaving { get; set; }
    public bool HasFadedOut => Leaving && _level < 1e-5;

    public void RenderMono(Span<float> mono)
    {
        double targetRate = TargetRateHz, targetPitch = TargetPitchHz, targetLevel = Leaving ? 0 : 1;
        for (int i = 0; i < mono.Length; i++)
        {
            _rate += (targetRate - _rate) * _glide;
            _pitch += (targetPitch - _pitch) * _glide;
            _level += (targetLevel - _level) * _fade;
            _pulsePhase += _rate / _sampleRate;
            _pulsePhase -= Math.Floor(_pulsePhase);
            _tonePhase += _pitch / _sampleRate;
            _tonePhase -= Math.Floor(_tonePhase);
            double audible = _pulsePhase < PulseDuty ? Hearing.Weight(_pitch) : 0;
            if (audible == 0)
            {
                mono[i] = 0;
                continue;
            }
            // sin² envelope over the pulse, written as (1 − cos 2x)/2 to need one trig call.
            float envelope = 0.5f - 0.5f * MathF.Cos((float)(2 * Math.PI / PulseDuty * _pulsePhase));
            mono[i] = (float)(Loudness * _level * audible) * envelope * MathF.Sin((float)(2 * Math.PI * _tonePhase));
        }
    }
}

/// <summary>
/// The band of tones we let through. Hearing runs from about 20 Hz to 20 kHz (textbook range, from memory); Doppler-shifted
/// tones fade out toward both edges instead of aliasing above the 24 kHz Nyquist frequency or rumbling below hearing.
/// </summary>
public static class Hearing
{
    public const double LowFadeStartHz = 15, LowFadeEndHz = 30, HighFadeStartHz = 15_000, HighFadeEndHz = 20_000;

    /// <summary>Loudness weight of a tone: 1 inside the band, fading linearly to 0 at its edges.</summary>
    public static double Weight(double pitchHz)
    {
        if (pitchHz <= LowFadeStartHz || pitchHz >= HighFadeEndHz) return 0;
        if (pitchHz < LowFadeEndHz) return (pitchHz - LowFadeStartHz) / (LowFadeEndHz - LowFadeStartHz);
        if (pitchHz > HighFadeStartHz) return (HighFadeEndHz - pitchHz) / (HighFadeEndHz - HighFadeStartHz);
        return 1;
    }
}
