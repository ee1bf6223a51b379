namespace Lightward.Cli.Tests;

/// <summary>`lightward render-show` and `check` with a burn-plan cue: shards still add up to one run, the plan is pinned, errors are located.</summary>
public sealed class RenderShowPlanTests : IDisposable
{
    private readonly string _folder = Directory.CreateTempSubdirectory("lightward-show-plan-").FullName;

    // An invented plan: a burn with a slow yaw until 0.5 c, then a turn to face home +Y while still thrusting.
    private const string Plan = """
        [[segment]]
        thrust = ["0 g", "0 g", "2 g"]
        attitude_rate = ["0 deg/s", "1 deg/s", "0 deg/s"]
        until_speed = "0.5 c"
        [[segment]]
        face = [0, 1, 0]
        thrust = ["0 g", "0 g", "0.5 g"]
        duration = "20 d"
        """;

    // A second and a half: the clock speeds up, then the plan takes the ship part way through a step of show time.
    private const string Show = """
        title = "Planned"
        length = "1.5 s"
        [cautions]
        max_rotation_rate = "90 deg/s"
        [[cue]]
        at = "0 s"
        transition = "0.5 s"
        time_compression = 1e6
        [[cue]]
        at = "0.21 s"
        burn_plan = "tiny.plan.toml"
        caption = "Burn"
        """;

    private string WriteShow()
    {
        File.WriteAllText(Path.Combine(_folder, "tiny.plan.toml"), Plan);
        string path = Path.Combine(_folder, "planned.show.toml");
        File.WriteAllText(path, Show);
        return path;
    }

    [Fact]
    public void The_union_of_shards_of_a_planned_show_is_byte_identical_to_one_run()
    {
        string show = WriteShow(), whole = Path.Combine(_folder, "whole"), sharded = Path.Combine(_folder, "sharded");
        var single = CliRunner.Run(RenderShowTests.Render(show, whole));
        Assert.True(single.ExitCode == 0, single.Stderr);
        for (int shard = 0; shard < 3; shard++)
        {
            var part = CliRunner.Run(RenderShowTests.Render(show, sharded, "--shard", $"{shard}/3"));
            Assert.True(part.ExitCode == 0, part.Stderr);
        }
        RenderShowTests.AssertSameFolders(whole, sharded);
        Assert.Contains("burn_plans_sha256 = { \"tiny.plan.toml\" = ", File.ReadAllText(Path.Combine(whole, "extras", "planned.render.toml")));
    }

    [Fact]
    public void Check_locates_a_missing_plan_and_the_problems_inside_a_plan()
    {
        string show = WriteShow();
        File.WriteAllText(show, Show.Replace("tiny.plan.toml", "lost.plan.toml"));
        var missing = CliRunner.Run("check", show);
        Assert.Equal(2, missing.ExitCode);
        Assert.Contains("planned.show.toml:11:13: cue[1].burn_plan: no such file \"lost.plan.toml\"", missing.Stderr);

        File.WriteAllText(Path.Combine(_folder, "tiny.plan.toml"), Plan.Replace("until_speed = \"0.5 c\"", "until_speed = \"fast\""));
        File.WriteAllText(show, Show);
        var broken = CliRunner.Run("check", show);
        Assert.Equal(2, broken.ExitCode);
        Assert.Contains("tiny.plan.toml:4:15: segment[0].until_speed:", broken.Stderr);
        Assert.DoesNotContain("   at ", broken.Stderr);
    }

    public void Dispose()
    {
        try { Directory.Delete(_folder, recursive: true); }
        catch (IOException) { }
    }
}
