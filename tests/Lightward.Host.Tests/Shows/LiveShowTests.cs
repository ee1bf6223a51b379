using Lightward.Audio;
using Lightward.Host.Input;
using Lightward.Host.Shows;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.NearField;
using Lightward.Scenarios.Shows;
using Lightward.Spacetime;

namespace Lightward.Host.Tests.Shows;

/// <summary>A live show on a headless host: the clock follows the host, the operator's commands act, and sound is opened.</summary>
public class LiveShowTests
{
    private static ShowScript Script() => new("/shows/live.show.toml", "Live", 10, Vec3.UnitX, ShowCautions.Default,
    [
        new ShowCue(1, "burn", 0, 2, Easing.Linear) { TimeCompression = 1e6, Rapidity = 1 },
        new ShowCue(2, "stop here", 0.25, 0, Easing.Linear) { Hold = true },
    ]);

    [Fact]
    public void The_show_clock_follows_the_host_stops_at_a_hold_and_the_engine_sound_is_opened()
    {
        var camera = new Camera(ProjectionKind.Domemaster, 24, 24, Math.PI, 0, Exposure.Auto);
        var live = new LiveShow(Script(), new Scene(StarCatalog.Procedural(500, 3)), new NearFieldLayer([], null),
            new ShowRenderSettings(camera, FrameRate.Named["60"], false, false, Threads: 1));
        var host = new HeadlessHost(24, 24, 60);
        var console = new CountingConsole(40);
        live.Run(host, console, CancellationToken.None);

        // 40 frames at 60 frames/s is 0.67 s of host time, but the hold at 0.25 s stops the show clock there.
        Assert.Equal(40, console.Frames);
        Assert.Equal(0.25, live.Operator.ShowTime, 9);
        Assert.True(live.Operator.WaitingForGo);
        Assert.NotEqual("", live.SoundStatus);
    }

    /// <summary>An operator who watches a number of frames, then ends the show.</summary>
    private sealed class CountingConsole(int framesToWatch) : IOperatorConsole
    {
        public int Frames { get; private set; }
        public OperatorCommand? NextCommand() => Frames >= framesToWatch ? OperatorCommand.End : null;
        public void AddLookDrag(PilotInput input) { }
        public void Show(ShowOperator show, ShowMoment moment, RgbaImage dome, string soundStatus) => Frames++;
    }
}
