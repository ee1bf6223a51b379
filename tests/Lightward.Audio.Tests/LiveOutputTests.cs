namespace Lightward.Audio.Tests;

public class LiveOutputTests
{
    [Fact]
    public void Without_a_sound_server_playback_falls_back_to_silence_in_one_line_and_keeps_pulling_blocks()
    {
        var scene = new SoundScene();
        scene.SetEngine(0.5);
        var lines = new List<string>();
        var capture = new CountingSink();
        using (var output = LiveSoundOutput.Start(scene, lines.Add, capture, SoundOutputChoice.Silent))
        {
            Assert.True(output.IsSilent);
            Assert.Equal("silent", output.DeviceName);
            SpinWait.SpinUntil(() => output.BlocksPlayed >= 3, TimeSpan.FromSeconds(10));
            scene.SetBeacon("b", 2, 500, 1, Lightward.Spacetime.Vec3.UnitZ);
            scene.RaiseAlert(AlertKind.TimeShort);
            Assert.True(output.BlocksPlayed >= 3);
        }
        Assert.Empty(lines);
        Assert.True(capture.Frames >= 3 * 480 && capture.Frames % 480 == 0, $"{capture.Frames} frames captured");
    }

    [Fact]
    public void Automatic_choice_never_fails_and_explains_a_fallback_in_exactly_one_line()
    {
        var lines = new List<string>();
        using var output = LiveSoundOutput.Start(new SoundScene(), lines.Add);
        if (output.IsSilent)
        {
            Assert.Single(lines);
            Assert.StartsWith("no sound output (", lines[0]);
        }
        else Assert.Empty(lines);
    }

    [Fact]
    public void A_missing_pulseaudio_library_is_reported_not_thrown()
    {
        Assert.Null(PulseAudioDevice.TryOpen(48_000, SpeakerLayout.Stereo, 480, out string? why, libraryName: "libno-such-sound-library.so.0"));
        Assert.Contains("libno-such-sound-library.so.0", why);
    }

    private sealed class CountingSink : ISoundBlockSink
    {
        public long Frames;
        public void Write(ReadOnlySpan<float> interleaved) => Frames += interleaved.Length / 2;
    }
}
