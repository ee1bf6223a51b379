using Lightward.Scenarios.Files;
using Lightward.Scenarios.Model;

namespace Lightward.Scenarios.Tests;

/// <summary>Shipped scenarios and plans, and variants of them, for the flight tests.</summary>
public static class Flights
{
    public static string ScenarioPath(string name) => Path.Combine(Repository.Scenarios, name);

    public static Scenario Load(string name) => ScenarioFile.Load(ScenarioPath(name));

    /// <summary>A shipped scenario with its fixed step replaced, parsed from memory.</summary>
    public static Scenario WithStep(string name, string step)
    {
        string text = File.ReadAllText(ScenarioPath(name));
        string original = text.Split('\n').First(line => line.StartsWith("step = ", StringComparison.Ordinal));
        var problems = new List<FileProblem>();
        Scenario? scenario = ScenarioFile.Parse(text.Replace(original, $"step = \"{step}\""), ScenarioPath(name), "00", problems);
        Assert.Empty(problems);
        return scenario!;
    }
}
