namespace Lightward.Host.Input;

/// <summary>Everything a pilot can ask for with a key or a gamepad button.</summary>
public enum PilotAction
{
    ThrottleUp, ThrottleDown, ThrottleZero, ThrottleFull,
    PitchUp, PitchDown, YawLeft, YawRight, RollLeft, RollRight,
    ShiftLeft, ShiftRight, ShiftUp, ShiftDown, ShiftFore, ShiftAft,
    HoldPrograde, HoldRetrograde, HoldTarget, HoldOff,
    TimeFaster, TimeSlower, TimeNormal, Pause, Step,
    ViewCockpit, ViewDome, ViewPanorama, ViewNext, Instruments, LookReset,
    Quit,
}

/// <summary>Continuous commands a gamepad stick can drive, each −1…1.</summary>
public enum PilotAxis { Pitch, Yaw, Roll, ShiftX, ShiftY, ShiftZ }

/// <summary>The file and display names of actions and axes, and what each does.</summary>
public static class PilotActionNames
{
    private static readonly (PilotAction Action, string Name, string Meaning)[] ActionTable =
    [
        (PilotAction.ThrottleUp, "throttle-up", "raise the main engine throttle while held"),
        (PilotAction.ThrottleDown, "throttle-down", "lower the main engine throttle while held"),
        (PilotAction.ThrottleZero, "throttle-zero", "cut the main engine"),
        (PilotAction.ThrottleFull, "throttle-full", "main engine to full"),
        (PilotAction.PitchUp, "pitch-up", "turn the nose up"),
        (PilotAction.PitchDown, "pitch-down", "turn the nose down"),
        (PilotAction.YawLeft, "yaw-left", "turn the nose left"),
        (PilotAction.YawRight, "yaw-right", "turn the nose right"),
        (PilotAction.RollLeft, "roll-left", "roll anticlockwise about the nose"),
        (PilotAction.RollRight, "roll-right", "roll clockwise about the nose"),
        (PilotAction.ShiftLeft, "shift-left", "side thrusters: push left"),
        (PilotAction.ShiftRight, "shift-right", "side thrusters: push right"),
        (PilotAction.ShiftUp, "shift-up", "side thrusters: push up"),
        (PilotAction.ShiftDown, "shift-down", "side thrusters: push down"),
        (PilotAction.ShiftFore, "shift-fore", "side thrusters: push forward"),
        (PilotAction.ShiftAft, "shift-aft", "side thrusters: push backward"),
        (PilotAction.HoldPrograde, "hold-prograde", "keep the nose on the direction of motion"),
        (PilotAction.HoldRetrograde, "hold-retrograde", "keep the nose against the direction of motion"),
        (PilotAction.HoldTarget, "hold-target", "keep the nose on the target"),
        (PilotAction.HoldOff, "hold-off", "release the attitude hold"),
        (PilotAction.TimeFaster, "time-faster", "ten times more time compression"),
        (PilotAction.TimeSlower, "time-slower", "ten times less time compression"),
        (PilotAction.TimeNormal, "time-normal", "back to real time"),
        (PilotAction.Pause, "pause", "pause or resume the physics"),
        (PilotAction.Step, "step", "advance one physics tick while paused"),
        (PilotAction.ViewCockpit, "view-cockpit", "perspective view through the cockpit"),
        (PilotAction.ViewDome, "view-dome", "fulldome (domemaster) view"),
        (PilotAction.ViewPanorama, "view-panorama", "whole sky (equirectangular) view"),
        (PilotAction.ViewNext, "view-next", "cycle cockpit, dome and panorama views"),
        (PilotAction.Instruments, "instruments", "show or hide the instruments"),
        (PilotAction.LookReset, "look-reset", "look straight ahead again"),
        (PilotAction.Quit, "quit", "end the flight"),
    ];

    private static readonly (PilotAxis Axis, string Name, string Meaning)[] AxisTable =
    [
        (PilotAxis.Pitch, "pitch", "nose up (+) / down (−)"),
        (PilotAxis.Yaw, "yaw", "nose right (+) / left (−)"),
        (PilotAxis.Roll, "roll", "roll clockwise (+) / anticlockwise (−)"),
        (PilotAxis.ShiftX, "shift-x", "side thrusters right (+) / left (−)"),
        (PilotAxis.ShiftY, "shift-y", "side thrusters up (+) / down (−)"),
        (PilotAxis.ShiftZ, "shift-z", "side thrusters forward (+) / backward (−)"),
    ];

    public static string Name(this PilotAction action) => ActionTable[(int)action].Name;
    public static string Meaning(this PilotAction action) => ActionTable[(int)action].Meaning;
    public static string Name(this PilotAxis axis) => AxisTable[(int)axis].Name;
    public static string Meaning(this PilotAxis axis) => AxisTable[(int)axis].Meaning;

    public static IEnumerable<PilotAction> AllActions => ActionTable.Select(entry => entry.Action);
    public static IEnumerable<PilotAxis> AllAxes => AxisTable.Select(entry => entry.Axis);

    public static bool TryParseAction(string name, out PilotAction action) => TryFind(ActionTable.Select(e => (e.Action, e.Name)), name, out action);
    public static bool TryParseAxis(string name, out PilotAxis axis) => TryFind(AxisTable.Select(e => (e.Axis, e.Name)), name, out axis);

    private static bool TryFind<T>(IEnumerable<(T Value, string Name)> table, string name, out T value)
    {
        foreach ((T candidate, string candidateName) in table)
        {
            if (candidateName == name) { value = candidate; return true; }
        }
        value = default!;
        return false;
    }
}
