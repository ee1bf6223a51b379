using Lightward.Rendering;
using Lightward.Rendering.Instruments;

namespace Lightward.Host.Frames;

/// <summary>The sky, then the instruments on top when the view asks for them.</summary>
public sealed class FrameComposer(IFrameRenderer sky, InstrumentOverlay? instruments) : IFrameRenderer
{
    public void Render(CockpitView view, RgbaImage frame)
    {
        sky.Render(view, frame);
        if (view.ShowInstruments && instruments is not null) instruments.Draw(frame.Pixels, frame.Width, frame.Height, view.Readings, view.Trace);
    }
}
