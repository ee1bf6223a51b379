using Lightward.Scenarios.Files;
using Lightward.Scenarios.Model;

namespace Lightward.Scenarios.Tests;

/// <summary>Shipped scenarios and plans, and variants of them, for the flight tests.</summary>
public static class Flights
{
    public static string ScenarioPath(string name) => Path.Combine(Repository.Scenarios, name);

    public static Scenario Load(string name) => ScenarioFile.Load(ScenarioPath(name));

    /// <summary>A shipped scenario with its fixed step replaced, parsed from memory.</summary>
    public static Scenario WithStep(string name, string step) => Variant(name, text =>
        text.Replace(text.Split('\n').First(line => line.StartsWith("step = ", StringComparison.Ordinal)), $"step = \"{step}\""));

    /// <summary>A shipped scenario edited in memory; the edit must leave it valid.</summary>
    public static Scenario Variant(string name, Func<string, string> edit)
    {
        var problems = new List<FileProblem>();
        Scenario? scenario = ScenarioFile.Parse(edit(File.ReadAllText(ScenarioPath(name))), ScenarioPath(name), "00", problems);
        Assert.Empty(problems);
        return scenario!;
    }
}
