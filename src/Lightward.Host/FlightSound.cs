using Lightward.Audio;
using Lightward.Host.Frames;
using Lightward.Host.Simulation;
using Lightward.Spacetime;

namespace Lightward.Host;

/// <summary>
/// Keeps the sound scene in step with the flight: the engine tone follows the thrust, each beacon is heard with the
/// Doppler factor and direction of the light (and radio) reaching the ship now, and an alert sounds once when the
/// propellant runs low. With a fixed-clock host it also pulls exactly one frame's worth of samples into a capture.
/// </summary>
public sealed class FlightSound(SoundScene scene, ISoundBlockSink? frameLockedCapture = null) : IFlightListener
{
    /// <summary>Pitch of every beacon's tone in its own rest frame.</summary>
    public const double BeaconPitchHz = 880;
    /// <summary>Fraction of the rapidity budget left at which the low-propellant alert sounds (common practice, no published source).</summary>
    public const double BudgetLowFraction = 0.1;

    private readonly Dictionary<string, bool> _audible = [];
    private bool _budgetAlerted;
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
        if (frameLockedCapture is not null) CaptureFrame(loopSeconds);
    }

    private void UpdateBeacon(Beacon beacon, in ShipState ship)
    {
        LightConeEvent emitted = LightCone.Retarded(ship.Position, beacon.Worldline);
        if (!emitted.IsMet)
        {
            if (_audible.Remove(beacon.Name)) scene.RemoveBeacon(beacon.Name);
            return;
        }
        // k = reception − emission is null; D = (k·u_ship)/(k·u_body), each product read as minus the time
        // component of k in that observer's own frame, which stays exact at high rapidity.
        FourVector k = ship.Position - emitted.Event;
        FourVector inShip = ship.Frame.FromHome(k);
        FourVector inBody = beacon.Worldline.RestFrameAtHomeTime(emitted.Event.T).FromHome(k);
        double doppler = inShip.T / inBody.T;
        if (!(doppler > 0) || !double.IsFinite(doppler)) return;
        scene.SetBeacon(beacon.Name, beacon.RateHz, BeaconPitchHz, doppler, -inShip.Space);
        _audible[beacon.Name] = true;
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
