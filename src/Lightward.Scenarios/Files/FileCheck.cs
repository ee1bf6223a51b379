using System.Text.RegularExpressions;
using Lightward.Scenarios.Shows;

namespace Lightward.Scenarios.Files;

/// <summary>
/// `check` for every kind of file we read. A kind is recognised by its name or its content; the first match
/// checks it. Add a kind with one more entry in <see cref="Kinds"/>.
/// </summary>
public static partial class FileCheck
{
    /// <param name="Matches">Given the path and the text, whether the file is of this kind.</param>
    public sealed record Kind(string Name, Func<string, string, bool> Matches, Func<string, IReadOnlyList<FileProblem>> Check);

    public static readonly IReadOnlyList<Kind> Kinds =
    [
        new("show", (path, _) => path.EndsWith(".show.toml", StringComparison.OrdinalIgnoreCase), ShowScriptReader.Check),
        new("burn plan", (path, text) => path.EndsWith(".plan.toml", StringComparison.OrdinalIgnoreCase) || SegmentHeader().IsMatch(text), PlanFile.Check),
        new("scenario", (_, _) => true, ScenarioFile.Check),
    ];

    /// <summary>The kind the file was read as, and every problem found in it.</summary>
    public static (string Kind, IReadOnlyList<FileProblem> Problems) Check(string path)
    {
        string text = System.Text.Encoding.UTF8.GetString(UserFiles.ReadBytes(path, "input"));
        Kind kind = Kinds.First(k => k.Matches(path, text));
        return (kind.Name, kind.Check(path));
    }

    [GeneratedRegex(@"^\s*\[\[\s*segment\s*\]\]", RegexOptions.Multiline)]
    private static partial Regex SegmentHeader();
}
