using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// The smallest cone around the image's central direction that holds every pixel's direction (camera axes), so that
/// triangles and line pieces wholly outside the picture are dropped before any per-pixel work.
/// </summary>
public readonly record struct ViewCap(Vec3 Centre, double Radius)
{
    private readonly double _cosRadius = Math.Cos(Radius), _sinRadius = Math.Sin(Radius);

    /// <summary>The cap of a cached pixel-direction table: centred on the middle pixel, reaching the farthest pixel.</summary>
    public static ViewCap Of(PixelDirections directions)
    {
        int width = directions.Projection.Width, height = directions.Projection.Height;
        int middle = height / 2 * width + width / 2;
        Vec3 centre = new Vec3(directions.X[middle], directions.Y[middle], directions.Z[middle]).NormalizedOr(Vec3.UnitZ);
        double radius = 0;
        // The farthest pixel lies on the image's border or on the edge of a dome's disc; a stride of 2 misses at most a pixel's angle.
        for (int y = 0; y < height; y += 2)
            for (int x = 0; x < width; x += 2)
            {
                int i = y * width + x;
                if (float.IsNaN(directions.X[i])) continue;
                radius = Math.Max(radius, Vec3.AngleBetween(centre, new Vec3(directions.X[i], directions.Y[i], directions.Z[i])));
            }
        return new ViewCap(centre, Math.Min(Math.PI, radius + 0.01));
    }

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
