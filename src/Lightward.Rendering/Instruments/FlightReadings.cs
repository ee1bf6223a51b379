using Lightward.Spacetime;

namespace Lightward.Rendering.Instruments;

/// <summary>Everything the instruments show for one frame, computed from the displayed ship state.</summary>
public sealed record FlightReadings(
    ShipState Ship,
    TargetTrack? Target,
    TargetSighting? Sighting,
    double Throttle,
    double ProperAcceleration,
    double RapidityLeft,
    string Compression,
    bool Paused,
    string Hold,
    string TaskStatus)
{
    public double Rapidity => Ship.Velocity.Rapidity;
    public double Gamma => Ship.Velocity.Gamma;
    public double Beta => Ship.Velocity.Beta;
    public double OneMinusBeta => Ship.Velocity.OneMinusBeta;
    /// <summary>Doppler factor of light arriving from dead ahead along the motion: e^φ.</summary>
    public double DopplerAhead => Math.Exp(Rapidity);
    /// <summary>Doppler factor of light arriving from dead astern along the motion: e^−φ.</summary>
    public double DopplerBehind => Math.Exp(-Rapidity);

    public static FlightReadings Of(in ShipState ship, TargetTrack? target, double throttle, Controls controls, double rapidityLeft,
        string compression, bool paused, string hold, string taskStatus) =>
        new(ship, target, target?.SeenFrom(ship), throttle, controls.ProperAcceleration.Length, rapidityLeft, compression, paused, hold, taskStatus);
}
