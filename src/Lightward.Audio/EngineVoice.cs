namespace Lightward.Audio;

/// <summary>
/// The main engine: a low harmonic drone plus filtered exhaust noise whose pitch, brightness and loudness follow the
/// thrust level. Thrust glides per sample, so a throttle slammed from zero to full never clicks.
/// </summary>
internal sealed class EngineVoice
{
    private const double ThrustGlideSeconds = 0.06;
    private const double IdlePitchHz = 36;
    private const double FullThrustPitchRiseHz = 54;
    private const double QuietNoiseCutoffHz = 150;
    private const double FullThrustNoiseCutoffRiseHz = 650;
    private const float Loudness = 0.25f;
    // Amplitudes of harmonics 1, 2, 3 and 5: a hollow, reedy drone.
    private const float Fundamental = 1f, Second = 0.6f, Third = 0.35f, Fifth = 0.15f;
    private const float PartialsNormalisation = 1 / (Fundamental + Second + Third + Fifth);

    private readonly int _sampleRate;
    private readonly float _thrustGlide;
    private double _thrust;
    private double _phase;
    private uint _noiseState = 0x9E3779B9;
    private float _noiseLowPass;

    public EngineVoice(int sampleRate)
    {
        _sampleRate = sampleRate;
        _thrustGlide = Smoothing.Coefficient(ThrustGlideSeconds, sampleRate);
    }

    /// <summary>The thrust level the engine glides toward, 0…1.</summary>
    public double TargetThrust { get; set; }

    /// <summary>True while the engine is audible or still gliding, so the mixer may skip it when it is fully off.</summary>
    public bool IsSounding => TargetThrust > 0 || _thrust > 1e-6;

    public void RenderMono(Span<float> mono)
    {
        double target = TargetThrust;
        for (int i = 0; i < mono.Length; i++)
        {
            _thrust += (target - _thrust) * _thrustGlide;
            double pitch = IdlePitchHz + FullThrustPitchRiseHz * _thrust;
            _phase += pitch / _sampleRate;
            _phase -= Math.Floor(_phase);
            // Harmonics k = 1…5 by the Chebyshev recurrence sin((k+1)x) = 2 cos x · sin(kx) − sin((k−1)x): two trig calls a sample.
            float angle = (float)(2 * Math.PI * _phase);
            float first = MathF.Sin(angle), twiceCos = 2 * MathF.Cos(angle);
            float second = twiceCos * first, third = twiceCos * second - first;
            float fifth = twiceCos * (twiceCos * third - second) - third;
            float tone = (Fundamental * first + Second * second + Third * third + Fifth * fifth) * PartialsNormalisation;

            // Small-angle one-pole low-pass: α ≈ 2π fc / fs is accurate enough below 1 kHz at 48 kHz.
            float cutoffCoefficient = (float)(2 * Math.PI * (QuietNoiseCutoffHz + FullThrustNoiseCutoffRiseHz * _thrust) / _sampleRate);
            _noiseLowPass += (NextWhiteNoise() - _noiseLowPass) * cutoffCoefficient;

            mono[i] = Loudness * (float)_thrust * (0.7f * tone + 0.9f * _noiseLowPass);
        }
    }

    /// <summary>Uniform white noise in [−1, 1) from a fixed-seed xorshift, so renders are bit-for-bit repeatable.</summary>
    private float NextWhiteNoise()
    {
        uint x = _noiseState;
        x ^= x << 13;
        x ^= x >> 17;
        x ^= x << 5;
        _noiseState = x;
        return (int)x * (1f / 2147483648f);
    }
}
