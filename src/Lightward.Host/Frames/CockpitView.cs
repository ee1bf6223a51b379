using Lightward.Rendering;
using Lightward.Rendering.Instruments;
using Lightward.Spacetime;

namespace Lightward.Host.Frames;

/// <summary>How the sky is laid out on the frame.</summary>
public enum ViewMode
{
    /// <summary>Perspective view through the cockpit, along the look direction.</summary>
    Cockpit,
    /// <summary>Fulldome domemaster: the hemisphere ahead as an azimuthal equidistant disc.</summary>
    Dome,
    /// <summary>The whole sky as an equirectangular panorama.</summary>
    Panorama,
}

/// <summary>
/// One frame's worth of plain data handed to the renderer: the displayed (interpolated) ship, where the pilot looks
/// relative to the ship's axes, the view layout, and the instrument readings.
/// </summary>
public sealed record CockpitView(ShipState Ship, Rotation Look, ViewMode Mode, bool ShowInstruments, FlightReadings Readings, WorldlineTrace Trace);

/// <summary>Draws a view into a frame (RGBA8, top row first), filling all of it.</summary>
public interface IFrameRenderer
{
    void Render(CockpitView view, RgbaImage frame);
}
