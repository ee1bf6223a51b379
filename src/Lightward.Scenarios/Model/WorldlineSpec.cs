using Lightward.Spacetime;

namespace Lightward.Scenarios.Model;

public enum WorldlineKind { AtRest, Inertial, Accelerating, Orbit }

/// <summary>How a body moves, as written in the scenario; <see cref="Build"/> gives the exact worldline.</summary>
/// <param name="Position">At rest / inertial: place at home time zero. Accelerating: place where it starts from rest. Orbit: centre.</param>
/// <param name="Velocity">Inertial: its velocity.</param>
/// <param name="Direction">Accelerating: direction of the push (home axes). Orbit: the orbit's axis (right-hand rule).</param>
/// <param name="Acceleration">Accelerating: proper acceleration, 1/s.</param>
/// <param name="StartTime">Accelerating: home time at which it starts from rest.</param>
/// <param name="Radius">Orbit: radius, light-seconds.</param>
/// <param name="Period">Orbit: period in home time, s.</param>
/// <param name="Phase">Orbit: angle from the reference direction at home time zero, rad.</param>
public sealed record WorldlineSpec(
    WorldlineKind Kind, Vec3 Position, Velocity Velocity, Vec3 Direction, double Acceleration, double StartTime,
    double Radius, double Period, double Phase)
{
    public static readonly IReadOnlyDictionary<string, WorldlineKind> Names = new Dictionary<string, WorldlineKind>
    {
        ["at_rest"] = WorldlineKind.AtRest,
        ["inertial"] = WorldlineKind.Inertial,
        ["accelerating"] = WorldlineKind.Accelerating,
        ["orbit"] = WorldlineKind.Orbit,
    };

    /// <summary>The exact worldline. An accelerating body follows the whole hyperbola, momentarily at rest at
    /// <see cref="Position"/> at home time <see cref="StartTime"/>.</summary>
    public IWorldline Build() => Kind switch
    {
        WorldlineKind.AtRest => InertialWorldline.AtRest(Position),
        WorldlineKind.Inertial => new InertialWorldline(new FourVector(0, Position), Velocity),
        WorldlineKind.Accelerating => new HyperbolicWorldline(new FourVector(StartTime, Position), Velocity.Rest, Acceleration * Direction),
        _ => CircularWorldline.FromPeriod(Position, Radius, Period, Direction, Phase),
    };
}
