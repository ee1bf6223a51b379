using System.Diagnostics;

namespace Lightward.Cli.Tests;

/// <summary>`lightward render-show` run as a user would: delivery layout, shards, resuming a killed render, errors.</summary>
public class RenderShowTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lightward-render-show-").FullName;

    // A tiny invented show: a second and a half with a fade, a turn and a caption, so that neighbouring frames differ.
    internal const string TinyShow = """
        title = "Tiny"
        length = "1.5 s"
        [cautions]
        max_rotation_rate = "60 deg/s"
        [[cue]]
        at = "0 s"
        fade = "out"
        [[cue]]
        at = "0 s"
        transition = "1 s"
        fade = "in"
        time_compression = 1e6
        caption = "Tiny"
        [[cue]]
        at = "0.5 s"
        transition = "1 s"
        rapidity = 1.5
        look = { azimuth = "90 deg" }
        """;

    private string WriteShow()
    {
        string path = Path.Combine(_folder, "tiny.show.toml");
        File.WriteAllText(path, TinyShow);
        return path;
    }

    internal static string[] Render(string show, string output, params string[] extra) =>
        ["render-show", show, "--size", "16", "--fps", "24", "--threads", "1", "--out", output, .. extra];

    /// <summary>Every file under <paramref name="root"/> (hidden ones too) by relative path, with its bytes.</summary>
    private static SortedDictionary<string, byte[]> Contents(string root) =>
        new(Directory.GetFiles(root, "*", SearchOption.AllDirectories).ToDictionary(f => Path.GetRelativePath(root, f), File.ReadAllBytes), StringComparer.Ordinal);

    internal static void AssertSameFolders(string expected, string actual)
    {
        var a = Contents(expected);
        var b = Contents(actual);
        Assert.Equal(a.Keys, b.Keys);
        foreach (string file in a.Keys) Assert.True(a[file].AsSpan().SequenceEqual(b[file]), $"{file} differs");
    }

    [Fact]
    public void Writes_a_delivery_folder_and_the_union_of_shards_is_byte_identical_to_one_run()
    {
        string show = WriteShow(), whole = Path.Combine(_folder, "whole"), sharded = Path.Combine(_folder, "sharded");
        var single = CliRunner.Run(Render(show, whole));
        Assert.True(single.ExitCode == 0, single.Stderr);
        Assert.True(File.Exists(Path.Combine(whole, "frames", "tiny_000001.png")));
        Assert.True(File.Exists(Path.Combine(whole, "frames", "tiny_000036.png")));
        Assert.False(File.Exists(Path.Combine(whole, "frames", "tiny_000037.png")));
        Assert.True(File.Exists(Path.Combine(whole, "soundtrack", "tiny.wav")));
        Assert.True(File.Exists(Path.Combine(whole, "extras", "tiny.show.toml")));
        Assert.Contains("photosensitivity (ITU-R BT.1702", File.ReadAllText(Path.Combine(whole, "extras", "tiny.cautions.txt")));
        Assert.Contains("photosensitivity", single.Stdout);

        for (int shard = 0; shard < 3; shard++)
        {
            var part = CliRunner.Run(Render(show, sharded, "--shard", $"{shard}/3"));
            Assert.True(part.ExitCode == 0, part.Stderr);
        }
        AssertSameFolders(whole, sharded);
    }

    [Fact]
    public void A_render_killed_midway_resumes_to_the_same_bytes()
    {
        string show = WriteShow(), whole = Path.Combine(_folder, "whole"), resumed = Path.Combine(_folder, "resumed");
        Assert.Equal(0, CliRunner.Run(Render(show, whole)).ExitCode);

        var start = new ProcessStartInfo("dotnet") { RedirectStandardOutput = true, RedirectStandardError = true };
        start.ArgumentList.Add(Path.Combine(AppContext.BaseDirectory, "lightward.dll"));
        foreach (string argument in Render(show, resumed)) start.ArgumentList.Add(argument);
        using (var process = Process.Start(start)!)
        {
            string frames = Path.Combine(resumed, "frames");
            var clock = Stopwatch.StartNew();
            while (!process.HasExited && clock.Elapsed < TimeSpan.FromMinutes(2)
                   && (!Directory.Exists(frames) || Directory.GetFiles(frames, "*.png").Length < 6))
                Thread.Sleep(20);
            if (!process.HasExited) process.Kill(entireProcessTree: true);
            process.WaitForExit();
        }
        Assert.False(File.Exists(Path.Combine(resumed, "extras", "tiny.cautions.txt")), "the render finished before it could be killed");

        var again = CliRunner.Run(Render(show, resumed));
        Assert.True(again.ExitCode == 0, again.Stderr);
        Assert.Contains("already done", again.Stdout);
        AssertSameFolders(whole, resumed);
    }

    [Fact]
    public void A_folder_rendered_with_other_settings_is_refused()
    {
        string show = WriteShow(), output = Path.Combine(_folder, "out");
        Assert.Equal(0, CliRunner.Run(Render(show, output, "--frames", "1..2")).ExitCode);
        var other = CliRunner.Run("render-show", show, "--size", "24", "--fps", "24", "--out", output, "--frames", "1..2");
        Assert.Equal(2, other.ExitCode);
        Assert.Contains("--out:", other.Stderr);
        Assert.Contains("size = \"16x16\"", other.Stderr);
    }

    [Theory]
    [InlineData("--fps", "31", "--fps: '31' is not a delivery frame rate")]
    [InlineData("--shard", "3/3", "--shard: 3/3 is out of range")]
    [InlineData("--frames", "0..4", "--frames: 0..4 is outside the show")]
    [InlineData("--flip", "sideways", "--flip: 'sideways'")]
    [InlineData("--projection", "cube", "--projection: unknown projection 'cube'")]
    public void Bad_flags_are_user_errors_naming_the_flag(string flag, string value, string message)
    {
        string show = WriteShow();
        var result = CliRunner.Run("render-show", show, "--out", Path.Combine(_folder, "x"), flag, value);
        Assert.Equal(2, result.ExitCode);
        Assert.Contains(message, result.Stderr);
        Assert.DoesNotContain("   at ", result.Stderr);
    }

    [Fact]
    public void A_broken_show_file_is_reported_with_line_and_column()
    {
        string show = Path.Combine(_folder, "broken.show.toml");
        File.WriteAllText(show, "title = \"Broken\"\nlength = \"ten seconds\"\n[[cue]]\nat = \"0 s\"\n");
        var result = CliRunner.Run("render-show", show, "--out", Path.Combine(_folder, "x"));
        Assert.Equal(2, result.ExitCode);
        Assert.Contains("broken.show.toml:2:10: length:", result.Stderr);
    }

    public void Dispose()
    {
        try { Directory.Delete(_folder, recursive: true); }
        catch (IOException) { }
    }
}
