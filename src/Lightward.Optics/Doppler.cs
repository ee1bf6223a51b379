using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>
/// The Doppler factor D = ν_observed / ν_emitted for a source at rest in the home frame seen by a moving observer.
/// <para>
/// With θ the home-frame angle from the direction of motion n to the source s (Einstein 1905, "Zur Elektrodynamik bewegter Körper", §7):
/// D = γ(1 + β cos θ) = cosh φ + sinh φ cos θ = e^(−φ) + sinh φ (1 + cos θ). In terms of the
/// apparent angle θ′: D = 1/(γ(1 − β cos θ′)) = 1/(e^(−φ) + sinh φ (1 − cos θ′)). Both forms add positive terms only,
/// with 1 ± cos computed as |s ± n|²/2, so D is exact to rounding from e^(−φ) (dead astern) to e^φ (dead ahead).
/// </para>
/// </summary>
public static class Doppler
{
    /// <summary>D for a source in home-frame direction <paramref name="homeDirection"/>.</summary>
    public static double Factor(Vec3 homeDirection, Velocity velocity) => new MovingObserver(velocity).Doppler(homeDirection);

    /// <summary>D for light arriving from apparent direction <paramref name="apparentComoving"/> (comoving axes).</summary>
    public static double FactorFromApparent(Vec3 apparentComoving, Velocity velocity)
    {
        Vec3 s = apparentComoving.NormalizedOr(velocity.Direction);
        double oneMinusCos = (s - velocity.Direction).LengthSquared / 2;
        return 1 / (Math.Exp(-velocity.Rapidity) + Math.Sinh(velocity.Rapidity) * oneMinusCos);
    }

    /// <summary>D for light arriving from apparent direction <paramref name="apparentShip"/> in the ship's own axes.</summary>
    public static double FactorFromShipAxes(Vec3 apparentShip, LorentzFrame shipFrame) =>
        FactorFromApparent(shipFrame.Orientation.Rotate(apparentShip), shipFrame.Velocity);
}
