using Lightward.Spacetime;

namespace Lightward.Host.Simulation;

/// <summary>What the ship can do: engine and thruster strength, turn rate, and how much rapidity its propellant buys.</summary>
/// <param name="MainEngineAcceleration">Proper acceleration at full throttle, 1/s (c = 1).</param>
/// <param name="ThrusterAcceleration">Proper acceleration of each translation thruster, 1/s.</param>
/// <param name="AttitudeRate">Turn rate at full attitude command, rad/s of proper time at ×1 compression.</param>
/// <param name="RapidityBudget">Total ∫|a| dτ the propellant allows; for straight-line burns this is the rapidity change.</param>
public sealed record ShipCapabilities(double MainEngineAcceleration, double ThrusterAcceleration, double AttitudeRate, double RapidityBudget)
{
    /// <summary>A demo ship: 1 g main engine, 0.05 g thrusters, 30°/s turns, enough propellant for rapidity 6.</summary>
    public static readonly ShipCapabilities Demo = new(Units.G, 0.05 * Units.G, 30 * Math.PI / 180, 6);
}
