using Lightward.Host.Input;
using Lightward.Rendering.Instruments;
using Lightward.Spacetime;

namespace Lightward.Host.Simulation;

public enum AttitudeHold { Off, Prograde, Retrograde, Target }

/// <summary>
/// Turns pilot input into ship controls: a throttle that ramps while its keys are held, side thrusters, attitude
/// rates, and the attitude holds that keep the nose on the direction of motion, against it, or on the target.
/// </summary>
public sealed class Pilot(ShipCapabilities capabilities, TargetTrack? target) : IControlSource
{
    /// <summary>Throttle change per second of loop time while a throttle key is held.</summary>
    public const double ThrottleRampPerSecond = 0.5;

    private Vec3 _translation, _attitude;

    public ShipCapabilities Capabilities { get; } = capabilities;
    public TargetTrack? Target { get; } = target;
    public double Throttle { get; private set; }
    public AttitudeHold Hold { get; private set; }
    /// <summary>True once the propellant is spent; the engine and thrusters no longer push.</summary>
    public bool OutOfPropellant { get; private set; }

    /// <summary>Reads one frame of input lasting <paramref name="loopSeconds"/>.</summary>
    public void Read(PilotInput input, double loopSeconds)
    {
        if (input.Presses(PilotAction.ThrottleZero) > 0) Throttle = 0;
        if (input.Presses(PilotAction.ThrottleFull) > 0) Throttle = 1;
        double ramp = (Active(input, PilotAction.ThrottleUp) ? 1 : 0) - (Active(input, PilotAction.ThrottleDown) ? 1 : 0);
        // A tap shorter than a frame still moves the throttle by one frame's worth.
        Throttle = Math.Clamp(Throttle + ramp * ThrottleRampPerSecond * Math.Max(loopSeconds, 1.0 / 60), 0, 1);

        _translation = new Vec3(
            Combine(input, PilotAction.ShiftRight, PilotAction.ShiftLeft, PilotAxis.ShiftX),
            Combine(input, PilotAction.ShiftUp, PilotAction.ShiftDown, PilotAxis.ShiftY),
            Combine(input, PilotAction.ShiftFore, PilotAction.ShiftAft, PilotAxis.ShiftZ));
        // Ship axes +X right, +Y up, +Z forward (right-hand rule): a turn about +X tips the nose down, about +Y
        // swings it right, about +Z lifts the right side (roll anticlockwise).
        _attitude = new Vec3(
            -Combine(input, PilotAction.PitchUp, PilotAction.PitchDown, PilotAxis.Pitch),
            Combine(input, PilotAction.YawRight, PilotAction.YawLeft, PilotAxis.Yaw),
            -Combine(input, PilotAction.RollRight, PilotAction.RollLeft, PilotAxis.Roll));

        if (input.Presses(PilotAction.HoldPrograde) > 0) Hold = Toggle(AttitudeHold.Prograde);
        if (input.Presses(PilotAction.HoldRetrograde) > 0) Hold = Toggle(AttitudeHold.Retrograde);
        if (input.Presses(PilotAction.HoldTarget) > 0 && Target is not null) Hold = Toggle(AttitudeHold.Target);
        if (input.Presses(PilotAction.HoldOff) > 0) Hold = AttitudeHold.Off;
        // Turning by hand releases any hold, as a pilot would expect.
        if (_attitude != Vec3.Zero) Hold = AttitudeHold.Off;
    }

    /// <summary>Marks the propellant as spent (the loop tracks ∫|a| dτ against the budget).</summary>
    public void UpdatePropellant(double rapiditySpent) => OutOfPropellant = rapiditySpent >= Capabilities.RapidityBudget;

    public Controls ControlsFor(in ShipState ship, double properStep, double compression)
    {
        Vec3 acceleration = OutOfPropellant
            ? Vec3.Zero
            : new Vec3(0, 0, Throttle * Capabilities.MainEngineAcceleration) + Capabilities.ThrusterAcceleration * _translation;
        // Turn rates are per loop second so the view turns at the same pace on screen at any compression.
        double maxRate = Capabilities.AttitudeRate / compression;
        Vec3 rate = Hold == AttitudeHold.Off ? maxRate * _attitude : HoldRate(ship, properStep, maxRate);
        return new Controls(acceleration, rate);
    }

    private Vec3 HoldRate(in ShipState ship, double properStep, double maxRate)
    {
        Vec3? wanted = Hold switch
        {
            AttitudeHold.Prograde => ship.Velocity.Rapidity > 0 ? ship.Velocity.Direction : null,
            AttitudeHold.Retrograde => ship.Velocity.Rapidity > 0 ? -ship.Velocity.Direction : null,
            _ => Target?.SeenFrom(ship).DirectionComoving,
        };
        if (wanted is not Vec3 direction) return Vec3.Zero;
        Vec3 forward = ship.Forward;
        double angle = Vec3.AngleBetween(forward, direction);
        if (angle < 1e-12) return Vec3.Zero;
        Vec3 axis = Vec3.Cross(forward, direction).NormalizedOr(forward.AnyPerpendicular());
        // Turn as fast as allowed but no further than the remaining angle in this tick.
        double rate = Math.Min(maxRate, angle / properStep);
        return ship.Frame.Orientation.Inverse.Rotate(rate * axis);
    }

    private AttitudeHold Toggle(AttitudeHold hold) => Hold == hold ? AttitudeHold.Off : hold;

    private static bool Active(PilotInput input, PilotAction action) => input.IsHeld(action) || input.Presses(action) > 0;

    private static double Combine(PilotInput input, PilotAction positive, PilotAction negative, PilotAxis axis) =>
        Math.Clamp((Active(input, positive) ? 1 : 0) - (Active(input, negative) ? 1 : 0) + input.Axis(axis), -1, 1);
}
