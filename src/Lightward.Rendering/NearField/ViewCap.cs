using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// The smallest cone around the image's central direction that holds every pixel's direction (camera axes), so that
/// triangles and line pieces wholly outside the picture are dropped before any per-pixel work.
/// </summary>
public readonly record struct ViewCap(Vec3 Centre, double Radius)
{
    private readonly double _cosRadius = Math.Cos(Radius), _sinRadius = Math.Sin(Radius);

    /// <summary>
    /// True when a cone around unit <paramref name="direction"/> cannot touch the image; the cone's half-angle θ is
    /// given as <paramref name="halfChord"/> = sin(θ/2), half the chord between unit vectors θ apart, so that the
    /// test needs no trigonometry (it runs for every triangle).
    /// </summary>
    public bool Misses(Vec3 direction, double halfChord)
    {
        // cos θ = 1 − 2h² and sin θ = 2h√(1 − h²); the cones miss when R + θ < π and the angle to the centre exceeds R + θ.
        double cosTheta = 1 - 2 * halfChord * halfChord, sinTheta = 2 * halfChord * Math.Sqrt(Math.Max(0, 1 - halfChord * halfChord));
        return cosTheta > -_cosRadius && Vec3.Dot(Centre, direction) < _cosRadius * cosTheta - _sinRadius * sinTheta;
    }
}
