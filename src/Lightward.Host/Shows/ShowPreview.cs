using System.Globalization;
using System.Text;
using FFMpegCore;
using Lightward.Audio;
using Lightward.Scenarios.Shows;

namespace Lightward.Host.Shows;

/// <summary>An H.264 preview of a finished delivery folder (at most 1024 pixels wide, with the stereo soundtrack), made by ffmpeg when it is installed.</summary>
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
    public static string Write(DeliveryLayout layout, FrameRate frameRate, bool stereoSoundtrack)
    {
        string? ffmpeg = FindFfmpeg();
        if (ffmpeg is null) return $"preview: skipped, ffmpeg is not on PATH; {InstallHint}";
        GlobalFFOptions.Configure(options => options.BinaryFolder = Path.GetDirectoryName(ffmpeg)!);

        // The concat list walks the frames across their subfolders; each entry lasts one frame.
        string list = AtomicFile.Temporary(layout.PreviewPath + ".frames.txt");
        string temporary = AtomicFile.Temporary(layout.PreviewPath) + ".mp4";
        string frameDuration = ((double)frameRate.Denominator / frameRate.Numerator).ToString("R", CultureInfo.InvariantCulture);
        var entries = new StringBuilder("ffconcat version 1.0\n");
        for (int frame = 1; frame <= layout.FrameCount; frame++)
            entries.Append("file '").Append(layout.FramePath(frame).Replace("'", @"'\''")).Append("'\nduration ").Append(frameDuration).Append('\n');
        try
        {
            File.WriteAllText(list, entries.ToString());
            FFMpegArguments arguments = FFMpegArguments.FromFileInput(list, verifyExists: true, options => options.WithCustomArgument("-f concat -safe 0"));
            if (stereoSoundtrack) arguments = arguments.AddFileInput(layout.SoundtrackPath);
            FFMpegResult result = arguments.OutputToFile(temporary, overwrite: true, options => options
                    .WithVideoCodec("libx264")
                    .WithCustomArgument($"-r {frameRate} -pix_fmt yuv420p -vf scale='min(1024,iw)':-2 -shortest"))
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
