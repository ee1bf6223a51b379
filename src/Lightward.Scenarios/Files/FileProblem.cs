using Lightward.Spacetime;

namespace Lightward.Scenarios.Files;

/// <summary>One thing wrong in a user's file, printed as <c>file:line:column: key.path: what is wrong (what is allowed)</c>.</summary>
public sealed record FileProblem(SourceLocation Location, string KeyPath, string What, string Allowed)
{
    public override string ToString() =>
        KeyPath.Length == 0 ? $"{Location}: {What} ({Allowed})" : $"{Location}: {KeyPath}: {What} ({Allowed})";

    /// <summary>Orders problems as they appear in the file, for reading top to bottom.</summary>
    public static void SortByPlace(List<FileProblem> problems) =>
        problems.Sort((a, b) => (a.Location.Line, a.Location.Column).CompareTo((b.Location.Line, b.Location.Column)));
}

/// <summary>A file with one or more problems; the message lists every one of them, one per line.</summary>
public sealed class FileProblemsException(IReadOnlyList<FileProblem> problems)
    : UserInputException(string.Join(Environment.NewLine, problems))
{
    public IReadOnlyList<FileProblem> Problems { get; } = problems;
}
