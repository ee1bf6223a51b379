using Lightward.Scenarios.Model;

namespace Lightward.Scenarios.Flights;

/// <summary>One charge against the score: the measure, its scale (tolerance or limit) and the points taken.</summary>
public sealed record Penalty(string Name, double Measure, double Scale, double Points);

/// <summary>
/// The result of a flight as a trainee sees it: success and why, the measures, the penalty breakdown and the score.
/// A successful flight starts from <see cref="FullMarks"/> and loses, for each measure, its weight times the measure
/// over its scale (a miss equal to the tolerance costs the full weight); a failed flight scores zero.
/// </summary>
public sealed record FlightReport(
    string Scenario, bool Success, string Reason, double MissDistance, double RelativeSpeed, double ShipTime, double HomeTime,
    double RapidityUsed, double RapidityLeft, IReadOnlyList<Penalty> Penalties, double Score, double? ReferenceScore, string StateHash, long Steps)
{
    public const double FullMarks = 1000;

    public static FlightReport From(Flight flight, double? referenceScore = null)
    {
        Scenario scenario = flight.Scenario;
        TaskVerdict verdict = flight.Verdict ?? new TaskVerdict(false, "the flight stopped before the task was decided");
        ScoringWeights w = scenario.Scoring;
        TaskMonitor monitor = flight.Monitor;
        double miss = double.IsFinite(monitor.MissDistance) ? monitor.MissDistance : 0;
        var penalties = new List<Penalty>();
        if (scenario.Task.Kind != TaskKind.Free) penalties.Add(Charge("miss distance", miss, scenario.Task.Distance, w.MissDistance));
        if (monitor.ChargesRelativeSpeed) penalties.Add(Charge("relative speed", monitor.RelativeSpeed, scenario.Task.RelativeSpeed, w.RelativeSpeed));
        penalties.Add(Charge("ship time", flight.ShipTimeFlown, scenario.Flight.ShipTimeLimit, w.ShipTime));
        penalties.Add(Charge("home time", flight.HomeTimeFlown, scenario.Flight.HomeTimeLimit, w.HomeTime));
        penalties.Add(Charge("rapidity", flight.RapidityUsed, scenario.Ship.RapidityBudget, w.Rapidity));
        double score = verdict.Success ? Math.Round(Math.Max(0, FullMarks - penalties.Sum(p => p.Points)), 1) : 0;
        return new FlightReport(scenario.Name, verdict.Success, verdict.Reason, miss, monitor.RelativeSpeed, flight.ShipTimeFlown,
            flight.HomeTimeFlown, flight.RapidityUsed, flight.RapidityLeft, penalties, score, referenceScore, flight.StateHash(), flight.Steps);
    }

    private static Penalty Charge(string name, double measure, double scale, double weight) =>
        new(name, measure, scale, scale > 0 ? weight * measure / scale : 0);
}
