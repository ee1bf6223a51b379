using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>
/// Relativistic aberration, one direction at a time in double precision: where a source at rest in the home frame
/// appears to an observer moving with a given velocity, and back.
/// <para>
/// Derivation (Einstein 1905, "Zur Elektrodynamik bewegter Körper", §7 "Theorie des Doppler’schen Prinzipes und der Aberration"; any
/// special-relativity textbook): with θ the home-frame angle between the direction of motion n and the direction s
/// toward the source, and θ′ the same angle seen by the moving observer, cos θ′ = (cos θ + β)/(1 + β cos θ), which is
/// equivalent to the half-angle form tan(θ′/2) = e^(−φ) tan(θ/2) (φ the rapidity). Writing t² = tan²(θ/2) =
/// (1 − c)/(1 + c) with c = cos θ and ε = e^(−2φ):
///   cos θ′ = (1 − ε t²)/(1 + ε t²) = ((1+c) − ε(1−c)) / ((1+c) + ε(1−c)),
///   sin θ′ = 2 e^(−φ) t/(1 + ε t²) = 2 e^(−φ) sin θ / ((1+c) + ε(1−c)).
/// The apparent direction keeps the plane of s and n: s′ = cos θ′ n + (sin θ′/sin θ)(s − c n), i.e.
///   s′ = cos θ′ n + [2 e^(−φ) / ((1+c) + ε(1−c))] (s − c n),
/// which needs no trigonometry. 1 + c = |s + n|²/2 and 1 − c = |s − n|²/2 are each computed without cancellation,
/// so the form is exact to rounding at any rapidity: dead ahead stays dead ahead, a source at 90° appears at
/// sin θ′ = 1/γ, and nothing overflows for φ up to a few hundred. The inverse map is the same with −φ.
/// </para>
/// </summary>
public static class Aberration
{
    /// <summary>Apparent direction (unit, comoving axes parallel to the home axes) of a source seen from <paramref name="velocity"/>.</summary>
    public static Vec3 Apparent(Vec3 homeDirection, Velocity velocity) =>
        Shift(homeDirection, velocity.Direction, velocity.Rapidity);

    /// <summary>Apparent direction in the ship's own axes (+Z forward) of a source seen from <paramref name="shipFrame"/>.</summary>
    public static Vec3 ApparentInShipAxes(Vec3 homeDirection, LorentzFrame shipFrame) =>
        shipFrame.Orientation.Inverse.Rotate(Apparent(homeDirection, shipFrame.Velocity));

    /// <summary>The home-frame direction of the source that appears along <paramref name="apparentComoving"/> (comoving axes).</summary>
    public static Vec3 Source(Vec3 apparentComoving, Velocity velocity) =>
        Shift(apparentComoving, velocity.Direction, -velocity.Rapidity);

    /// <summary>The home-frame direction of the source that appears along <paramref name="apparentShip"/> (ship axes).</summary>
    public static Vec3 SourceFromShipAxes(Vec3 apparentShip, LorentzFrame shipFrame) =>
        Source(shipFrame.Orientation.Rotate(apparentShip), shipFrame.Velocity);

    private static Vec3 Shift(Vec3 direction, Vec3 motion, double rapidity) => new MovingObserver(motion, rapidity).Apparent(direction);
}
