using Lightward.Host.Frames;
using Lightward.Host.Input;
using Lightward.Rendering.Instruments;
using Lightward.Spacetime;

namespace Lightward.Host.Simulation;

/// <summary>
/// A flight in progress: the physics loop, the pilot, and the view state (layout, instruments, look direction).
/// Host-independent: window and headless hosts both drive it one frame at a time.
/// </summary>
public sealed class FlightSession
{
    private static readonly double MaxLookPitch = 89 * Math.PI / 180;
    private readonly FlightSetup _setup;
    private ShipState _beforeFrame;

    public FlightSession(FlightSetup setup, double tickRate = FlightLoop.DefaultTickRate, bool instrumentsOnDome = false)
    {
        _setup = setup;
        Loop = new FlightLoop(setup.Start, tickRate, setup.Flight);
        Pilot = new Pilot(setup.Capabilities, setup.Target);
        InstrumentsOnDome = instrumentsOnDome;
        Trace.Record(setup.Start.Position);
    }

    public FlightSetup Setup => _setup;
    public FlightLoop Loop { get; }
    public Pilot Pilot { get; }
    public WorldlineTrace Trace { get; } = new();
    public ViewMode Mode { get; set; } = ViewMode.Cockpit;
    public bool Instruments { get; set; } = true;
    public bool InstrumentsOnDome { get; }
    public double LookYaw { get; private set; }
    public double LookPitch { get; private set; }
    public bool QuitRequested { get; private set; }

    /// <summary>Applies one frame of input and lets <paramref name="loopSeconds"/> of loop time pass.</summary>
    public void Update(PilotInput input, double loopSeconds)
    {
        for (int i = 0; i < input.Presses(PilotAction.TimeFaster); i++) Loop.ChangeCompression(+1);
        for (int i = 0; i < input.Presses(PilotAction.TimeSlower); i++) Loop.ChangeCompression(-1);
        if (input.Presses(PilotAction.TimeNormal) > 0) Loop.ResetCompression();
        if (input.Presses(PilotAction.Pause) % 2 == 1) Loop.Paused = !Loop.Paused;
        if (input.Presses(PilotAction.ViewCockpit) > 0) Mode = ViewMode.Cockpit;
        if (input.Presses(PilotAction.ViewDome) > 0) Mode = ViewMode.Dome;
        if (input.Presses(PilotAction.ViewPanorama) > 0) Mode = ViewMode.Panorama;
        for (int i = 0; i < input.Presses(PilotAction.ViewNext); i++) Mode = (ViewMode)(((int)Mode + 1) % Enum.GetValues<ViewMode>().Length);
        if (input.Presses(PilotAction.Instruments) % 2 == 1) Instruments = !Instruments;
        if (input.Presses(PilotAction.LookReset) > 0) LookYaw = LookPitch = 0;
        if (input.Presses(PilotAction.Quit) > 0) QuitRequested = true;
        LookYaw = Math.IEEERemainder(LookYaw + input.LookYaw, 2 * Math.PI);
        LookPitch = Math.Clamp(LookPitch + input.LookPitch, -MaxLookPitch, MaxLookPitch);

        Pilot.Read(input, loopSeconds);
        _beforeFrame = Loop.Current;
        if (Loop.Paused)
        {
            for (int i = 0; i < input.Presses(PilotAction.Step); i++) Step();
        }
        else if (Loop.Advance(loopSeconds, Pilot) > 0)
        {
            AfterPhysics();
        }
    }

    private void Step()
    {
        Loop.SingleStep(Pilot);
        AfterPhysics();
    }

    private void AfterPhysics()
    {
        Pilot.UpdatePropellant(Loop.RapiditySpent);
        Trace.Record(Loop.Current.Position);
        if (_setup.Task is { IsDecided: false } task) task.Observe(_beforeFrame, Loop.Current);
        _beforeFrame = Loop.Current;
    }

    /// <summary>Where the pilot looks, in ship axes: yaw about +Y (right positive), then pitch (up positive).</summary>
    public Rotation Look => Rotation.FromAxisAngle(Vec3.UnitY, LookYaw) * Rotation.FromAxisAngle(Vec3.UnitX, -LookPitch);

    /// <summary>The frame to draw now: the interpolated ship (display only) with its readings.</summary>
    public CockpitView View()
    {
        ShipState display = Loop.Display;
        FlightReadings readings = FlightReadings.Of(display, _setup.Target, Pilot.Throttle, Loop.LastControls,
            Pilot.Capabilities.RapidityBudget - Loop.RapiditySpent, TimeCompression.Label(Loop.CompressionLevel), Loop.Paused,
            HoldLabel(Pilot.Hold), _setup.Task?.Status ?? "free flight");
        bool showInstruments = Instruments && (Mode != ViewMode.Dome || InstrumentsOnDome);
        return new CockpitView(display, Look, Mode, showInstruments, readings, Trace);
    }

    private static string HoldLabel(AttitudeHold hold) => hold switch
    {
        AttitudeHold.Prograde => "prograde",
        AttitudeHold.Retrograde => "retrograde",
        AttitudeHold.Target => "on target",
        _ => "manual",
    };
}
