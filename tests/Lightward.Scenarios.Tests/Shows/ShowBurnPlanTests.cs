using Lightward.Scenarios.Files;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Tests.Shows;

/// <summary>Shows whose ship flies a burn plan (<c>burn_plan</c> cues): show time mapped to ship time, exact segment ends, validation.</summary>
public sealed class ShowBurnPlanTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lw-show-plan-").FullName;

    /// <summary>One gravity (9.80665 m/s², the standard gravity of the CGPM 1901 declaration) for two million ship seconds, then a coast.</summary>
    private const string BurnThenCoast = """
        [[segment]]
        name = "burn"
        thrust = ["0 g", "0 g", "1 g"]
        duration = "2000000 s"
        [[segment]]
        name = "coast"
        duration = "1 yr"
        """;

    private ShowTimeline Timeline(string plan, string cues, string length = "8 s")
    {
        File.WriteAllText(Path.Combine(_folder, "test.plan.toml"), plan);
        string show = Path.Combine(_folder, "test.show.toml");
        File.WriteAllText(show, $"title = \"Plan\"\nlength = \"{length}\"\n{cues}");
        return new ShowTimeline(ShowScriptReader.Load(show));
    }

    /// <summary>At 10⁶ ship seconds per show second, a plan cued at 1 s burns from 1 s to 3 s of show time.</summary>
    private ShowTimeline CompressedBurn() => Timeline(BurnThenCoast, """
        [[cue]]
        at = "0 s"
        time_compression = 1e6
        [[cue]]
        at = "1 s"
        burn_plan = "test.plan.toml"
        """);

    [Fact]
    public void The_rapidity_at_the_end_of_a_burn_is_proper_acceleration_times_ship_time()
    {
        ShowTimeline timeline = CompressedBurn();
        double a = Units.G, tau = 2e6;
        ShipState start = timeline.At(1).Ship, end = timeline.At(3).Ship, later = timeline.At(6).Ship;
        // Rindler, Relativity: Special, General, and Cosmological (2006), §3.7 hyperbolic motion: φ = aτ/c,
        // t = (c/a) sinh(aτ/c), x = (c²/a)(cosh(aτ/c) − 1).
        Assert.Equal(a * tau, end.Velocity.Rapidity, 1e-12);
        Assert.Equal(a * tau, later.Velocity.Rapidity, 1e-12);
        Assert.Equal(tau, end.ShipTime - start.ShipTime, 1e-6);
        Assert.Equal(Math.Sinh(a * tau) / a, end.HomeTime - start.HomeTime, 1e-9 * tau);
        Vec3 along = timeline.Script.Course;
        Assert.Equal((Math.Cosh(a * tau) - 1) / a, Vec3.Dot(end.Position.Space - start.Position.Space, along), 1e-9 * tau);
        // Half way through the burn in show time is half way in ship time at constant compression.
        Assert.Equal(a * tau / 2, timeline.At(2).Ship.Velocity.Rapidity, 1e-12);
    }

    [Fact]
    public void Before_the_plan_cue_the_ship_waits_at_home_while_the_compressed_clock_runs()
    {
        ShipState waiting = CompressedBurn().At(1).Ship;
        Assert.Equal(0, waiting.Velocity.Rapidity);
        Assert.Equal(1e6, waiting.ShipTime, 1e-6);
        Assert.Equal(0, waiting.Position.Space.Length);
    }

    [Fact]
    public void An_until_speed_segment_ends_on_the_speed_and_the_engine_stops()
    {
        ShowTimeline timeline = Timeline("""
            [[segment]]
            thrust = ["0 g", "0 g", "2 g"]
            until_speed = "0.6 c"
            """, "[[cue]]\nat = \"0 s\"\ntime_compression = 1e7\nburn_plan = \"test.plan.toml\"\n");
        double a = 2 * Units.G, phi = Math.Atanh(0.6);
        double burnShowTime = phi / a / 1e7;
        ShipState end = timeline.At(burnShowTime + 1).Ship;
        // Rapidity φ = atanh β (from memory): the crossing sits on the 2⁻¹⁰ s grid of ship time, so within a·2⁻¹⁰.
        Assert.Equal(phi, end.Velocity.Rapidity, a / 1024 * 1.01);
        Assert.Equal(2 * Units.G, timeline.ControlsAt(burnShowTime / 2).ProperAcceleration.Length, 12);
        Assert.Equal(Vec3.Zero, timeline.ControlsAt(burnShowTime + 1).ProperAcceleration);
        // Rapidity still to burn is the rest of the plan: half of it at the half-way point.
        Assert.Equal(phi / 2, timeline.RapidityToGo(burnShowTime / 2), 1e-3);
    }

    [Fact]
    public void A_face_segment_turns_the_nose_at_the_rotation_limit()
    {
        // A half turn at the default limit of 10°/s (common practice, no published source) at one ship second per
        // show second takes 18 s; the nose is then on the face direction. The clock races afterwards, so the plan is
        // flown at a coarse step (a show step at 10⁶): the turn must not be spread over it.
        ShowTimeline timeline = Timeline("""
            [[segment]]
            face = [-1, 0, 0]
            duration = "1 d"
            """, "[[cue]]\nat = \"1 s\"\nburn_plan = \"test.plan.toml\"\n[[cue]]\nat = \"25 s\"\ntime_compression = 1e6\n", "30 s");
        double limit = ShowCautions.DefaultMaxRotationRate, fastest = 0;
        for (int frame = 1; frame <= 24 * 30; frame++)
        {
            Rotation before = timeline.At((frame - 1) / 30.0).CameraOrientation, after = timeline.At(frame / 30.0).CameraOrientation;
            fastest = Math.Max(fastest, (before.Inverse * after).Angle * 30);
        }
        Assert.True(fastest <= limit * (1 + 1e-9), $"fastest turn {fastest * 180 / Math.PI} deg/s");
        Assert.True(fastest >= limit * 0.999, $"fastest turn {fastest * 180 / Math.PI} deg/s");
        Assert.Equal(-1, timeline.At(20).Ship.Forward.X, 9);
        Assert.True(timeline.At(10).Ship.Forward.X > -0.99, "the turn finished too soon");
    }

    [Fact]
    public void A_moment_on_a_plan_is_the_same_whichever_order_moments_are_asked_for()
    {
        const string plan = """
            [[segment]]
            thrust = ["0.1 g", "0 g", "1 g"]
            attitude_rate = ["0 deg/s", "2 deg/s", "0 deg/s"]
            until_speed = "0.5 c"
            [[segment]]
            face = [0, 1, 0]
            thrust = ["0 g", "0 g", "0.5 g"]
            duration = "2 min"
            """;
        const string cues = """
            [[cue]]
            at = "0 s"
            transition = "3 s"
            time_compression = 3e6
            rapidity = 0.5
            [[cue]]
            at = "2.3 s"
            burn_plan = "test.plan.toml"
            [[cue]]
            at = "4 s"
            transition = "2 s"
            time_compression = 20
            """;
        ShowTimeline forward = Timeline(plan, cues), backward = Timeline(plan, cues);
        double[] times = Enumerable.Range(0, 8 * 24).Select(i => i / 24.0).ToArray();
        ShipState[] first = times.Select(t => forward.At(t).Ship).ToArray();
        ShipState[] second = times.Reverse().Select(t => backward.At(t).Ship).Reverse().ToArray();
        Assert.Equal(first, second);
        // The plan takes over the profile's ship where it is, without a jump.
        ShipState taken = forward.At(2.3).Ship, justBefore = forward.At(2.3 - 1e-9).Ship;
        Assert.Equal(justBefore.Velocity.Rapidity, taken.Velocity.Rapidity, 1e-9);
        Assert.True((taken.Position.Space - justBefore.Position.Space).Length < 1e-2, "the ship jumped where the plan took over");
    }

    [Fact]
    public void A_missing_plan_a_broken_plan_and_a_speed_after_a_plan_are_located_errors()
    {
        string show = Path.Combine(_folder, "bad.show.toml");
        File.WriteAllText(Path.Combine(_folder, "broken.plan.toml"), "[[segment]]\nthrust = [\"0 g\", \"0 g\", \"1 g\"]\n");
        File.WriteAllText(show, """
            title = "Bad"
            length = "10 s"
            [[cue]]
            at = "0 s"
            burn_plan = "nowhere.plan.toml"
            [[cue]]
            at = "1 s"
            burn_plan = "broken.plan.toml"
            [[cue]]
            at = "2 s"
            speed = "0.5 c"
            [[cue]]
            at = "3 s"
            rapidity = 1
            burn_plan = "broken.plan.toml"
            """);
        string[] problems = ShowScriptReader.Check(show).Select(p => p.ToString()).ToArray();
        string all = string.Join("\n", problems);
        Assert.Contains($"bad.show.toml:5:13: cue[0].burn_plan: no such file \"nowhere.plan.toml\"", all);
        Assert.Single(problems, p => p.Contains("broken.plan.toml:1:3: segment[0]: the segment has no end condition"));
        Assert.Contains("bad.show.toml:11:9: cue[2].speed: comes after the burn plan of cue 1 at 0 s", all);
        Assert.Contains("bad.show.toml:14:12: cue[3].rapidity: given together with burn_plan", all);
    }

    [Fact]
    public void The_plan_demo_swings_onto_its_lane_then_burns_to_its_speed()
    {
        // The demo's own invented setting: a 90° swing onto home +Y, then one gravity until 0.95 c.
        var timeline = new ShowTimeline(ShowScriptReader.Load(Path.Combine(Repository.Scenarios, "swing-and-burn.show.toml")));
        Assert.Equal(1, timeline.At(11).Ship.Forward.Y, 9);
        ShipState coasting = timeline.At(38).Ship;
        // Rapidity φ = atanh β (from memory); the burn ends on the 2⁻¹⁰ s grid of ship time, within a·2⁻¹⁰ of it.
        Assert.Equal(Math.Atanh(0.95), coasting.Velocity.Rapidity, Units.G / 1024 * 1.01);
        Assert.Equal(1, Vec3.Dot(coasting.Velocity.Direction, Vec3.UnitY), 9);
    }

    public void Dispose()
    {
        try { Directory.Delete(_folder, recursive: true); }
        catch (IOException) { }
    }
}
