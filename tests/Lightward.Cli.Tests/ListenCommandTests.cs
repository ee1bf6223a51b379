using NAudio.Wave;

namespace Lightward.Cli.Tests;

public sealed class ListenCommandTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lightward-listen-").FullName;

    public void Dispose() => Directory.Delete(_folder, recursive: true);

    [Fact]
    public void Writes_a_stereo_wav_of_whole_frames_and_shows_the_doppler_factors()
    {
        string wav = Path.Combine(_folder, "pass.wav");
        var result = CliRunner.Run("listen", "--beta", "0.6", "--thrust", "0.5", "--alert", "budget-low",
            "--length", "2 s", "--fps", "29.97", "--wav", wav);
        Assert.True(result.ExitCode == 0, result.Stderr);
        // β = 0.6 head-on: D = √((1+β)/(1−β)) = 2 ahead and 1/2 astern (longitudinal relativistic Doppler, any SR text).
        Assert.Contains("beacon 1", result.Stdout);
        Assert.Contains("880 Hz", result.Stdout);
        Assert.Contains("220 Hz", result.Stdout);
        using var reader = new WaveFileReader(wav);
        Assert.Equal((48_000, 24, 2), (reader.WaveFormat.SampleRate, reader.WaveFormat.BitsPerSample, reader.WaveFormat.Channels));
        // 2 s at 30000/1001 fps is 60 frames; 60 × 48000 × 1001/30000 = 96 096 samples exactly.
        Assert.Equal(96_096, reader.SampleCount);
    }

    [Fact]
    public void Writes_5_1_as_six_mono_files_named_by_channel()
    {
        string wav = Path.Combine(_folder, "dome.wav");
        var result = CliRunner.Run("listen", "--rapidity", "1", "--beacon", "90", "--layout", "5.1", "--bits", "16", "--length", "0.5 s", "--wav", wav);
        Assert.True(result.ExitCode == 0, result.Stderr);
        foreach (string channel in new[] { "L", "R", "C", "LFE", "Ls", "Rs" })
        {
            using var reader = new WaveFileReader(Path.Combine(_folder, $"dome.{channel}.wav"));
            Assert.Equal((1, 16, 24_000L), (reader.WaveFormat.Channels, reader.WaveFormat.BitsPerSample, reader.SampleCount));
        }
    }

    [Fact]
    public void Without_a_sound_device_playing_says_so_in_one_line_and_succeeds()
    {
        var result = CliRunner.Run("listen", "--length", "1 s");
        Assert.Equal(0, result.ExitCode);
        if (result.Stderr.Length > 0)
        {
            Assert.Single(result.Stderr.Trim().Split('\n'));
            Assert.Contains("no sound output", result.Stderr);
        }
    }

    [Theory]
    [InlineData("--beta", "1.2")]
    [InlineData("--thrust", "2")]
    [InlineData("--alert", "meteor")]
    [InlineData("--layout", "7.1")]
    [InlineData("--fps", "31.5")]
    [InlineData("--beacon-rate", "2 m")]
    [InlineData("--length", "0 s")]
    [InlineData("--bits", "8")]
    [InlineData("--wav", "no-such-folder/x.wav")]
    public void Bad_flags_are_user_errors_naming_the_flag(string flag, string value)
    {
        var arguments = new List<string> { "listen", flag, value };
        if (flag != "--wav") arguments.AddRange(["--wav", Path.Combine(_folder, "x.wav")]);
        var result = CliRunner.RunIn(_folder, arguments.ToArray());
        Assert.Equal(2, result.ExitCode);
        Assert.StartsWith($"lightward: error: {flag}", result.Stderr);
        Assert.DoesNotContain("   at ", result.Stderr);
        Assert.Empty(Directory.GetFiles(_folder));
    }
}
