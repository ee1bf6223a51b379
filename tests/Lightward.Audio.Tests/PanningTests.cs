using CsCheck;
using Lightward.Spacetime;

namespace Lightward.Audio.Tests;

public class PanningTests
{
    private static float[] Gains(SpeakerLayout layout, Vec3 direction)
    {
        var gains = new float[SoundFormat.ChannelCount(layout)];
        SpeakerPanner.Gains(layout, direction, gains);
        return gains;
    }

    private static Vec3 AtAzimuth(double degrees) => new(Math.Sin(degrees * Math.PI / 180), 0, Math.Cos(degrees * Math.PI / 180));

    [Fact]
    public void Squared_gains_sum_to_one_for_every_direction()
    {
        // Constant-power panning: Σ g² = 1 keeps loudness as a source moves (sine/cosine pan law, common practice,
        // no published source).
        Gen.Double[-1, 1].Select(Gen.Double[-1, 1], Gen.Double[-1, 1]).Sample((x, y, z) =>
        {
            foreach (SpeakerLayout layout in Enum.GetValues<SpeakerLayout>())
                Assert.Equal(1.0, Gains(layout, new Vec3(x, y, z)).Sum(g => (double)g * g), 1e-5);
        });
    }

    [Theory]
    [InlineData(0.0, 2)]     // C
    [InlineData(30.0, 1)]    // R
    [InlineData(-30.0, 0)]   // L
    [InlineData(110.0, 5)]   // Rs
    [InlineData(-110.0, 4)]  // Ls
    public void A_source_at_a_speaker_of_the_5_1_ring_plays_from_that_speaker_alone(double azimuth, int channel)
    {
        // Loudspeaker azimuths C 0°, L/R ±30°, Ls/Rs ±110°: ITU-R BS.775-3, figure 1.
        float[] gains = Gains(SpeakerLayout.Surround51, AtAzimuth(azimuth));
        for (int c = 0; c < gains.Length; c++) Assert.Equal(c == channel ? 1f : 0f, gains[c], 1e-6f);
    }

    [Fact]
    public void Stereo_sides_are_hard_and_the_centre_is_three_decibels_down()
    {
        // Sine/cosine pan law: −3 dB (1/√2) per side at the centre (common practice, no published source).
        Assert.Equal([0f, 1f], Gains(SpeakerLayout.Stereo, Vec3.UnitX), new ToleranceComparer(1e-6f));
        Assert.Equal([1f, 0f], Gains(SpeakerLayout.Stereo, -Vec3.UnitX), new ToleranceComparer(1e-6f));
        float half = (float)Math.Sqrt(0.5);
        Assert.Equal([half, half], Gains(SpeakerLayout.Stereo, Vec3.UnitZ), new ToleranceComparer(1e-6f));
        Assert.Equal([half, half], Gains(SpeakerLayout.Stereo, Vec3.UnitY), new ToleranceComparer(1e-6f));
    }

    [Fact]
    public void The_lfe_channel_never_receives_panned_sources_and_overhead_spreads_evenly()
    {
        float[] overhead = Gains(SpeakerLayout.Surround51, Vec3.UnitY);
        Assert.Equal(0f, overhead[SpeakerPanner.LowFrequencyChannel]);
        foreach (int c in new[] { 0, 1, 2, 4, 5 }) Assert.Equal((float)Math.Sqrt(0.2), overhead[c], 1e-6f);
    }

    [Fact]
    public void A_beacon_on_the_right_is_louder_in_the_right_channel()
    {
        var scene = new SoundScene();
        scene.SetBeacon("right", 10, 500, 1, new Vec3(1, 0, 1));
        float[] samples = SignalMeasurements.Render(scene, 0.5);
        double left = SignalMeasurements.Rms(SignalMeasurements.Channel(samples, 2, 0));
        double right = SignalMeasurements.Rms(SignalMeasurements.Channel(samples, 2, 1));
        // Azimuth 45°: pan position p = sin 45°, gains cos((p+1)π/4) and sin((p+1)π/4) by the sine/cosine law.
        Assert.Equal(Math.Tan((1 + Math.Sqrt(0.5)) * Math.PI / 4), right / left, 1e-3);
    }

    private sealed class ToleranceComparer(float tolerance) : IEqualityComparer<float>
    {
        public bool Equals(float a, float b) => Math.Abs(a - b) <= tolerance;
        public int GetHashCode(float value) => 0;
    }
}
