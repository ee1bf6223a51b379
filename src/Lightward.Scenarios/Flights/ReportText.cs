using System.Globalization;
using System.Text;
using System.Text.Encodings.Web;
using System.Text.Json;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Flights;

/// <summary>A flight report as JSON (for tools) and as Markdown (for a training record).</summary>
public static class ReportText
{
    public static string Json(IReadOnlyList<(FlightReport Report, string? Log)> reports, bool asArray)
    {
        using var buffer = new MemoryStream();
        using (var writer = new Utf8JsonWriter(buffer, new JsonWriterOptions { Indented = true, Encoder = JavaScriptEncoder.UnsafeRelaxedJsonEscaping }))
        {
            if (asArray) writer.WriteStartArray();
            foreach ((FlightReport report, string? log) in reports) WriteReport(writer, report, log);
            if (asArray) writer.WriteEndArray();
        }
        return Encoding.UTF8.GetString(buffer.ToArray());
    }

    private static void WriteReport(Utf8JsonWriter writer, FlightReport report, string? log)
    {
        writer.WriteStartObject();
        writer.WriteString("scenario", report.Scenario);
        writer.WriteBoolean("success", report.Success);
        writer.WriteString("reason", report.Reason);
        writer.WriteNumber("miss_distance_km", report.MissDistance / Units.Kilometre);
        writer.WriteNumber("relative_speed_kms", report.RelativeSpeed / Units.Kilometre);
        writer.WriteNumber("ship_time_s", report.ShipTime);
        writer.WriteNumber("home_time_s", report.HomeTime);
        writer.WriteNumber("rapidity_used", report.RapidityUsed);
        writer.WriteNumber("rapidity_left", report.RapidityLeft);
        writer.WriteNumber("score", report.Score);
        if (report.ReferenceScore is { } reference) writer.WriteNumber("reference_score", reference);
        else writer.WriteNull("reference_score");
        writer.WriteStartArray("penalties");
        foreach (Penalty penalty in report.Penalties)
        {
            writer.WriteStartObject();
            writer.WriteString("name", penalty.Name);
            writer.WriteNumber("points", Math.Round(penalty.Points, 3));
            writer.WriteEndObject();
        }
        writer.WriteEndArray();
        writer.WriteString("state_hash", report.StateHash);
        writer.WriteNumber("steps", report.Steps);
        if (log is not null) writer.WriteString("flight_log", log);
        writer.WriteEndObject();
    }

    public static string Markdown(FlightReport report, string title, string pilot, string? log)
    {
        var text = new StringBuilder();
        text.AppendLine(CultureInfo.InvariantCulture, $"# Training record: {title}");
        text.AppendLine();
        text.AppendLine(CultureInfo.InvariantCulture, $"- Scenario: `{report.Scenario}`");
        text.AppendLine(CultureInfo.InvariantCulture, $"- Pilot: {pilot}");
        text.AppendLine(CultureInfo.InvariantCulture, $"- Result: **{(report.Success ? "success" : "failure")}**: {report.Reason}");
        text.AppendLine(CultureInfo.InvariantCulture, $"- Score: **{report.Score:F1}**{(report.ReferenceScore is { } r ? $" (reference {r:F1})" : "")}");
        if (log is not null) text.AppendLine(CultureInfo.InvariantCulture, $"- Flight log: `{log}`");
        text.AppendLine(CultureInfo.InvariantCulture, $"- Final state hash: `{report.StateHash}`");
        text.AppendLine();
        text.AppendLine("| Measure | Value |");
        text.AppendLine("|---|---|");
        foreach ((string name, string value) in Measures(report)) text.AppendLine(CultureInfo.InvariantCulture, $"| {name} | {value} |");
        text.AppendLine();
        text.AppendLine("| Penalty | Measure / scale | Points |");
        text.AppendLine("|---|---|---|");
        foreach (Penalty penalty in report.Penalties)
            text.AppendLine(CultureInfo.InvariantCulture, $"| {penalty.Name} | {(penalty.Scale > 0 ? penalty.Measure / penalty.Scale : 0):F4} | {penalty.Points:F1} |");
        return text.ToString();
    }

    /// <summary>The measures in readable units, shared by the terminal table and the Markdown record.</summary>
    public static IReadOnlyList<(string Name, string Value)> Measures(FlightReport report) =>
    [
        ("Miss distance", $"{report.MissDistance / Units.Kilometre:G6} km"),
        ("Relative speed", $"{report.RelativeSpeed / Units.Kilometre:G6} km/s"),
        ("Ship time", Duration(report.ShipTime)),
        ("Home time", Duration(report.HomeTime)),
        ("Rapidity used", $"{report.RapidityUsed:F4}"),
        ("Rapidity left", $"{report.RapidityLeft:F4}"),
    ];

    /// <summary>A time in the largest unit that keeps it readable, with seconds for exactness.</summary>
    public static string Duration(double seconds)
    {
        string coarse = Math.Abs(seconds) switch
        {
            >= Units.JulianYear => $"{seconds / Units.JulianYear:F4} yr",
            >= Units.Day => $"{seconds / Units.Day:F4} d",
            >= 3600 => $"{seconds / 3600:F4} h",
            _ => "",
        };
        string exact = seconds.ToString("F3", CultureInfo.InvariantCulture) + " s";
        return coarse.Length == 0 ? exact : $"{coarse} ({exact})";
    }
}
