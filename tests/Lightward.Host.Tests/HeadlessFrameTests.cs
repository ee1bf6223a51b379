using Lightward.Host.Frames;
using Lightward.Host.Input;
using Lightward.Host.Simulation;
using Lightward.Optics;
using Lightward.Rendering;
using Lightward.Rendering.Instruments;

namespace Lightward.Host.Tests;

public class HeadlessFrameTests
{
    private static readonly Scene SmallSky = new(StarCatalog.Procedural(5000, 7));

    private static (byte[] Frame, FlightSession Session) Fly(ViewMode mode, bool instruments, int frames = 20)
    {
        var session = new FlightSession(FlightSetup.Demo) { Mode = mode, Instruments = instruments };
        var host = new HeadlessHost(320, 180, script: (frame, input) =>
        {
            if (frame == 0) input.AddPress(PilotAction.ThrottleFull);
            input.SetHeld(PilotAction.YawLeft, frame < 10);
        });
        using var overlay = new InstrumentOverlay();
        var renderer = new FrameComposer(new SkyRenderer(SmallSky, new FrameRenderer(), Math.PI / 2), overlay);
        new FrameLoop(host, session, renderer).Run(new RunLimits(Frames: frames));
        return (host.LastFrame, session);
    }

    [Fact]
    public void A_headless_run_is_repeatable_to_the_pixel_and_the_bit()
    {
        var (first, firstSession) = Fly(ViewMode.Cockpit, instruments: true);
        var (second, secondSession) = Fly(ViewMode.Cockpit, instruments: true);
        Assert.Equal(first, second);
        Assert.Equal(FlightLoopTests.StateHash(firstSession.Loop.Current), FlightLoopTests.StateHash(secondSession.Loop.Current));
        Assert.True(firstSession.Loop.Current.Velocity.Rapidity > 0);
    }

    [Fact]
    public void The_instruments_draw_over_the_sky_and_can_be_switched_off()
    {
        var (withInstruments, _) = Fly(ViewMode.Cockpit, instruments: true);
        var (sky, _) = Fly(ViewMode.Cockpit, instruments: false);
        Assert.True(CountDifferent(withInstruments, sky) > 2000);
    }

    [Fact]
    public void Dome_view_is_a_centred_square_with_black_sides_and_no_instruments_by_default()
    {
        var (dome, session) = Fly(ViewMode.Dome, instruments: true);
        Assert.False(session.View().ShowInstruments);
        // 320×180 frame: the 180×180 dome master sits in columns 70…249; the columns outside are black.
        for (int y = 0; y < 180; y++)
        {
            Assert.Equal(0, dome[(y * 320 + 10) * 4]);
            Assert.Equal(0, dome[(y * 320 + 300) * 4 + 1]);
        }
        Assert.True(CountDifferent(dome, new byte[dome.Length]) > 100);
    }

    private static int CountDifferent(byte[] a, byte[] b)
    {
        int count = 0;
        for (int i = 0; i < a.Length; i += 4)
            if (a[i] != b[i] || a[i + 1] != b[i + 1] || a[i + 2] != b[i + 2]) count++;
        return count;
    }
}
