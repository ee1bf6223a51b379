using System.Diagnostics;
using System.Text.Json;

namespace Lightward.Cli.Tests;

/// <summary>The MP4 preview of `lightward render-show`, made by ffmpeg and checked with ffprobe; and the one line said without ffmpeg.</summary>
public sealed class RenderShowPreviewTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lightward-preview-").FullName;

    private string WriteShow(string name, string extraCue = "")
    {
        string path = Path.Combine(_folder, name + ".show.toml");
        File.WriteAllText(path, RenderShowTests.TinyShow + extraCue);
        return path;
    }

    [PreviewTheory]
    [InlineData("24", 36, "24/1")]
    [InlineData("29.97", 45, "30000/1001")]
    public void The_preview_holds_every_frame_at_the_show_rate_with_its_sound(string fps, int frames, string rate)
    {
        string output = Path.Combine(_folder, "out");
        var result = CliRunner.Run("render-show", WriteShow("tiny"), "--size", "16", "--fps", fps, "--threads", "1", "--out", output);
        Assert.True(result.ExitCode == 0, result.Stderr);
        string preview = Path.Combine(output, "extras", "tiny.preview.mp4");
        Assert.Contains($"preview: {preview}", result.Stdout);
        Assert.False(Directory.EnumerateFiles(Path.Combine(output, "extras"), "*.partial", SearchOption.AllDirectories).Any(), "a temporary file was left behind");

        Probe probe = Probe.Of(preview);
        Assert.Equal(("h264", 16, 16), (probe.Video.Codec, probe.Video.Width, probe.Video.Height));
        Assert.Equal(rate, probe.Video.Rate);
        Assert.Equal(frames, probe.Video.Frames);
        // The show is 1.5 s long and rendered as whole frames: `frames` frames of 1/fps each (30000/1001 for 29.97,
        // SMPTE ST 12-1 drop-frame rate, from memory).
        string[] parts = rate.Split('/');
        double frameSeconds = parts.Length == 2 ? double.Parse(parts[1]) / double.Parse(parts[0]) : 1 / double.Parse(parts[0]);
        Assert.Equal(frames * frameSeconds, probe.Video.Duration, 0.002);
        Assert.Equal("aac", probe.Audio?.Codec);
    }

    [PreviewFact]
    public void A_surround_soundtrack_is_folded_down_to_stereo_in_the_preview()
    {
        string sound = ShippedSound("passing-tone.wav");
        string show = WriteShow("placed", $"\n[[cue]]\nat = \"1 s\"\nsound = {{ file = \"{sound}\", azimuth = \"30 deg\" }}\n");
        string output = Path.Combine(_folder, "placed");
        var result = CliRunner.Run("render-show", show, "--size", "16", "--fps", "24", "--threads", "1", "--out", output);
        Assert.True(result.ExitCode == 0, result.Stderr);
        Assert.True(File.Exists(Path.Combine(output, "soundtrack", "placed.Ls.wav")), "the soundtrack is not 5.1");
        Probe probe = Probe.Of(Path.Combine(output, "extras", "placed.preview.mp4"));
        Assert.Equal(36, probe.Video.Frames);
        Assert.Equal(2, probe.Audio?.Channels);
    }

    [Fact]
    public void Without_ffmpeg_the_render_says_in_one_line_how_to_get_it()
    {
        string empty = Directory.CreateDirectory(Path.Combine(_folder, "no-programs")).FullName;
        string output = Path.Combine(_folder, "silent");
        var result = CliRunner.RunWith(_folder, new Dictionary<string, string> { ["PATH"] = empty },
            "render-show", WriteShow("tiny"), "--size", "16", "--fps", "24", "--threads", "1", "--out", output);
        Assert.True(result.ExitCode == 0, result.Stderr);
        string line = Assert.Single(result.Stdout.Split('\n'), l => l.StartsWith("preview:", StringComparison.Ordinal));
        Assert.StartsWith("preview: skipped, ffmpeg is not on PATH; install ffmpeg (Debian/Ubuntu: apt-get install ffmpeg)", line);
        Assert.False(File.Exists(Path.Combine(output, "extras", "tiny.preview.mp4")));
    }

    /// <summary>A shipped sound file, found from this source file so any artifacts path works.</summary>
    private static string ShippedSound(string name) => Path.Combine(ShippedScenarios.Folder, "sounds", name);

    public void Dispose()
    {
        try { Directory.Delete(_folder, recursive: true); }
        catch (IOException) { }
    }

    /// <summary>What ffprobe reports of a file's first video and audio streams (frames counted by decoding).</summary>
    private sealed record Probe(Probe.Stream Video, Probe.Stream? Audio)
    {
        public sealed record Stream(string Codec, int Width, int Height, string Rate, int Frames, double Duration, int Channels);

        public static Probe Of(string file)
        {
            var start = new ProcessStartInfo("ffprobe") { RedirectStandardOutput = true, RedirectStandardError = true };
            foreach (string argument in new[] { "-v", "error", "-count_frames", "-show_streams", "-of", "json", file }) start.ArgumentList.Add(argument);
            using var process = Process.Start(start)!;
            string json = process.StandardOutput.ReadToEnd();
            string error = process.StandardError.ReadToEnd();
            process.WaitForExit();
            Assert.True(process.ExitCode == 0, $"ffprobe failed: {error}");
            using JsonDocument document = JsonDocument.Parse(json);
            Stream[] streams = document.RootElement.GetProperty("streams").EnumerateArray().Select(Read).ToArray();
            return new Probe(streams.Single(s => s.Width > 0), streams.SingleOrDefault(s => s.Channels > 0));
        }

        private static Stream Read(JsonElement stream)
        {
            int Number(string name) => stream.TryGetProperty(name, out JsonElement value) ? (value.ValueKind == JsonValueKind.String ? int.Parse(value.GetString()!) : value.GetInt32()) : 0;
            double duration = stream.TryGetProperty("duration", out JsonElement d) ? double.Parse(d.GetString()!, System.Globalization.CultureInfo.InvariantCulture) : 0;
            return new Stream(stream.GetProperty("codec_name").GetString()!, Number("width"), Number("height"),
                stream.GetProperty("r_frame_rate").GetString()!, Number("nb_read_frames"), duration, Number("channels"));
        }
    }
}

/// <summary>Skipped, with the reason, only where ffmpeg or ffprobe is not installed.</summary>
public static class PreviewTools
{
    public const string MissingReason = "ffmpeg or ffprobe is not installed (apt-get install ffmpeg); the MP4 preview tests need them";

    public static bool Installed => new[] { "ffmpeg", "ffprobe" }.All(program =>
        (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':', StringSplitOptions.RemoveEmptyEntries).Any(folder => File.Exists(Path.Combine(folder, program))));
}

public sealed class PreviewFactAttribute : FactAttribute
{
    public PreviewFactAttribute()
    {
        if (!PreviewTools.Installed) Skip = PreviewTools.MissingReason;
    }
}

public sealed class PreviewTheoryAttribute : TheoryAttribute
{
    public PreviewTheoryAttribute()
    {
        if (!PreviewTools.Installed) Skip = PreviewTools.MissingReason;
    }
}
