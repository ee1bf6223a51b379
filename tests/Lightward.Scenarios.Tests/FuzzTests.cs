using CsCheck;
using Lightward.Scenarios.Files;

namespace Lightward.Scenarios.Tests;

/// <summary>Mutated scenario and plan files never crash or hang the loaders: each is accepted or rejected with located problems.</summary>
public class FuzzTests
{
    private const string Alphabet = "=[]{}\"'#.,\n -+0123456789eE_abcdgkmlsyz";

    /// <summary>One edit: delete a span, insert random characters, duplicate or drop a line, or swap a number's digits.</summary>
    private static Gen<Func<string, string>> Edit =>
        Gen.Int[0, 4].SelectMany(kind => Gen.Int[0, int.MaxValue].SelectMany(position => Gen.Int[1, 12].SelectMany(length =>
            Gen.Char[Alphabet].Array[1, 8].Select(chars => (Func<string, string>)(text =>
            {
                if (text.Length == 0) return new string(chars);
                int at = position % text.Length, span = Math.Min(length, text.Length - at);
                string[] lines = text.Split('\n');
                int line = position % lines.Length;
                return kind switch
                {
                    0 => text.Remove(at, span),
                    1 => text.Insert(at, new string(chars)),
                    2 => string.Join('\n', lines.Take(line + 1).Append(lines[line]).Concat(lines.Skip(line + 1))),
                    3 => string.Join('\n', lines.Where((_, i) => i != line)),
                    _ => text.Remove(at, span).Insert(at, new string(chars.Select(c => char.IsDigit(c) ? c : '9').ToArray())),
                };
            })))));

    private static Gen<string> Mutated(string original) =>
        Edit.Array[1, 4].Select(edits => edits.Aggregate(original, (text, edit) => edit(text)));

    private static void AcceptedOrLocated(List<FileProblem> problems, object? result, string path, string text)
    {
        if (result is not null)
        {
            Assert.Empty(problems);
            return;
        }
        Assert.NotEmpty(problems);
        int lines = text.Split('\n').Length;
        foreach (FileProblem problem in problems)
        {
            Assert.Equal(path, problem.Location.File);
            Assert.InRange(problem.Location.Line, 1, lines + 1);
            Assert.True(problem.Location.Column >= 1);
            Assert.False(string.IsNullOrWhiteSpace(problem.What));
            Assert.False(string.IsNullOrWhiteSpace(problem.Allowed));
        }
    }

    [Theory]
    [InlineData("dock-tessaly.toml")]
    [InlineData("flyby-ember.toml")]
    [InlineData("twin-drill.toml")]
    public void Mutated_scenarios_are_accepted_or_rejected_with_located_problems(string name)
    {
        string original = File.ReadAllText(Flights.ScenarioPath(name));
        Mutated(original).Sample(text =>
        {
            var problems = new List<FileProblem>();
            var scenario = ScenarioFile.Parse(text, "fuzz.toml", "00", problems);
            AcceptedOrLocated(problems, scenario, "fuzz.toml", text);
        }, iter: 700, threads: 1);
    }

    [Fact]
    public void Mutated_plans_are_accepted_or_rejected_with_located_problems()
    {
        var ship = Flights.Load("beacon-stop.toml").Ship;
        string original = File.ReadAllText(Flights.ScenarioPath("beacon-stop.plan.toml"));
        Mutated(original).Sample(text =>
        {
            var problems = new List<FileProblem>();
            var plan = PlanFile.Parse(text, "fuzz.plan.toml", "00", ship, problems);
            AcceptedOrLocated(problems, plan, "fuzz.plan.toml", text);
        }, iter: 1000, threads: 1);
    }
}
