using Lightward.Scenarios.Files;
using Lightward.Scenarios.Model;

namespace Lightward.Scenarios.Tests;

public class FileValidationTests
{
    private static IReadOnlyList<FileProblem> Problems(string text)
    {
        var problems = new List<FileProblem>();
        ScenarioFile.Parse(text, "test.toml", "00", problems);
        return problems;
    }

    private static string Shipped(string name) => File.ReadAllText(Flights.ScenarioPath(name));

    [Fact]
    public void Every_problem_is_listed_with_its_line_column_and_key_path()
    {
        string text = Shipped("dock-tessaly.toml")
            .Replace("max_acceleration = \"3 g\"", "max_acceleration = \"3 parsecs\"")
            .Replace("speed = \"0.01 c\"", "speed = \"1.5 c\"")
            .Replace("distance = \"2 km\"", "distance = \"-2 km\"\nwobble = 3")
            .Replace("target = \"Tessaly Ring\"", "target = \"Nowhere Ring\"");
        IReadOnlyList<FileProblem> problems = Problems(text);
        string[] lines = text.Split('\n');
        Assert.Contains(problems, p => p.KeyPath == "ship.max_acceleration" && p.What.Contains("unknown unit") && lines[p.Location.Line - 1].Contains("3 parsecs"));
        Assert.Contains(problems, p => p.KeyPath == "body[0].worldline.speed" && p.Allowed.Contains("below") || p.Allowed.Contains("not including"));
        Assert.Contains(problems, p => p.KeyPath == "task.distance" && p.What.Contains("out of range"));
        Assert.Contains(problems, p => p.KeyPath == "task.wobble" && p.What == "unknown key");
        Assert.Contains(problems, p => p.KeyPath == "task.target" && p.What.Contains("Nowhere Ring") && p.Allowed.Contains("Tessaly Ring"));
        FileProblem unit = problems.First(p => p.KeyPath == "ship.max_acceleration");
        Assert.Equal(lines[unit.Location.Line - 1].IndexOf("\"3 parsecs\"", StringComparison.Ordinal) + 1, unit.Location.Column);
        Assert.Matches(@"^test\.toml:\d+:\d+: ship\.max_acceleration: .+ \(.+\)$", unit.ToString());
    }

    [Theory]
    [InlineData("[task]\nkind = \"stop\"\ntarget = \"Aster Quay\"\npoint = [\"0 km\", \"0 km\", \"0 km\"]", "task.point", "together")]
    [InlineData("[task]\nkind = \"rendezvous\"\ndistance = \"0 km\"\nrelative_speed = \"1 m/s\"\ntarget = \"Aster Quay\"", "task.distance", "out of range")]
    [InlineData("[task]\nkind = \"arrive_by\"\npoint = [\"1 ly\", \"0 ly\", \"0 ly\"]\ndistance = \"1 lh\"\ndeadline = \"40 yr\"", "task.deadline", "time limit")]
    [InlineData("[task]\nkind = \"flyby\"\ntarget = \"Aster Quay\"\ndistance = \"1 km\"\nview_angle = \"200 deg\"", "task.view_angle", "out of range")]
    [InlineData("[task]\nkind = \"jump\"", "task.kind", "unknown value")]
    public void Contradictory_or_impossible_tasks_are_reported(string task, string keyPath, string what)
    {
        string text = Shipped("free-flight.toml").Replace("[task]\nkind = \"free\"", task);
        Assert.Contains(Problems(text), p => p.KeyPath == keyPath && p.ToString().Contains(what));
    }

    [Fact]
    public void Duplicate_names_bad_colours_and_missing_sections_are_reported()
    {
        string text = Shipped("dock-tessaly.toml").Replace("name = \"Aster Quay\"", "name = \"Tessaly Ring\"").Replace("#e0b070", "orange")
            .Replace("[flight]", "[flightplan]");
        IReadOnlyList<FileProblem> problems = Problems(text);
        Assert.Contains(problems, p => p.KeyPath == "body[1].name" && p.What.Contains("already defined"));
        Assert.Contains(problems, p => p.KeyPath == "body[0].colour" && p.Allowed.Contains("#rrggbb"));
        Assert.Contains(problems, p => p.KeyPath == "flight" && p.What == "missing required key");
        Assert.Contains(problems, p => p.KeyPath == "flightplan" && p.What == "unknown key");
    }

    [Fact]
    public void Syntax_errors_are_located()
    {
        IReadOnlyList<FileProblem> problems = Problems("title = \"x\"\nbriefing = \n");
        FileProblem problem = Assert.Single(problems);
        Assert.Equal(2, problem.Location.Line);
    }

    [Fact]
    public void Plans_are_checked_against_the_ship()
    {
        Scenario scenario = Flights.Load("twin-drill.toml");
        var problems = new List<FileProblem>();
        PlanFile.Parse("[[segment]]\nthrust = [\"0 g\", \"0 g\", \"2 g\"]\nduration = \"1 d\"\nuntil_speed = \"0.5 c\"\n\n[[segment]]\nturn = 1\n", "p.plan.toml", "00", scenario.Ship, problems);
        Assert.Contains(problems, p => p.KeyPath == "segment[0].thrust" && p.Allowed.Contains("max_acceleration"));
        Assert.Contains(problems, p => p.KeyPath == "segment[0]" && p.What.Contains("more than one end condition"));
        Assert.Contains(problems, p => p.KeyPath == "segment[1].turn" && p.What == "unknown key");
        Assert.Contains(problems, p => p.KeyPath == "segment[1]" && p.What.Contains("no end condition"));
    }

    [Fact]
    public void The_parsed_scenario_carries_its_scene_as_plain_data()
    {
        Scenario scenario = Flights.Load("dock-tessaly.toml");
        BodySpec ring = scenario.FindBody("Tessaly Ring")!;
        Assert.Equal(ShapeKind.Box, ring.Shape.Kind);
        Assert.Equal(WorldlineKind.Inertial, ring.Worldline.Kind);
        // Units: 0.01 c is β = 0.01 (c = 1 inside the core).
        Assert.Equal(0.01, ring.Path.FourVelocityAtHomeTime(0).Y / ring.Path.FourVelocityAtHomeTime(0).T, 1e-15);
        Assert.Equal("Tessaly Ring", scenario.Grid.Frame);
        Assert.Equal(TaskKind.Rendezvous, scenario.Task.Kind);
    }
}
