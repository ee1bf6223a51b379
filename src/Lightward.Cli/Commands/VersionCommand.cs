using Lightward.Optics;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

public sealed class VersionCommand : Command
{
    public override int Execute(CommandContext context, CancellationToken cancellationToken)
    {
        Console.WriteLine($"lightward {typeof(VersionCommand).Assembly.GetName().Version?.ToString(3)}");
        Console.WriteLine(StarCatalog.Attribution);
        return 0;
    }
}
