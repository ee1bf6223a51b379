using Lightward.Audio;
using Lightward.Host.Frames;
using Lightward.Host.Simulation;
using Lightward.Spacetime;

namespace Lightward.Host;

/// <summary>
/// Keeps the sound scene in step with the flight: the engine tone follows the thrust, each beacon is heard with the
/// Doppler factor and direction of the light (and radio) reaching the ship now, and alerts sound when the propellant
/// runs low, when a time limit is close and when the task is decided. With a fixed-clock host it also pulls exactly
/// one frame's worth of samples into a capture.
/// </summary>
public sealed class FlightSound(SoundScene scene, ISoundBlockSink? frameLockedCapture = null) : IFlightListener
{
    /// <summary>Pitch of every beacon's tone in its own rest frame.</summary>
    public const double BeaconPitchHz = 880;
    /// <summary>Fraction of the rapidity budget left at which the low-propellant alert sounds (common practice, no published source).</summary>
    public const double BudgetLowFraction = 0.1;

    private readonly Dictionary<string, bool> _audible = [];
    private bool _budgetAlerted, _verdictSounded;
    private double _capturedSeconds;
    private long _capturedFrames;
    private float[] _block = [];

    public void OnFrame(FlightSession session, CockpitView view, double loopSeconds)
    {
        double maxAcceleration = session.Pilot.Capabilities.MainEngineAcceleration;
        scene.SetEngine(maxAcceleration > 0 ? view.Readings.ProperAcceleration / maxAcceleration : 0);
        foreach (Beacon beacon in session.Setup.Beacons) UpdateBeacon(beacon, view.Ship);
        double budget = session.Pilot.Capabilities.RapidityBudget;
        if (!_budgetAlerted && budget > 0 && view.Readings.RapidityLeft < BudgetLowFraction * budget)
        {
            scene.RaiseAlert(AlertKind.BudgetLow);
            _budgetAlerted = true;
        }
        if (session.Setup.Task is { } task) SoundTask(task);
        if (frameLockedCapture is not null) CaptureFrame(loopSeconds);
    }

    /// <summary>Time-short repeats while it lasts (the voice ignores a raise while sounding); the verdict sounds once.</summary>
    private void SoundTask(ITaskWatch task)
    {
        if (task.TimeShort) scene.RaiseAlert(AlertKind.TimeShort);
        if (!task.IsDecided || _verdictSounded) return;
        scene.RaiseAlert(task.Succeeded ? AlertKind.TaskDone : AlertKind.LimitBroken);
        _verdictSounded = true;
    }

    private void UpdateBeacon(Beacon beacon, in ShipState ship)
    {
        if (Heard(beacon.Worldline, ship) is not var (doppler, direction))
        {
            if (_audible.Remove(beacon.Name)) scene.RemoveBeacon(beacon.Name);
            return;
        }
        scene.SetBeacon(beacon.Name, beacon.RateHz, BeaconPitchHz, doppler, direction);
        _audible[beacon.Name] = true;
    }

    /// <summary>
    /// The Doppler factor and ship-axes direction of the signal from <paramref name="source"/> reaching the ship now,
    /// or null when none has arrived yet. k = reception − emission is null; D = (k·u_ship)/(k·u_source), each product
    /// read as minus the time component of k in that observer's own frame, which stays exact at high rapidity.
    /// </summary>
    internal static (double Doppler, Vec3 Direction)? Heard(IWorldline source, in ShipState ship)
    {
        LightConeEvent emitted = LightCone.Retarded(ship.Position, source);
        if (!emitted.IsMet) return null;
        FourVector k = ship.Position - emitted.Event;
        FourVector inShip = ship.Frame.FromHome(k);
        FourVector inSource = source.RestFrameAtHomeTime(emitted.Event.T).FromHome(k);
        double doppler = inShip.T / inSource.T;
        return doppler > 0 && double.IsFinite(doppler) ? (doppler, -inShip.Space) : null;
    }

    private void CaptureFrame(double loopSeconds)
    {
        // Round the running total, not each frame, so sample counts never drift from the loop clock.
        _capturedSeconds += loopSeconds;
        int frames = (int)(Math.Round(_capturedSeconds * scene.SampleRate) - _capturedFrames);
        if (frames <= 0) return;
        _capturedFrames += frames;
        int length = frames * scene.Channels;
        if (_block.Length < length) _block = new float[length];
        scene.Render(_block.AsSpan(0, length));
        frameLockedCapture!.Write(_block.AsSpan(0, length));
    }
}
