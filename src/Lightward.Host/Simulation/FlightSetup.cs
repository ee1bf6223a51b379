using Lightward.Rendering.Instruments;
using Lightward.Scenarios.Flights;
using Lightward.Spacetime;

namespace Lightward.Host.Simulation;

/// <summary>A body that sends radio pulses the ship can hear.</summary>
/// <param name="RateHz">Pulse rate in the body's own time.</param>
public sealed record Beacon(string Name, IWorldline Worldline, double RateHz);

/// <summary>Judges the task while flying; the status line shows on the instruments.</summary>
public interface ITaskWatch
{
    string Status { get; }
    /// <summary>True once the task has succeeded or failed.</summary>
    bool IsDecided { get; }
    /// <summary>True once it succeeded; false while flying or after a failure.</summary>
    bool Succeeded { get; }
    /// <summary>True while a time limit is close (less than a tenth of it left) and the task is still open.</summary>
    bool TimeShort { get; }
    /// <summary>Looks at the motion from <paramref name="before"/> to <paramref name="after"/> (one frame's worth of ticks).</summary>
    void Observe(in ShipState before, in ShipState after);
}

/// <summary>
/// What a flight starts from: the ship, its abilities, the target, beacons, and how the task is judged; for a scenario,
/// also the judged (and possibly recorded) <see cref="Flight"/> the physics steps through.
/// </summary>
public sealed record FlightSetup(
    string Name, ShipState Start, ShipCapabilities Capabilities, TargetTrack? Target, IReadOnlyList<Beacon> Beacons, ITaskWatch? Task,
    Flight? Flight = null)
{
    /// <summary>
    /// The built-in demo: at rest at home, free flight, nose toward RA 0° Dec 0° (home +X) with the ship's up axis
    /// on the north celestial pole (home +Z), so the sky looks as on a star chart.
    /// </summary>
    public static FlightSetup Demo
    {
        get
        {
            // Columns: ship +X (right) = home +Y, ship +Y (up) = home +Z, ship +Z (forward) = home +X.
            Rotation attitude = Rotation.FromMatrix(new double[,] { { 0, 0, 1 }, { 1, 0, 0 }, { 0, 1, 0 } });
            var start = new ShipState(new CompensatedEvent(new FourVector(0, 0, 0, 0)), new LorentzFrame(Velocity.Rest, attitude), 0);
            return new("demo", start, ShipCapabilities.Demo, null, [], null);
        }
    }
}
