using System.Text;
using FFMpegCore;
using Lightward.Audio;
using Lightward.Scenarios.Shows;

namespace Lightward.Host.Shows;

/// <summary>
/// An H.264 preview of a finished delivery folder (at most 1024 pixels wide) with the soundtrack (a 5.1 soundtrack
/// folded down to stereo), made by ffmpeg when it is installed.
/// </summary>
public static class ShowPreview
{
    public const string InstallHint = "install ffmpeg (Debian/Ubuntu: apt-get install ffmpeg) and run the same command again to add it";

    /// <summary>The ffmpeg program on PATH, or null.</summary>
    public static string? FindFfmpeg()
    {
        foreach (string folder in (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator, StringSplitOptions.RemoveEmptyEntries))
        {
            string candidate = Path.Combine(folder, OperatingSystem.IsWindows() ? "ffmpeg.exe" : "ffmpeg");
            if (File.Exists(candidate)) return candidate;
        }
        return null;
    }

    /// <summary>Writes the preview (temporary name, then rename); returns one line saying what happened.</summary>
    public static string Write(DeliveryLayout layout, FrameRate frameRate, SpeakerLayout soundtrack)
    {
        string? ffmpeg = FindFfmpeg();
        if (ffmpeg is null) return $"preview: skipped, ffmpeg is not on PATH; {InstallHint}";
        GlobalFFOptions.Configure(options => options.BinaryFolder = Path.GetDirectoryName(ffmpeg)!);

        // The concat list walks the frames across their subfolders. Each frame's time is set from its number
        // (N·den/num), not from the list, so that no frame is dropped or repeated at rates such as 30000/1001.
        string list = AtomicFile.Temporary(layout.PreviewPath + ".frames.txt");
        string temporary = AtomicFile.Temporary(layout.PreviewPath) + ".mp4";
        var entries = new StringBuilder("ffconcat version 1.0\n");
        for (int frame = 1; frame <= layout.FrameCount; frame++)
            entries.Append("file '").Append(layout.FramePath(frame).Replace("'", @"'\''")).Append("'\n");
        string frameTimes = $"setpts=N*{frameRate.Denominator}/{frameRate.Numerator}/TB";
        // H.264 in 4:2:0 needs even sides: at most 1024 wide, at least 2.
        const string size = "scale=w='max(2,trunc(min(1024,iw)/2)*2)':h=-2";
        try
        {
            File.WriteAllText(list, entries.ToString());
            FFMpegArguments arguments = FFMpegArguments.FromFileInput(list, verifyExists: true, options => options.WithCustomArgument("-f concat -safe 0"));
            string sound = "";
            if (soundtrack == SpeakerLayout.Stereo) arguments = arguments.AddFileInput(layout.SoundtrackPath);
            else
            {
                // The six mono files joined in the order of their WAV speaker mask (FL FR FC LFE BL BR), then ffmpeg's stereo fold-down.
                IReadOnlyList<string> channels = SoundFormat.ChannelNames(SpeakerLayout.Surround51);
                foreach (string channel in channels) arguments = arguments.AddFileInput(SoundtrackWriter.ChannelPath(layout.SoundtrackPath, channel));
                string[] speakers = ["FL", "FR", "FC", "LFE", "BL", "BR"];
                string inputs = string.Concat(channels.Select((_, i) => $"[{i + 1}:a]"));
                string map = string.Join('|', speakers.Select((speaker, i) => $"{i}.0-{speaker}"));
                sound = $"-filter_complex \"{inputs}join=inputs={channels.Count}:channel_layout=5.1:map={map}[sound]\" -map 0:v -map \"[sound]\" -ac 2 ";
            }
            FFMpegResult result = arguments.OutputToFile(temporary, overwrite: true, options => options
                    .WithVideoCodec("libx264")
                    .WithCustomArgument($"{sound}-r {frameRate} -pix_fmt yuv420p -vf \"{frameTimes},{size}\""))
                .ProcessSynchronously(throwOnError: false);
            if (!result.Success || !File.Exists(temporary)) return "preview: ffmpeg could not encode the preview (the frames and soundtrack are unaffected)";
            File.Move(temporary, layout.PreviewPath, overwrite: true);
            return $"preview: {layout.PreviewPath}";
        }
        finally
        {
            if (File.Exists(list)) File.Delete(list);
            if (File.Exists(temporary)) File.Delete(temporary);
        }
    }
}
