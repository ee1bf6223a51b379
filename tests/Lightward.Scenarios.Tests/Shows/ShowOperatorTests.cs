using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Tests.Shows;

/// <summary>The live cue list: standby, go, hold and back (stage practice, common practice, no published source).</summary>
public class ShowOperatorTests
{
    private static ShowOperator Operator() => new(new ShowScript("/shows/live.show.toml", "Live", 60, Vec3.UnitX, ShowCautions.Default,
    [
        new ShowCue(1, "preset", 0, 0, Easing.Smooth) { Hold = true },
        new ShowCue(2, "lights", 5, 2, Easing.Smooth),
        new ShowCue(3, "burn", 20, 2, Easing.Smooth) { Hold = true },
        new ShowCue(4, "home", 40, 2, Easing.Smooth),
    ]));

    [Fact]
    public void The_show_waits_at_a_hold_cue_until_go()
    {
        var show = Operator();
        show.Advance(3);
        Assert.Equal(0, show.ShowTime);
        Assert.True(show.WaitingForGo);
        Assert.Equal(1, show.StandbyCue);
        show.Go();
        show.Advance(3);
        Assert.Equal(3, show.ShowTime);
        show.Advance(30);
        Assert.Equal(20, show.ShowTime);
        Assert.True(show.WaitingForGo);
        Assert.Equal(2, show.CurrentCue);
    }

    [Fact]
    public void Go_fires_the_standing_by_cue_now()
    {
        var show = Operator();
        show.Go();
        show.Go();
        Assert.Equal(5, show.ShowTime);
        Assert.Equal(1, show.CurrentCue);
        Assert.Equal(2, show.StandbyCue);
        show.Go();
        Assert.Equal(20, show.ShowTime);
        Assert.False(show.WaitingForGo);
    }

    [Fact]
    public void Hold_stops_the_clock_and_hold_again_resumes()
    {
        var show = Operator();
        show.Go();
        show.Advance(1);
        show.ToggleHold();
        show.Advance(10);
        Assert.Equal(1, show.ShowTime);
        show.ToggleHold();
        show.Advance(1);
        Assert.Equal(2, show.ShowTime);
    }

    [Fact]
    public void Back_returns_to_the_cue_start_then_to_the_cue_before()
    {
        var show = Operator();
        show.Go();
        show.Advance(12);
        show.Back();
        Assert.Equal(5, show.ShowTime);
        Assert.True(show.Held);
        show.Back();
        Assert.Equal(0, show.ShowTime);
        show.Go();
        show.Advance(1);
        Assert.Equal(1, show.ShowTime);
    }
}
