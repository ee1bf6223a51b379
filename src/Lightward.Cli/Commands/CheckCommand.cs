using System.ComponentModel;
using Lightward.Scenarios.Files;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

public sealed class CheckSettings : CommandSettings
{
    [CommandArgument(0, "<FILE>")]
    [Description("Scenario, burn plan (*.plan.toml or any file with [[segment]] tables) or show (*.show.toml) to check. Several may be given.")]
    public string[] Files { get; init; } = [];
}

/// <summary>Validates files without flying them: every problem, located, one per line; exit 2 when there are any.</summary>
public sealed class CheckCommand : Command<CheckSettings>
{
    public override int Execute(CommandContext context, CheckSettings settings, CancellationToken cancellationToken)
    {
        int problems = 0;
        foreach (string file in settings.Files)
        {
            (string kind, IReadOnlyList<FileProblem> found) = FileCheck.Check(file);
            foreach (FileProblem problem in found) Console.Error.WriteLine($"lightward: error: {problem}");
            // Plain text, one line per file: paths must not be wrapped.
            if (found.Count == 0) Console.WriteLine($"{file}: ok ({kind})");
            problems += found.Count;
        }
        if (problems == 0) return ErrorReporting.Success;
        Console.Error.WriteLine($"lightward: {problems} problem{(problems == 1 ? "" : "s")} found");
        return ErrorReporting.UserError;
    }
}
