using System.ComponentModel;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

public sealed class ReplaySettings : CommandSettings
{
    [CommandArgument(0, "<LOG>")]
    [Description("Flight log to fly again (*.flightlog, written by drill or a live flight).")]
    public string Log { get; init; } = "";

    [CommandOption("--scenario <FILE>")]
    [Description("Scenario to replay in, when it has moved since the flight; it must be byte-for-byte the one flown.")]
    public string? Scenario { get; init; }

    [CommandOption("--json")]
    [Description("Print the report as JSON instead of a table.")]
    public bool Json { get; init; }
}

/// <summary>Re-flies a flight log bit-identically and compares the final state hash with the recorded one.</summary>
public sealed class ReplayCommand : Command<ReplaySettings>
{
    public override int Execute(CommandContext context, ReplaySettings settings, CancellationToken cancellationToken)
    {
        FlightLog log = FlightLog.Read(settings.Log);
        Scenario scenario = Drill.ScenarioFor(log, settings.Scenario is null ? null : ScenarioFile.Load(settings.Scenario));
        Flight flight = Drill.Replay(log, scenario);
        FlightReport report = FlightReport.From(flight);
        if (settings.Json) Console.WriteLine(ReportText.Json([(report, log.Path)], asArray: false));
        else DrillCommand.WriteTable(report, scenario, log.Pilot, log.Path);

        string state = $"final state hash: {report.StateHash}";
        if (log.FinalStateHash is null)
        {
            Console.Error.WriteLine($"{state} (the log ends without its final record{(log.Truncated ? ", cut short" : "")}: nothing to compare with)");
            return ErrorReporting.Success;
        }
        if (log.FinalStateHash == report.StateHash)
        {
            // Plain text: a hash must never be wrapped or styled.
            if (!settings.Json) Console.WriteLine($"{state} (equal to the recorded one)");
            return ErrorReporting.Success;
        }
        Console.Error.WriteLine($"lightward: internal error (please report): replay diverged: {state}, recorded {log.FinalStateHash}");
        return ErrorReporting.InternalError;
    }
}
