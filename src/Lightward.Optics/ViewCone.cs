using Lightward.Spacetime;

namespace Lightward.Optics;

/// <summary>A cone of apparent directions around <paramref name="Axis"/> (unit, ship axes) that a view can show.</summary>
/// <param name="HalfAngle">Radians; π or more is the whole sky.</param>
public readonly record struct ViewCone(Vec3 Axis, double HalfAngle)
{
    public static ViewCone WholeSky => new(Vec3.UnitZ, Math.PI);
}
