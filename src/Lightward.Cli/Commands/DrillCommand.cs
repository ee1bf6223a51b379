using System.ComponentModel;
using System.Globalization;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Spacetime;
using Spectre.Console;
using Spectre.Console.Cli;

namespace Lightward.Cli.Commands;

public sealed class DrillSettings : CommandSettings
{
    [CommandArgument(0, "<SCENARIO>")]
    [Description("Scenario file to fly.")]
    public string Scenario { get; init; } = "";

    [CommandOption("--plan <FILE>")]
    [Description("Burn plan to fly and score.")]
    public string? Plan { get; init; }

    [CommandOption("--autopilot")]
    [Description("Fly the reference guidance for the scenario's task instead of a plan.")]
    public bool Autopilot { get; init; }

    [CommandOption("--logs <DIR>")]
    [Description("Score every recorded flight (*.flightlog) in this folder instead of flying.")]
    public string? Logs { get; init; }

    [CommandOption("--shard <I/N>")]
    [Description("With --logs: score only share I of N (0 ≤ I < N), for a job array; logs are split by sorted name.")]
    public string? Shard { get; init; }

    [CommandOption("--json")]
    [Description("Print the report as JSON (an array with --logs).")]
    public bool Json { get; init; }

    [CommandOption("--markdown <FILE>")]
    [Description("Also write the report as a Markdown training record.")]
    public string? Markdown { get; init; }

    [CommandOption("--plot <FILE>")]
    [Description("Also write a PNG spacetime diagram: the flown and reference worldlines with light cones.")]
    public string? Plot { get; init; }

    [CommandOption("--record <FILE>")]
    [Description("Flight log to write (default: <scenario>-<UTC time>.flightlog in the current folder).")]
    public string? Record { get; init; }

    [CommandOption("--no-record")]
    [Description("Do not write a flight log.")]
    public bool NoRecord { get; init; }

    public override ValidationResult Validate()
    {
        int modes = (Plan is not null ? 1 : 0) + (Autopilot ? 1 : 0) + (Logs is not null ? 1 : 0);
        if (modes != 1) return ValidationResult.Error("--plan, --autopilot, --logs: give exactly one of them (what to fly or score)");
        if (Shard is not null && Logs is null) return ValidationResult.Error("--shard: only with --logs");
        if (Shard is not null && ParseShard(Shard) is null) return ValidationResult.Error($"--shard: '{Shard}' is not I/N (allowed: whole numbers with 0 ≤ I < N, e.g. 3/16)");
        if (Logs is not null && (Markdown is not null || Plot is not null || Record is not null || NoRecord))
            return ValidationResult.Error("--markdown, --plot, --record, --no-record: not with --logs (they describe one flight)");
        if (Record is not null && NoRecord) return ValidationResult.Error("--record, --no-record: give one or the other");
        return ValidationResult.Success();
    }

    public static (int Index, int Count)? ParseShard(string text)
    {
        string[] parts = text.Split('/');
        if (parts.Length == 2 && int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out int index)
            && int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out int count) && count > 0 && index < count)
            return (index, count);
        return null;
    }
}

/// <summary>Flies a scenario headless with a burn plan or the autopilot and scores it, or scores a folder of recorded flights.</summary>
public sealed class DrillCommand : Command<DrillSettings>
{
    public override int Execute(CommandContext context, DrillSettings settings, CancellationToken cancellationToken)
    {
        Scenario scenario = ScenarioFile.Load(settings.Scenario);
        return settings.Logs is not null ? ScoreLogs(scenario, settings) : FlyOnce(scenario, settings);
    }

    private static int FlyOnce(Scenario scenario, DrillSettings settings)
    {
        IPilot pilot = settings.Plan is { } planPath ? new PlanPilot(PlanFile.Load(planPath, scenario.Ship)) : new Autopilot();
        string pilotName = settings.Plan is { } p ? $"burn plan {Path.GetFileName(p)}" : "autopilot";
        string? logPath = settings.NoRecord ? null
            : settings.Record ?? FlightRecorder.DefaultPath(scenario);
        Flight reference = Drill.Fly(scenario, new Autopilot());
        double referenceScore = FlightReport.From(reference).Score;
        Flight flight;
        using (FlightRecorder? recorder = logPath is null ? null : FlightRecorder.Create(logPath, scenario, pilotName))
            flight = Drill.Fly(scenario, pilot, recorder);
        FlightReport report = FlightReport.From(flight, referenceScore);

        if (settings.Json) Console.WriteLine(ReportText.Json([(report, logPath)], asArray: false));
        else WriteTable(report, scenario, pilotName, logPath);
        if (settings.Markdown is { } markdown) UserFiles.WriteTextAtomically(markdown, ReportText.Markdown(report, scenario.Title, pilotName, logPath));
        if (settings.Plot is { } plot) WorldlinePlot.Save(plot, flight, reference);
        return ErrorReporting.Success;
    }

    private static int ScoreLogs(Scenario scenario, DrillSettings settings)
    {
        if (!Directory.Exists(settings.Logs)) throw new UserInputException($"--logs: folder not found: {settings.Logs}");
        string[] all = Directory.GetFiles(settings.Logs!, "*" + FlightLogFormat.Extension).Order(StringComparer.Ordinal).ToArray();
        (int index, int count) = settings.Shard is { } shard ? DrillSettings.ParseShard(shard)!.Value : (0, 1);
        // Round-robin over the sorted names: each shard gets every count-th log, so shards stay even as folders grow.
        string[] mine = all.Where((_, i) => i % count == index).ToArray();
        double referenceScore = Drill.Reference(scenario).Score;
        var results = new List<(FlightReport Report, string? Log)>();
        var refused = new List<string>();
        void ScoreEach(Action advance)
        {
            foreach (string path in mine)
            {
                try
                {
                    FlightLog log = FlightLog.Read(path);
                    results.Add((FlightReport.From(Drill.Replay(log, Drill.ScenarioFor(log, scenario)), referenceScore), path));
                }
                catch (UserInputException exception)
                {
                    refused.Add(exception.Message);
                }
                advance();
            }
        }
        if (settings.Json || Console.IsErrorRedirected) ScoreEach(() => { });
        else
            AnsiConsole.Progress().Columns(new TaskDescriptionColumn(), new ProgressBarColumn(), new PercentageColumn(), new RemainingTimeColumn())
                .Start(progress =>
                {
                    ProgressTask task = progress.AddTask($"scoring {mine.Length} flight logs", maxValue: Math.Max(1, mine.Length));
                    ScoreEach(() => task.Increment(1));
                });

        foreach (string message in refused) Console.Error.WriteLine($"lightward: error: {message}");
        if (settings.Json) Console.WriteLine(ReportText.Json(results, asArray: true));
        else
        {
            var table = new Table().AddColumns("Flight log", "Result", "Score", "Miss distance", "Relative speed", "Ship time", "Rapidity used");
            foreach ((FlightReport report, string? log) in results)
                table.AddRow(Markup.Escape(Path.GetFileName(log!)), report.Success ? "[green]success[/]" : "[red]failure[/]", report.Score.ToString("F1", CultureInfo.InvariantCulture),
                    Markup.Escape(ReportText.Measures(report)[0].Value), Markup.Escape(ReportText.Measures(report)[1].Value), Markup.Escape(ReportText.Duration(report.ShipTime)),
                    report.RapidityUsed.ToString("F4", CultureInfo.InvariantCulture));
            AnsiConsole.Write(table);
            int successes = results.Count(r => r.Report.Success);
            double mean = results.Count > 0 ? results.Average(r => r.Report.Score) : 0;
            AnsiConsole.MarkupLineInterpolated($"shard {index}/{count}: {results.Count} scored, {successes} succeeded, mean score {mean:F1} (reference {referenceScore:F1}), {refused.Count} refused");
        }
        return refused.Count == 0 ? ErrorReporting.Success : ErrorReporting.UserError;
    }

    /// <summary>The terminal report of one flight, shared with replay.</summary>
    public static void WriteTable(FlightReport report, Scenario scenario, string pilot, string? log)
    {
        var table = new Table().Title(Markup.Escape(scenario.Title)).AddColumns("", "");
        table.HideHeaders();
        table.AddRow("Pilot", Markup.Escape(pilot));
        table.AddRow("Result", report.Success ? "[green]success[/]" : "[red]failure[/]");
        table.AddRow("Reason", Markup.Escape(report.Reason));
        foreach ((string name, string value) in ReportText.Measures(report)) table.AddRow(name, Markup.Escape(value));
        foreach (Penalty penalty in report.Penalties)
            table.AddRow($"Penalty: {penalty.Name}", penalty.Points.ToString("F1", CultureInfo.InvariantCulture));
        table.AddRow("Score", $"[bold]{report.Score.ToString("F1", CultureInfo.InvariantCulture)}[/]");
        if (report.ReferenceScore is { } reference) table.AddRow("Reference score", reference.ToString("F1", CultureInfo.InvariantCulture));
        table.AddRow("State hash", report.StateHash);
        if (log is not null) table.AddRow("Flight log", Markup.Escape(log));
        AnsiConsole.Write(table);
    }
}
