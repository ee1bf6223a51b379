using Lightward.Host.Frames;
using Lightward.Host.Input;
using Lightward.Host.Simulation;
using Lightward.Rendering;

namespace Lightward.Host;

/// <summary>When a run ends by itself: after a number of frames or of loop seconds (either, whichever is first).</summary>
public readonly record struct RunLimits(long? Frames = null, double? Seconds = null)
{
    public static readonly RunLimits Unlimited = new();
}

/// <summary>Something that follows the flight frame by frame (sound, recorders).</summary>
public interface IFlightListener
{
    void OnFrame(FlightSession session, CockpitView view, double loopSeconds);
}

/// <summary>
/// The frame loop, identical for every host: read input → update the session (fixed physics ticks inside) →
/// render the interpolated view → present. Reuses one frame buffer for the whole run.
/// </summary>
public sealed class FrameLoop(IFrameHost host, FlightSession session, IFrameRenderer renderer, IFlightListener? listener = null)
{
    private readonly PilotInput _input = new();

    public RgbaImage Frame { get; } = new(host.Width, host.Height);
    public long FramesShown { get; private set; }

    /// <summary>Runs until the limits are reached, the pilot quits, or the host closes.</summary>
    public void Run(RunLimits limits)
    {
        double start = host.Seconds, previous = start;
        while (!host.CloseRequested && !session.QuitRequested)
        {
            if (limits.Frames is long frames && FramesShown >= frames) break;
            double now = host.Seconds;
            if (limits.Seconds is double seconds && now - start >= seconds) break;
            RunFrame(now - previous);
            previous = now;
        }
    }

    /// <summary>One frame: input, simulation, render, present.</summary>
    public void RunFrame(double loopSeconds)
    {
        _input.BeginFrame();
        host.PollInput(_input);
        session.Update(_input, loopSeconds);
        CockpitView view = session.View();
        renderer.Render(view, Frame);
        listener?.OnFrame(session, view, loopSeconds);
        host.Present(Frame.ReadOnlyPixels);
        FramesShown++;
    }
}
