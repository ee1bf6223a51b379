using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>
/// The apparent directions a view can show: a cone around <paramref name="Axis"/> (unit, ship axes), narrowed by the
/// planes through the observer in <paramref name="EdgePlanes"/> when it has any — a flat screen's four edges cut a
/// pyramid out of its enclosing cone, about two thirds of it for a 16:9 screen.
/// </summary>
/// <param name="HalfAngle">Radians; π or more is the whole sky.</param>
/// <param name="EdgePlanes">Inward unit normals (ship axes): a direction d can show only where d · n ≥ 0 for each; empty for none.</param>
public readonly record struct ViewCone(Vec3 Axis, double HalfAngle, ReadOnlyMemory<Vec3> EdgePlanes = default)
{
    public static ViewCone WholeSky => new(Vec3.UnitZ, Math.PI);
}
