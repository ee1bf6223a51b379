using System.Globalization;
using System.Text;

namespace Lightward.Scenarios.Shows;

/// <summary>
/// Where every file of a rendered show goes, following the layout of IMERSA's draft dome-master show file format:
/// numbered lossless PNG frames <c>frames/&lt;name&gt;_000001.png</c> (at most 10,000 to a folder, so longer shows
/// get one subfolder per 10,000 frames, named by the frame range it holds), a <c>soundtrack</c> folder and an
/// <c>extras</c> folder with the show file, the render settings, the cautions report and the preview.
/// </summary>
public sealed class DeliveryLayout
{
    public const int FramesPerFolder = 10_000;

    public DeliveryLayout(string root, string name, int frameCount)
    {
        if (frameCount < 1) throw new ArgumentOutOfRangeException(nameof(frameCount), "a show has at least one frame");
        Root = Path.GetFullPath(root);
        Name = SafeName(name);
        FrameCount = frameCount;
        Digits = Math.Max(6, frameCount.ToString(CultureInfo.InvariantCulture).Length);
    }

    public string Root { get; }
    /// <summary>The show's name as used in file names: letters, digits, '-' and '_' only.</summary>
    public string Name { get; }
    public int FrameCount { get; }
    /// <summary>Digits of the frame number in file names: 6, more for shows beyond 999,999 frames.</summary>
    public int Digits { get; }

    public string FramesFolder => Path.Combine(Root, "frames");
    public string SoundtrackFolder => Path.Combine(Root, "soundtrack");
    public string ExtrasFolder => Path.Combine(Root, "extras");
    /// <summary>The soundtrack's base file (stereo as this file, 5.1 as six mono files named after it).</summary>
    public string SoundtrackPath => Path.Combine(SoundtrackFolder, $"{Name}.wav");
    public string ShowCopyPath => Path.Combine(ExtrasFolder, $"{Name}.show.toml");
    public string SettingsPath => Path.Combine(ExtrasFolder, $"{Name}.render.toml");
    public string CautionsPath => Path.Combine(ExtrasFolder, $"{Name}.cautions.txt");
    public string PreviewPath => Path.Combine(ExtrasFolder, $"{Name}.preview.mp4");

    /// <summary>The PNG of frame <paramref name="frame"/> (1-based).</summary>
    public string FramePath(int frame)
    {
        if (frame < 1 || frame > FrameCount) throw new ArgumentOutOfRangeException(nameof(frame), frame, $"frames run from 1 to {FrameCount}");
        string file = $"{Name}_{Number(frame)}.png";
        if (FrameCount <= FramesPerFolder) return Path.Combine(FramesFolder, file);
        int first = (frame - 1) / FramesPerFolder * FramesPerFolder + 1;
        int last = Math.Min(FrameCount, first + FramesPerFolder - 1);
        return Path.Combine(FramesFolder, $"{Number(first)}-{Number(last)}", file);
    }

    private string Number(int frame) => frame.ToString(new string('0', Digits), CultureInfo.InvariantCulture);

    private static string SafeName(string name)
    {
        var safe = new StringBuilder();
        foreach (char c in name) safe.Append(char.IsAsciiLetterOrDigit(c) || c is '-' or '_' ? c : '_');
        return safe.Length == 0 ? "show" : safe.ToString();
    }
}
