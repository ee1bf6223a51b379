using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;

namespace Lightward.Scenarios.Tests;

public class ShippedScenarioTests
{
    public static TheoryData<string> Shipped()
    {
        var data = new TheoryData<string>();
        foreach (string file in Directory.GetFiles(Repository.Scenarios, "*.toml").Where(f => !f.EndsWith(".show.toml") && !f.EndsWith(".plan.toml")).Order(StringComparer.Ordinal))
            data.Add(Path.GetFileName(file));
        return data;
    }

    [Theory]
    [MemberData(nameof(Shipped))]
    public void Every_shipped_scenario_passes_check(string file) =>
        Assert.Empty(ScenarioFile.Check(Path.Combine(Repository.Scenarios, file)));

    [Theory]
    [MemberData(nameof(Shipped))]
    public void Every_shipped_scenario_is_solved_by_the_autopilot(string file)
    {
        FlightReport report = Drill.Reference(ScenarioFile.Load(Path.Combine(Repository.Scenarios, file)));
        Assert.True(report.Success, report.Reason);
        Assert.True(report.Score > 0, $"score {report.Score}");
    }
}
