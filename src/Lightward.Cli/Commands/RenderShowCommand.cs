using System.ComponentModel;
using System.Diagnostics;
using System.Globalization;
using Lightward.Audio;
using Lightward.Host.Shows;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.NearField;
using Lightward.Rendering.Safety;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;
using Spectre.Console;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

/// <summary>`lightward render-show`: renders a show script into a fulldome delivery folder (frames, soundtrack, extras).</summary>
public sealed class RenderShowCommand : Command<RenderShowCommand.Settings>
{
    /// <summary>The frame rates a delivery may use (film, PAL, NTSC-family and high-frame-rate dome playback).</summary>
    public static readonly string[] FrameRates = ["24", "25", "29.97", "30", "48", "59.94", "60"];

    public sealed class Settings : CommandSettings
    {
        [CommandArgument(0, "<SHOW>")]
        [Description("The show script (.show.toml).")]
        public string Show { get; init; } = "";

        [CommandOption("--out <FOLDER>")]
        [Description("Delivery folder to write (created if missing). Running again into the same folder resumes: finished frames are kept.")]
        public string? Out { get; init; }

        [CommandOption("--projection <KIND>")]
        [Description("dome (square dome master, zenith at the centre, front at the bottom edge; default), equirect (full sphere, 2:1) or perspective (flat 16:9, field of view from the show).")]
        public string? Projection { get; init; }

        [CommandOption("--size <N>")]
        [Description("Frame size: N gives NxN for dome, 2NxN for equirect and Nx(9N/16) for perspective; or WIDTHxHEIGHT. Default 2048; dome masters up to 8192 and beyond fit in memory.")]
        public string? Size { get; init; }

        [CommandOption("--fps <RATE>")]
        [Description("Frames per second: 24, 25, 29.97, 30 (default), 48, 59.94 or 60.")]
        public string? Fps { get; init; }

        [CommandOption("--tilt <ANGLE>")]
        [Description("Dome only: camera pitch for a tilted dome, degrees the zenith leans toward the front, 0 to 90 (default 0, a level dome; 15 is the customary nominal for tilted domes).")]
        public string? Tilt { get; init; }

        [CommandOption("--fov <ANGLE>")]
        [Description("Dome only: aperture of the dome master's circle, degrees, up to 360 (default 180).")]
        public string? FieldOfView { get; init; }

        [CommandOption("--flip <AXES>")]
        [Description("Mirror the frames for the playback system: none (default), horizontal, vertical or both.")]
        public string? Flip { get; init; }

        [CommandOption("--exposure <EXPOSURE>")]
        [Description("auto (metered per frame, default), auto+N / auto-N, or a fixed exposure in stops.")]
        public string? Exposure { get; init; }

        [CommandOption("--frames <A..B>")]
        [Description("Render only frames A to B (1-based, as in the file names).")]
        public string? Frames { get; init; }

        [CommandOption("--shard <I/N>")]
        [Description("Render only shard I of N (I from 0 to N-1) of the frames, for cluster job arrays; shards share one --out folder.")]
        public string? Shard { get; init; }

        [CommandOption("--threads <COUNT>")]
        [Description("Threads to render with (the frames are the same for any count). Default: all cores.")]
        public string? Threads { get; init; }

        public override ValidationResult Validate()
        {
            if (string.IsNullOrWhiteSpace(Out)) return ValidationResult.Error("--out: missing; give the delivery folder to write, e.g. --out deliveries/outbound");
            if (Fps is not null && !FrameRates.Contains(Fps.Trim()))
                return ValidationResult.Error($"--fps: '{Fps}' is not a delivery frame rate; use one of {string.Join(", ", FrameRates)}");
            return ValidationResult.Success();
        }
    }

    public override int Execute(CommandContext context, Settings settings, CancellationToken cancellationToken)
    {
        ShowScript script = ShowScriptReader.Load(settings.Show);
        ShowRenderSettings renderSettings = RenderSettingsFrom(settings);
        string output = CheckOutputFolder(settings.Out!);
        var job = new ShowRenderJob(script, renderSettings, output, settings.Frames, settings.Shard);

        job.PrepareFolder();
        foreach (string file in job.WriteSoundtrackIfMissing()) Console.WriteLine($"soundtrack: {file}");
        IReadOnlyList<int> pending = job.PendingFrames();
        Console.WriteLine(FormattableString.Invariant(
            $"{script.Title}: frames {job.Selection.First}..{job.Selection.Last} of {job.FrameCount}, {pending.Count} to render, {job.Selection.Count - pending.Count} already done → {job.Layout.FramesFolder}"));
        try
        {
            RenderWithProgress(job, pending, cancellationToken);
        }
        catch (OperationCanceledException)
        {
            Console.Error.WriteLine("lightward: render stopped; finished frames are kept, run the same command again to resume");
            return 130;
        }

        if (!job.AllFramesExist())
        {
            int missing = Enumerable.Range(1, job.FrameCount).Count(frame => !File.Exists(job.Layout.FramePath(frame)));
            Console.WriteLine($"cautions: waiting for the rest of the show ({missing} of {job.FrameCount} frames not rendered yet); the run that completes the folder checks it");
            return ErrorReporting.Success;
        }
        if (pending.Count > 0 || !File.Exists(job.Layout.CautionsPath))
        {
            SafetyReport report = job.CheckCautions();
            Console.Write(report.ToText());
            Console.WriteLine($"cautions report: {job.Layout.CautionsPath}");
            Console.WriteLine(ShowPreview.Write(job.Layout, renderSettings.FrameRate, ShowSoundtrack.LayoutFor(script)));
        }
        else Console.WriteLine($"delivery complete; cautions report: {job.Layout.CautionsPath}");
        return ErrorReporting.Success;
    }

    private static void RenderWithProgress(ShowRenderJob job, IReadOnlyList<int> pending, CancellationToken cancellationToken)
    {
        if (pending.Count == 0) return;
        var scene = new Scene(StarCatalog.LoadHipparcos());
        var clock = Stopwatch.StartNew();
        AnsiConsole.Progress()
            .AutoClear(false)
            .Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(), new RemainingTimeColumn(), new SpinnerColumn())
            .Start(progress =>
            {
                ProgressTask task = progress.AddTask("rendering", maxValue: pending.Count);
                int done = 0;
                job.RenderFrames(scene, SceneNearField(job.Script), pending, _ =>
                {
                    int count = Interlocked.Increment(ref done);
                    double rate = count / Math.Max(1e-9, clock.Elapsed.TotalSeconds);
                    task.Description = string.Create(CultureInfo.InvariantCulture, $"rendering {count}/{pending.Count} at {rate:0.00} frames/s");
                    task.Increment(1);
                }, cancellationToken);
            });
    }

    /// <summary>The bodies and grid of the show's scene (built as the view commands build them), or an empty near field.</summary>
    internal static NearFieldLayer SceneNearField(ShowScript script) =>
        script.Scene is { } scene ? ViewNearField.FromScenario(scene) : new NearFieldLayer([], null);

    private static ShowRenderSettings RenderSettingsFrom(Settings settings)
    {
        string projection = (settings.Projection ?? "dome").Trim().ToLowerInvariant();
        if (projection == "perspective" && settings.FieldOfView is not null)
            throw new UserInputException("--fov: a perspective show takes its field of view from the show's field_of_view cues; --fov sets the dome aperture only");
        Camera camera = ViewCamera.FromFlags(projection, SizeFor(projection, settings.Size), settings.FieldOfView, settings.Tilt, settings.Exposure);
        (bool horizontal, bool vertical) = (settings.Flip ?? "none").Trim().ToLowerInvariant() switch
        {
            "none" => (false, false),
            "horizontal" => (true, false),
            "vertical" => (false, true),
            "both" => (true, true),
            _ => throw new UserInputException($"--flip: '{settings.Flip}' is not none, horizontal, vertical or both"),
        };
        int threads = -1;
        if (settings.Threads is not null && !(int.TryParse(settings.Threads, NumberStyles.None, CultureInfo.InvariantCulture, out threads) && threads is >= 1 and <= 1024))
            throw new UserInputException($"--threads: '{settings.Threads}' is not a whole number from 1 to 1024");
        FrameRate rate = FrameRate.Parse(settings.Fps ?? "30", "--fps");
        return new ShowRenderSettings(camera, rate, horizontal, vertical, threads);
    }

    /// <summary>"N" → the projection's shape at N pixels high (N wide for perspective); "WxH" passes through.</summary>
    private static string SizeFor(string projection, string? size)
    {
        string text = (size ?? "2048").Trim();
        if (!int.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out int n)) return text;
        if (n < 1 || n > Camera.MaximumSide) throw new UserInputException($"--size: {text} is out of range; give 1 to {Camera.MaximumSide} pixels");
        return projection switch
        {
            "equirect" => FormattableString.Invariant($"{2 * n}x{n}"),
            "perspective" => FormattableString.Invariant($"{n}x{Math.Max(1, n * 9 / 16)}"),
            _ => FormattableString.Invariant($"{n}x{n}"),
        };
    }

    private static string CheckOutputFolder(string folder)
    {
        string fullPath;
        try { fullPath = Path.GetFullPath(folder); }
        catch (Exception e) when (e is ArgumentException or NotSupportedException or PathTooLongException)
        {
            throw new UserInputException($"--out: '{folder}' is not a valid folder path ({e.Message})");
        }
        if (File.Exists(fullPath)) throw new UserInputException($"--out: '{folder}' is a file; give a folder for the delivery");
        string? parent = Path.GetDirectoryName(fullPath);
        if (parent is not null && !Directory.Exists(parent)) throw new UserInputException($"--out: folder '{parent}' does not exist; create it first");
        try
        {
            Directory.CreateDirectory(fullPath);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new UserInputException($"--out: cannot create '{folder}' ({e.Message})");
        }
        return fullPath;
    }
}
