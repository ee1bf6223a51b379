using Lightward.Spacetime;

namespace Lightward.Rendering.Instruments;

/// <summary>Where the target is as the ship sees it now: in the ship's rest frame, simultaneous with the ship's clock.</summary>
/// <param name="Distance">Proper distance in the ship's rest frame, light-seconds.</param>
/// <param name="DirectionComoving">Unit direction in the ship's comoving axes (home-aligned).</param>
/// <param name="DirectionShip">Unit direction in ship axes (+Z forward, +X right, +Y up).</param>
/// <param name="RelativeRapidity">Rapidity of the target relative to the ship.</param>
public readonly record struct TargetSighting(double Distance, Vec3 DirectionComoving, Vec3 DirectionShip, double RelativeRapidity)
{
    /// <summary>Angle right of the nose, radians (−π…π].</summary>
    public double Azimuth => Math.Atan2(DirectionShip.X, DirectionShip.Z);
    /// <summary>Angle above the ship's horizontal plane, radians.</summary>
    public double Elevation => Math.Asin(Math.Clamp(DirectionShip.Y, -1, 1));
}

/// <summary>The body the task is about, with its worldline.</summary>
public sealed record TargetTrack(string Name, IWorldline Worldline)
{
    private const int SimultaneityIterations = 40;

    /// <summary>
    /// The target's event that the ship's clock calls "now" (Δt = β·ΔX in home coordinates, a contraction with
    /// factor β_ship·β_target, solved by iteration), measured in the ship's rest frame.
    /// </summary>
    public TargetSighting SeenFrom(in ShipState ship)
    {
        FourVector shipEvent = ship.Position;
        Velocity velocity = ship.Velocity;
        Vec3 shipBeta = velocity.BetaVector;
        FourVector separation = Worldline.EventAtHomeTime(shipEvent.T) - shipEvent;
        for (int i = 0; i < SimultaneityIterations; i++)
        {
            double delay = Vec3.Dot(shipBeta, separation.Space);
            if (Math.Abs(delay - separation.T) <= 1e-12 * (1 + Math.Abs(delay))) break;
            separation = Worldline.EventAtHomeTime(shipEvent.T + delay) - shipEvent;
        }
        Vec3 inShipRest = velocity.BoostFromHome(separation).Space;
        Vec3 comoving = inShipRest.NormalizedOr(ship.Forward);
        FourVector targetVelocity = Worldline.FourVelocityAtHomeTime(shipEvent.T + separation.T);
        double relativeProperSpeed = velocity.BoostFromHome(targetVelocity).Space.Length;
        return new TargetSighting(inShipRest.Length, comoving, ship.Frame.Orientation.Inverse.Rotate(comoving), Math.Asinh(relativeProperSpeed));
    }
}
