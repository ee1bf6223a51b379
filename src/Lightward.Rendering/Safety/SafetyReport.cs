using System.Globalization;
using System.Text;

namespace Lightward.Rendering.Safety;

/// <summary>The cautions verdict on a rendered show: photosensitive flashing (ITU-R BT.1702) and fast whole-scene rotation.</summary>
/// <param name="DomePeakLuminance">The luminance full white was taken to have, cd/m².</param>
/// <param name="RotationLimit">Rotation rate limit, rad/s.</param>
public sealed record SafetyReport(
    double DomePeakLuminance, double RotationLimit, int FramesChecked, double FramesPerSecond,
    IReadOnlyList<FlashFinding> Flashes, IReadOnlyList<RotationFinding> Rotations)
{
    public bool FlashesPass => Flashes.Count == 0;
    public bool RotationPasses => Rotations.Count == 0;
    public bool Passes => FlashesPass && RotationPasses;

    /// <summary>The report as plain text, for the terminal and the delivery's extras folder.</summary>
    public string ToText()
    {
        var text = new StringBuilder();
        text.AppendLine(Invariant($"photosensitivity (ITU-R BT.1702, dome peak luminance {DomePeakLuminance:0.#} cd/m2, {FramesChecked} frames at {FramesPerSecond:0.###} fps): {Verdict(FlashesPass)}"));
        foreach (FlashFinding flash in Flashes)
            text.AppendLine(Invariant($"  {Span(flash.Start, flash.End)}: {Describe(flash.Kind)}, up to {flash.PeakFlashesPerSecond:0.#} flashes in one second over up to {flash.PeakArea * 100:0}% of the screen"));
        text.AppendLine(Invariant($"rotation (limit {Degrees(RotationLimit)} deg/s): {Verdict(RotationPasses)}"));
        foreach (RotationFinding rotation in Rotations)
            text.AppendLine(Invariant($"  {Span(rotation.Start, rotation.End)}: whole scene turns at up to {Degrees(rotation.PeakRate)} deg/s"));
        return text.ToString();
    }

    private static string Verdict(bool passes) => passes ? "pass" : "FAIL";

    private static string Describe(FlashKind kind) => kind switch
    {
        FlashKind.Luminance => "luminance flashes",
        FlashKind.SaturatedRed => "saturated red flashes",
        _ => kind.ToString(),
    };

    private static string Span(double start, double end) => Invariant($"{Clock(start)} to {Clock(end)}");

    /// <summary>Show time as m:ss.fff, the way an editor or operator reads it.</summary>
    private static string Clock(double seconds) => Invariant($"{(int)(seconds / 60)}:{seconds % 60:00.000}");

    private static string Degrees(double radiansPerSecond) => Invariant($"{radiansPerSecond * 180 / Math.PI:0.#}");

    private static string Invariant(FormattableString text) => text.ToString(CultureInfo.InvariantCulture);
}
