using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Tests.Shows;

public class ShowTimelineTests
{
    private static ShowScript Script(params ShowCue[] cues) =>
        new("/shows/test.show.toml", "Test", 40, Vec3.UnitX, ShowCautions.Default, cues);

    [Fact]
    public void Constant_proper_acceleration_matches_the_hyperbolic_motion_formulas()
    {
        // Rapidity eased linearly from 0 to 2 over 10 s of show time at 1e7 ship seconds per show second is a constant
        // proper acceleration a = 2 / 1e8 s. Rindler, Relativity: Special, General, and Cosmological (2006), eq. (3.53):
        // t = (c/a) sinh(aτ/c), x = (c²/a)(cosh(aτ/c) − 1).
        var timeline = new ShowTimeline(Script(
            new ShowCue(1, "compress", 0, 0, Easing.Linear) { TimeCompression = 1e7 },
            new ShowCue(2, "burn", 0, 10, Easing.Linear) { Rapidity = 2 }));
        ShowMoment end = timeline.At(10);
        double a = 2 / 1e8, tau = 1e8;
        Assert.Equal(tau, end.Ship.ShipTime, 1e-9 * tau);
        Assert.Equal(Math.Sinh(a * tau) / a, end.Ship.HomeTime, 1e-9 * end.Ship.HomeTime);
        Assert.Equal((Math.Cosh(a * tau) - 1) / a, end.Ship.Position.X, 1e-9 * end.Ship.Position.X);
        Assert.Equal(2, end.Ship.Velocity.Rapidity, 1e-9);
    }

    [Fact]
    public void Camera_turns_are_slowed_to_the_rotation_limit()
    {
        // A half turn asked for in 2 s, with the smooth (half-cosine) easing whose peak slope is π/2: at 10°/s it needs
        // π/2 × 180° / 10°/s = 28.3 s (the limit is the documented default: common practice, no published source).
        ShowCue turn = new(1, "look back", 1, 2, Easing.Smooth) { Look = new LookDirection(Math.PI, 0) };
        var timeline = new ShowTimeline(Script(turn));
        Assert.Equal(1 + Math.PI / 2 * 180 / 10, timeline.LookSettledBy(turn), 9);
        double fastest = 0;
        for (int frame = 1; frame <= 40 * 30; frame++)
        {
            Rotation before = timeline.At((frame - 1) / 30.0).Look, after = timeline.At(frame / 30.0).Look;
            fastest = Math.Max(fastest, (before.Inverse * after).Angle * 30);
        }
        Assert.True(fastest <= ShowCautions.DefaultMaxRotationRate * 1.0001, $"fastest turn {fastest * 180 / Math.PI} deg/s");
        // Where the turn ends, forward in camera axes points backward in ship axes.
        Vec3 view = timeline.At(35).Look.Rotate(Vec3.UnitZ);
        Assert.Equal(-1, view.Z, 9);
    }

    [Fact]
    public void A_move_that_interrupts_another_starts_where_the_first_had_reached()
    {
        var timeline = new ShowTimeline(Script(
            new ShowCue(1, "down", 0, 4, Easing.Linear) { Fade = 0 },
            new ShowCue(2, "up", 2, 2, Easing.Linear) { Fade = 1 }));
        Assert.Equal(0.5, timeline.At(2).Fade, 12);
        Assert.Equal(0.75, timeline.At(3).Fade, 12);
        Assert.Equal(1, timeline.At(4).Fade, 12);
    }

    [Fact]
    public void Smooth_easing_is_half_way_at_half_time_and_at_rest_at_both_ends()
    {
        Assert.Equal(0.5, Easing.Smooth.Progress(0.5), 15);
        Assert.Equal(0, Easing.Smooth.Progress(0), 15);
        Assert.Equal(1, Easing.Smooth.Progress(1), 15);
        Assert.True(Easing.Smooth.Progress(0.01) < 0.001);
    }

    [Fact]
    public void Captions_fade_in_and_out()
    {
        var timeline = new ShowTimeline(Script(
            new ShowCue(1, "say", 1, 2, Easing.Linear) { Caption = "Home falls behind" },
            new ShowCue(2, "clear", 10, 2, Easing.Linear) { Caption = "" }));
        Assert.Equal(0, timeline.At(0.5).CaptionOpacity);
        Assert.Equal(("Home falls behind", 0.5), (timeline.At(2).Caption, timeline.At(2).CaptionOpacity));
        Assert.Equal(("Home falls behind", 0.5), (timeline.At(11).Caption, timeline.At(11).CaptionOpacity));
        Assert.Equal("", timeline.At(12.5).Caption);
    }

    [Fact]
    public void Bodies_are_shown_until_a_cue_hides_them_and_the_grid_eases()
    {
        var timeline = new ShowTimeline(Script(
            new ShowCue(1, "grid on", 1, 2, Easing.Linear) { Grid = true },
            new ShowCue(2, "hide", 5, 2, Easing.Linear) { Bodies = false }));
        Assert.Equal(1, timeline.At(0).BodiesOpacity);
        Assert.Equal(0.5, timeline.At(2).GridOpacity, 12);
        Assert.Equal(0.5, timeline.At(6).BodiesOpacity, 12);
        Assert.Equal(0, timeline.At(8).BodiesOpacity);
    }

    [Fact]
    public void The_demo_show_passes_close_by_its_scene_body()
    {
        // The demo's own invented setting: the body is placed on the ship's course, so it must pass within a light-minute.
        ShowScript script = ShowScriptReader.Load(Path.Combine(Repository.Scenarios, "outbound.show.toml"));
        var timeline = new ShowTimeline(script);
        Vec3 body = Assert.Single(script.Scene!.Bodies).Path.EventAtHomeTime(0).Space;
        (double distance, double time) closest = Enumerable.Range(0, 600).Select(i => i / 10.0)
            .Select(t => ((timeline.At(t).Ship.Position.Space - body).Length, t)).Min();
        Assert.True(closest.distance < 60, $"closest {closest.distance} ls at {closest.time} s");
        Assert.InRange(closest.time, 20, 35);
    }

    [Fact]
    public void A_moment_is_the_same_whichever_order_moments_are_asked_for()
    {
        ShowCue[] cues =
        [
            new(1, "compress", 0, 5, Easing.Smooth) { TimeCompression = 1e6 },
            new(2, "go", 1, 20, Easing.Smooth) { Rapidity = 3 },
        ];
        var forward = new ShowTimeline(Script(cues));
        var backward = new ShowTimeline(Script(cues));
        var times = Enumerable.Range(0, 120).Select(i => i / 3.0).ToArray();
        var first = times.Select(t => forward.At(t).Ship).ToArray();
        var second = times.Reverse().Select(t => backward.At(t).Ship).Reverse().ToArray();
        Assert.Equal(first, second);
    }
}
