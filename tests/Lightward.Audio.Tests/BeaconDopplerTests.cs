using Lightward.Spacetime;

namespace Lightward.Audio.Tests;

public class BeaconDopplerTests
{
    private const int Rate = SoundFormat.SampleRate;

    /// <summary>Doppler factor for a source seen at angle θ′ from the direction of motion, in the observer's frame.</summary>
    private static double DopplerFactor(double rapidity, double seenAngle)
    {
        // D = 1 / (γ (1 − β cos θ′)) — relativistic Doppler shift for a moving observer (Rindler, Relativity:
        // Special, General, and Cosmological (2006), ch. 4; from memory). Plain β is fine at these small rapidities.
        double beta = Math.Tanh(rapidity), gamma = Math.Cosh(rapidity);
        return 1 / (gamma * (1 - beta * Math.Cos(seenAngle)));
    }

    [Theory]
    [InlineData(0.5, 180.0)]  // home beacon dead astern while receding
    [InlineData(1.0, 0.0)]    // beacon dead ahead while approaching
    [InlineData(0.6931, 90.0)] // seen abeam: transverse Doppler
    public void Received_pulse_rate_and_pitch_are_the_proper_values_times_D(double rapidity, double seenAngleDegrees)
    {
        const double properRate = 3, properPitch = 660;
        double doppler = DopplerFactor(rapidity, seenAngleDegrees * Math.PI / 180);
        var scene = new SoundScene();
        scene.SetBeacon("home", properRate, properPitch, doppler, Vec3.UnitZ);

        float[] left = SignalMeasurements.Channel(SignalMeasurements.Render(scene, 12 / (properRate * doppler)), 2, 0);

        double receivedPeriodSamples = Rate / (properRate * doppler);
        double measuredRate = SignalMeasurements.PulseRate(left, Rate, minimumGap: (int)(0.3 * receivedPeriodSamples));
        double measuredPitch = SignalMeasurements.Pitch(left, Rate);
        // Received frequency = proper frequency × D for any periodic signal (relativistic Doppler, Einstein 1905 §7).
        Assert.Equal(properRate * doppler, measuredRate, properRate * doppler * 0.005);
        Assert.Equal(properPitch * doppler, measuredPitch, properPitch * doppler * 0.002);
    }

    [Fact]
    public void Head_on_factors_match_the_longitudinal_Doppler_formula()
    {
        // Longitudinal relativistic Doppler: D = √((1+β)/(1−β)) = e^φ (Taylor & Wheeler, Spacetime Physics (1992),
        // from memory). β = 0.6 gives D = 2 approaching and 1/2 receding.
        Assert.Equal(2.0, DopplerFactor(Math.Atanh(0.6), 0), 1e-12);
        Assert.Equal(0.5, DopplerFactor(Math.Atanh(0.6), Math.PI), 1e-12);
    }

    [Fact]
    public void A_receding_beacon_is_heard_slowing_down_and_dropping_in_pitch()
    {
        var scene = new SoundScene();
        scene.SetBeacon("home", 4, 800, 1, -Vec3.UnitZ);
        float[] atRest = SignalMeasurements.Channel(SignalMeasurements.Render(scene, 3), 2, 0);
        scene.SetBeacon("home", 4, 800, 0.5, -Vec3.UnitZ);
        SignalMeasurements.Render(scene, 0.3); // let the glide settle
        float[] receding = SignalMeasurements.Channel(SignalMeasurements.Render(scene, 6), 2, 0);

        Assert.Equal(4, SignalMeasurements.PulseRate(atRest, Rate, 3000), 0.02);
        Assert.Equal(2, SignalMeasurements.PulseRate(receding, Rate, 6000), 0.02);
        Assert.Equal(800, SignalMeasurements.Pitch(atRest, Rate), 1.0);
        Assert.Equal(400, SignalMeasurements.Pitch(receding, Rate), 1.0);
    }

    [Fact]
    public void Tones_pushed_above_hearing_fall_silent_instead_of_aliasing()
    {
        var scene = new SoundScene();
        // 660 Hz × D = 100 is 66 kHz, beyond both hearing and the 24 kHz Nyquist limit of 48 kHz sound.
        scene.SetBeacon("ahead", 2, 660, 100, Vec3.UnitZ);
        float[] samples = SignalMeasurements.Render(scene, 0.5);
        Assert.All(samples, s => Assert.Equal(0f, s));
    }

    [Fact]
    public void Doppler_changes_glide_without_clicks()
    {
        var scene = new SoundScene();
        var blocks = new List<float>();
        double[] factors = [1, 4, 0.25, 3, 0.5];
        foreach (double doppler in factors)
        {
            scene.SetBeacon("b", 5, 440, doppler, Vec3.UnitZ);
            blocks.AddRange(SignalMeasurements.Render(scene, 0.25));
        }
        float[] left = SignalMeasurements.Channel(blocks.ToArray(), 2, 0);
        // The loudest pure tone here is 1760 Hz at amplitude 0.2/√2: its steepest step is 2π·1760/48000·0.14 ≈ 0.033.
        // A click would be a jump of the order of the amplitude itself (common practice, no published source).
        Assert.True(SignalMeasurements.MaxStep(left) < 0.045, $"largest step {SignalMeasurements.MaxStep(left)}");
    }

    [Fact]
    public void Removed_beacons_fade_out_and_leave_the_scene()
    {
        var scene = new SoundScene();
        scene.SetBeacon("b", 20, 500, 1, Vec3.UnitZ);
        SignalMeasurements.Render(scene, 0.1);
        scene.RemoveBeacon("b");
        float[] fading = SignalMeasurements.Channel(SignalMeasurements.Render(scene, 0.5), 2, 0);
        Assert.True(SignalMeasurements.MaxStep(fading) < 0.045);
        Assert.Equal(0, SignalMeasurements.Rms(fading.AsSpan(fading.Length / 2)), 1e-6);
    }

    [Fact]
    public void Bad_beacon_parameters_are_rejected()
    {
        var scene = new SoundScene();
        Assert.Throws<ArgumentOutOfRangeException>(() => scene.SetBeacon("b", 0, 440, 1, Vec3.UnitZ));
        Assert.Throws<ArgumentOutOfRangeException>(() => scene.SetBeacon("b", 1, double.NaN, 1, Vec3.UnitZ));
        Assert.Throws<ArgumentOutOfRangeException>(() => scene.SetBeacon("b", 1, 440, 0, Vec3.UnitZ));
        Assert.Throws<ArgumentOutOfRangeException>(() => scene.SetBeacon("b", 1, 440, double.PositiveInfinity, Vec3.UnitZ));
    }
}
