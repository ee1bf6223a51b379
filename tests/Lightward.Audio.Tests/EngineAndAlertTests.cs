namespace Lightward.Audio.Tests;

public class EngineAndAlertTests
{
    private const int Rate = SoundFormat.SampleRate;

    [Fact]
    public void Slamming_the_throttle_never_clicks()
    {
        var scene = new SoundScene();
        var samples = new List<float>();
        foreach (double thrust in new[] { 0, 1, 0.1, 1, 0, 0.7, 0 })
        {
            scene.SetEngine(thrust);
            samples.AddRange(SignalMeasurements.Render(scene, 0.2));
        }
        float[] left = SignalMeasurements.Channel(samples.ToArray(), 2, 0);

        var steady = new SoundScene();
        steady.SetEngine(1);
        SignalMeasurements.Render(steady, 0.5);
        float[] steadyLeft = SignalMeasurements.Channel(SignalMeasurements.Render(steady, 1.4), 2, 0);
        // Without gliding, a jump to full thrust would step by about the engine's full amplitude (~0.2) in one
        // sample. No transition may step further than the steady engine's own texture does (common practice, no
        // published source).
        double largestStep = SignalMeasurements.MaxStep(left), steadyStep = SignalMeasurements.MaxStep(steadyLeft);
        Assert.True(largestStep <= 1.25 * steadyStep && largestStep < 0.05, $"largest step {largestStep}, steady engine {steadyStep}");
        Assert.True(SignalMeasurements.Rms(steadyLeft) > 0.04, $"full-thrust rms {SignalMeasurements.Rms(steadyLeft)}");
    }

    [Fact]
    public void Engine_loudness_follows_thrust_and_stops_when_off()
    {
        double RmsAt(double thrust)
        {
            var scene = new SoundScene();
            scene.SetEngine(thrust);
            SignalMeasurements.Render(scene, 0.5);
            return SignalMeasurements.Rms(SignalMeasurements.Render(scene, 0.5));
        }
        double off = RmsAt(0), low = RmsAt(0.3), full = RmsAt(1);
        Assert.Equal(0, off);
        Assert.True(low > 0.005 && full > 2 * low, $"low {low}, full {full}");
    }

    [Fact]
    public void Each_alert_has_its_own_pattern()
    {
        var signatures = new HashSet<(int Notes, int Pitch)>();
        foreach (AlertKind kind in Enum.GetValues<AlertKind>())
        {
            var scene = new SoundScene();
            scene.RaiseAlert(kind);
            float[] left = SignalMeasurements.Channel(SignalMeasurements.Render(scene, 1.5), 2, 0);
            int notes = SignalMeasurements.Onsets(left, minimumGap: Rate / 100).Count;
            int firstNoteLength = Rate / 25;
            int pitch = (int)Math.Round(SignalMeasurements.Pitch(left[..firstNoteLength], Rate) / 10) * 10;
            Assert.True(notes >= 2, $"{kind}: {notes} notes");
            Assert.True(signatures.Add((notes, pitch)), $"{kind} sounds like another alert: {notes} notes at {pitch} Hz");
            Assert.Equal(0, SignalMeasurements.Rms(left.AsSpan(Rate)));
        }
    }

    [Fact]
    public void Raising_a_sounding_alert_again_does_not_restart_it()
    {
        var once = new SoundScene();
        var repeated = new SoundScene();
        once.RaiseAlert(AlertKind.LimitBroken);
        repeated.RaiseAlert(AlertKind.LimitBroken);
        var a = new List<float>();
        var b = new List<float>();
        for (int block = 0; block < 40; block++)
        {
            repeated.RaiseAlert(AlertKind.LimitBroken);
            a.AddRange(SignalMeasurements.Render(once, 0.01));
            b.AddRange(SignalMeasurements.Render(repeated, 0.01));
        }
        // The pattern lasts 0.55 s, so 40 ms blocks repeat-raised stay identical to a single raise until then.
        Assert.Equal(a.Take(2 * Rate / 2), b.Take(2 * Rate / 2));
    }

    [Fact]
    public void Same_calls_give_the_same_samples_whatever_the_block_size()
    {
        float[] Render(int blockFrames)
        {
            var scene = new SoundScene(SpeakerLayout.Surround51);
            scene.SetEngine(0.8);
            scene.SetBeacon("b", 3, 700, 1.3, new Lightward.Spacetime.Vec3(1, 0, -1));
            scene.RaiseAlert(AlertKind.TaskDone);
            var output = new float[Rate * 6];
            for (int offset = 0; offset < output.Length; offset += blockFrames * 6)
                scene.Render(output.AsSpan(offset, Math.Min(blockFrames * 6, output.Length - offset)));
            return output;
        }
        Assert.Equal(Render(480), Render(2000));
    }
}
