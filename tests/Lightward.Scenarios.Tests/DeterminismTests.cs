using CsCheck;
using Lightward.Scenarios.Files;
using Lightward.Scenarios.Flights;
using Lightward.Scenarios.Model;
using Lightward.Scenarios.Plans;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Tests;

public class DeterminismTests
{
    private static readonly SourceLocation Nowhere = new("generated", 1, 1);

    /// <summary>Random plans for the free-flight scenario: constant thrust and turn rate per segment, ending on a ship time or a speed.</summary>
    private static readonly Gen<BurnPlan> Plans =
        Gen.Select(Gen.Double[-1, 1].Array[3], Gen.Double[-0.1, 0.1].Array[3], Gen.Int[10, 600], Gen.Bool, Gen.Double[0.000_01, 0.000_2])
            .Select(t => new PlanSegment("generated",
                new Vec3(t.Item1[0], t.Item1[1], t.Item1[2]) * Units.G,
                new Vec3(t.Item2[0], t.Item2[1], t.Item2[2]),
                null,
                t.Item4 ? SegmentEnd.Duration : SegmentEnd.Speed,
                t.Item4 ? t.Item3 : t.Item5, Nowhere))
            .Array[1, 4]
            .Select(segments => new BurnPlan("generated", "00", segments));

    private static FlightReport Fly(Scenario scenario, BurnPlan plan) => FlightReport.From(Drill.Fly(scenario, new PlanPilot(plan)));

    [Fact]
    public void The_same_plan_flown_twice_gives_identical_scores_and_state_hashes()
    {
        Scenario scenario = Flights.Load("free-flight.toml");
        Plans.Sample(plan =>
        {
            FlightReport first = Fly(scenario, plan), second = Fly(scenario, plan);
            Assert.Equal(first.StateHash, second.StateHash);
            Assert.Equal(first.Score, second.Score);
        }, iter: 8);
    }

    [Fact]
    public void A_plan_flown_at_different_steps_gives_identical_scores_and_state_hashes()
    {
        // Steps that divide each other exactly, so the ship clock lands on the same readings: the physics is the same.
        Scenario[] variants = [Flights.WithStep("free-flight.toml", "1 s"), Flights.WithStep("free-flight.toml", "4 s"), Flights.WithStep("free-flight.toml", "2 s")];
        Plans.Sample(plan =>
        {
            FlightReport[] reports = variants.Select(v => Fly(v, plan)).ToArray();
            foreach (FlightReport report in reports[1..])
            {
                Assert.Equal(reports[0].StateHash, report.StateHash);
                Assert.Equal(reports[0].Score, report.Score);
            }
        }, iter: 5);
    }

    [Fact]
    public void The_twin_plan_ends_on_the_same_bits_at_any_step()
    {
        BurnPlan plan = PlanFile.Load(Flights.ScenarioPath("twin-drill.plan.toml"), null);
        FlightReport[] reports = new[] { "1 h", "2 h", "3 h", "90 min" }.Select(step => Fly(Flights.WithStep("twin-drill.toml", step), plan)).ToArray();
        Assert.All(reports, r => Assert.True(r.Success, r.Reason));
        Assert.All(reports, r => Assert.Equal(reports[0].StateHash, r.StateHash));
        Assert.All(reports, r => Assert.Equal(reports[0].Score, r.Score));
    }
}
