namespace Lightward.Spacetime;

/// <summary>Engine and attitude commands, both in ship axes, held constant over a step.</summary>
/// <param name="ProperAcceleration">Proper acceleration felt aboard, 1/s (c = 1); 1 g = <see cref="Units.G"/>.</param>
/// <param name="AttitudeRate">Angular velocity of the ship's axes, rad/s of proper time.</param>
public readonly record struct Controls(Vec3 ProperAcceleration, Vec3 AttitudeRate)
{
    public static readonly Controls Coast = new(Vec3.Zero, Vec3.Zero);
}

/// <summary>
/// The ship: where and when it is (home coordinates), its frame (ship axes → home), and its own clock.
/// Ship axes: +Z forward (the main engine pushes along +Z), +X right, +Y up.
/// </summary>
public readonly record struct ShipState(CompensatedEvent Event, LorentzFrame Frame, double ProperTime, double ProperTimeLow = 0)
{
    public static ShipState AtRest(FourVector start) => new(new CompensatedEvent(start), LorentzFrame.Identity, 0);

    public FourVector Position => Event.Value;
    public double HomeTime => Event.High.T + Event.Low.T;
    public Velocity Velocity => Frame.Velocity;
    public double ShipTime => ProperTime + ProperTimeLow;

    /// <summary>The ship's forward axis (+Z) in home-aligned comoving axes.</summary>
    public Vec3 Forward => Frame.AxisInComoving(Vec3.UnitZ);
}
