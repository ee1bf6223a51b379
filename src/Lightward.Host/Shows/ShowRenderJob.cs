using System.Globalization;
using System.Security.Cryptography;
using System.Text;
using Lightward.Audio;
using Lightward.Rendering;
using Lightward.Rendering.NearField;
using Lightward.Rendering.Safety;
using Lightward.Scenarios.Plans;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Host.Shows;

/// <summary>
/// Renders a show into a delivery folder (<see cref="DeliveryLayout"/>): the frames this run is responsible for
/// (<see cref="FrameSelection"/>), skipping frames already on disk so a killed render resumes; the soundtrack and the
/// extras when missing; and, once every frame exists, the cautions check. Every file is written atomically and holds
/// nothing that depends on the run (no dates, no machine names), so shards and resumed runs add up to the same bytes
/// as one uninterrupted run.
/// </summary>
public sealed class ShowRenderJob
{
    /// <summary>Cells across the short side of the frame for the flash check: finer than any flash a viewer would see as one.</summary>
    public const int AnalysisCells = 96;

    private readonly ShowTimeline _timeline;
    private readonly ShowRenderSettings _settings;

    public ShowRenderJob(ShowScript script, ShowRenderSettings settings, string outputFolder, string? frames, string? shard)
    {
        _timeline = new ShowTimeline(script);
        _settings = settings;
        FrameCount = (int)Math.Max(1, settings.FrameRate.FramesIn(script.Length));
        Layout = new DeliveryLayout(outputFolder, script.DeliveryName, FrameCount);
        Selection = FrameSelection.Parse(frames, shard, FrameCount);
    }

    public ShowScript Script => _timeline.Script;
    public DeliveryLayout Layout { get; }
    public FrameSelection Selection { get; }
    public int FrameCount { get; }

    /// <summary>Frames of this run's selection not yet on disk.</summary>
    public IReadOnlyList<int> PendingFrames() => Selection.Frames.Where(frame => !File.Exists(Layout.FramePath(frame))).ToArray();

    public bool AllFramesExist() => Enumerable.Range(1, FrameCount).All(frame => File.Exists(Layout.FramePath(frame)));

    /// <summary>
    /// Creates the folders, refuses a folder rendered with other settings, clears leftovers of killed runs and writes
    /// the extras (show file copy, render settings) when missing.
    /// </summary>
    public void PrepareFolder()
    {
        string settingsText = SettingsText();
        if (File.Exists(Layout.SettingsPath))
        {
            string existing = File.ReadAllText(Layout.SettingsPath);
            if (existing != settingsText)
                throw new UserInputException($"--out: {Layout.Root} holds a render made with other settings ({FirstDifference(existing, settingsText)}); " +
                                             "resume with the same show and flags, or give a new --out folder");
        }
        foreach (string folder in new[] { Layout.FramesFolder, Layout.SoundtrackFolder, Layout.ExtrasFolder })
        {
            Directory.CreateDirectory(folder);
            AtomicFile.RemoveStale(folder);
        }
        foreach (int frame in Selection.Frames.Where(f => f == Selection.First || (f - 1) % DeliveryLayout.FramesPerFolder == 0))
            Directory.CreateDirectory(Path.GetDirectoryName(Layout.FramePath(frame))!);
        if (!File.Exists(Layout.ShowCopyPath))
        {
            byte[] show = File.ReadAllBytes(Script.SourcePath);
            AtomicFile.Write(Layout.ShowCopyPath, stream => stream.Write(show));
        }
        if (!File.Exists(Layout.SettingsPath))
            AtomicFile.Write(Layout.SettingsPath, stream => stream.Write(Encoding.UTF8.GetBytes(settingsText)));
    }

    /// <summary>Writes the soundtrack unless it is already there; returns the files written (empty when skipped).</summary>
    public IReadOnlyList<string> WriteSoundtrackIfMissing()
    {
        string firstFile = ShowSoundtrack.LayoutFor(Script) == SpeakerLayout.Stereo
            ? Layout.SoundtrackPath
            : SoundtrackWriter.ChannelPath(Layout.SoundtrackPath, SoundFormat.ChannelNames(SpeakerLayout.Surround51)[^1]);
        if (File.Exists(firstFile)) return [];
        return ShowSoundtrack.Write(_timeline, _settings.FrameRate, FrameCount, Layout.SoundtrackPath);
    }

    /// <summary>
    /// Renders the pending frames in order, encoding each PNG while the next frame renders. <paramref name="frameDone"/>
    /// is called after each frame is in place.
    /// </summary>
    public void RenderFrames(Scene scene, NearFieldLayer sceneNearField, IReadOnlyList<int> frames, Action<int> frameDone, CancellationToken cancellationToken)
    {
        if (frames.Count == 0) return;
        using var renderer = new ShowFrameRenderer(_timeline, scene, sceneNearField, _settings);
        Camera camera = _settings.Camera;
        RgbaImage[] images = [new RgbaImage(camera.Width, camera.Height), new RgbaImage(camera.Width, camera.Height)];
        Task writing = Task.CompletedTask;
        for (int i = 0; i < frames.Count; i++)
        {
            cancellationToken.ThrowIfCancellationRequested();
            int frame = frames[i];
            RgbaImage image = images[i % 2];
            renderer.Render(frame, image);
            writing.GetAwaiter().GetResult();
            writing = Task.Run(() =>
            {
                AtomicFile.Write(Layout.FramePath(frame), stream => PngWriter.Encode(image, stream));
                frameDone(frame);
            }, cancellationToken);
        }
        writing.GetAwaiter().GetResult();
    }

    /// <summary>
    /// The cautions check over the whole show, read back from the frames on disk (so it is the same however the frames
    /// were shared out), written to the extras folder.
    /// </summary>
    public SafetyReport CheckCautions(Action<int>? frameChecked = null)
    {
        Camera camera = _settings.Camera;
        int rows = Math.Min(AnalysisCells, camera.Height);
        int columns = Math.Min(camera.Width, (int)Math.Round((double)rows * camera.Width / camera.Height));
        float[] area = camera.Kind switch
        {
            ProjectionKind.Domemaster => ScreenArea.Domemaster(rows, camera.FieldOfView),
            ProjectionKind.Equirectangular => ScreenArea.Equirectangular(columns, rows),
            _ => ScreenArea.Uniform(columns, rows),
        };
        if (camera.Kind == ProjectionKind.Domemaster) columns = rows;
        double fps = _settings.FrameRate.FramesPerSecond;
        var flashes = new FlashAnalyser(columns, rows, fps, Script.Cautions.DomePeakLuminance, area);
        var rotation = new RotationCheck(Script.Cautions.MaxRotationRate);
        for (int frame = 1; frame <= FrameCount; frame++)
        {
            RgbaImage image = PngWriter.Read(Layout.FramePath(frame));
            flashes.AddFrame(image.ReadOnlyPixels, image.Width, image.Height);
            double time = (double)(frame - 1) * _settings.FrameRate.Denominator / _settings.FrameRate.Numerator;
            rotation.Add(time, _timeline.At(time).CameraOrientation);
            frameChecked?.Invoke(frame);
        }
        var report = new SafetyReport(Script.Cautions.DomePeakLuminance, Script.Cautions.MaxRotationRate, FrameCount, fps, flashes.Findings(), rotation.Findings());
        string text = report.ToText();
        AtomicFile.Write(Layout.CautionsPath, stream => stream.Write(Encoding.UTF8.GetBytes(text)));
        return report;
    }

    /// <summary>Everything that decides the pictures and sound, so a resumed or sharded run can prove it matches.</summary>
    private string SettingsText()
    {
        Camera camera = _settings.Camera;
        string Degrees(double radians) => (radians * 180 / Math.PI).ToString("0.###", CultureInfo.InvariantCulture) + " deg";
        string flip = (_settings.FlipHorizontal, _settings.FlipVertical) switch
        {
            (true, true) => "both",
            (true, false) => "horizontal",
            (false, true) => "vertical",
            _ => "none",
        };
        string exposure = camera.Exposure.Automatic
            ? (camera.Exposure.Stops == 0 ? "auto" : FormattableString.Invariant($"auto{camera.Exposure.Stops:+0.###;-0.###}"))
            : camera.Exposure.Stops.ToString("0.###", CultureInfo.InvariantCulture);
        var text = new StringBuilder();
        text.AppendLine("# Render settings of this delivery folder: every run into it (shards, resumed runs) must use the same.");
        text.AppendLine($"show = \"{Path.GetFileName(Script.SourcePath)}\"");
        text.AppendLine($"show_sha256 = \"{Convert.ToHexStringLower(SHA256.HashData(File.ReadAllBytes(Script.SourcePath)))}\"");
        if (Script.Scene is { } sceneFile)
        {
            text.AppendLine($"scene = \"{Path.GetFileName(sceneFile.SourcePath)}\"");
            text.AppendLine($"scene_sha256 = \"{sceneFile.ContentHash}\"");
        }
        string[] plans = Script.Cues.Select(cue => cue.BurnPlan).OfType<BurnPlan>().DistinctBy(plan => plan.SourcePath)
            .Select(plan => $"\"{Path.GetFileName(plan.SourcePath)}\" = \"{plan.ContentHash}\"").ToArray();
        if (plans.Length > 0) text.AppendLine($"burn_plans_sha256 = {{ {string.Join(", ", plans)} }}");
        text.AppendLine($"projection = \"{camera.Kind.ToString().ToLowerInvariant()}\"");
        text.AppendLine($"size = \"{camera.Width}x{camera.Height}\"");
        if (camera.Kind == ProjectionKind.Domemaster)
        {
            text.AppendLine($"dome_aperture = \"{Degrees(camera.FieldOfView)}\"");
            text.AppendLine($"dome_tilt = \"{Degrees(camera.DomeTilt)}\"");
        }
        text.AppendLine($"flip = \"{flip}\"");
        text.AppendLine($"exposure = \"{exposure}\"");
        text.AppendLine($"fps = \"{_settings.FrameRate}\"");
        text.AppendLine($"frames = {FrameCount}");
        text.AppendLine($"grid_spacing = \"{(Script.GridSpacing / Units.LightYear).ToString("0.######", CultureInfo.InvariantCulture)} ly\"");
        text.AppendLine($"soundtrack = \"{(ShowSoundtrack.LayoutFor(Script) == SpeakerLayout.Stereo ? "stereo" : "5.1")}\"");
        text.AppendLine($"sample_rate = \"{SoundFormat.SampleRate} Hz\"");
        text.AppendLine($"bits_per_sample = {SoundtrackWriter.DefaultBitsPerSample}");
        text.AppendLine($"dome_peak_luminance = \"{Script.Cautions.DomePeakLuminance.ToString("0.###", CultureInfo.InvariantCulture)} cd/m2\"");
        text.AppendLine($"max_rotation_rate = \"{(Script.Cautions.MaxRotationRate * 180 / Math.PI).ToString("0.###", CultureInfo.InvariantCulture)} deg/s\"");
        return text.ToString();
    }

    private static string FirstDifference(string existing, string wanted)
    {
        string[] a = existing.Split('\n'), b = wanted.Split('\n');
        for (int i = 0; i < Math.Min(a.Length, b.Length); i++)
            if (a[i] != b[i]) return $"there: {a[i].Trim()}; now: {b[i].Trim()}";
        return "the settings files differ in length";
    }
}
