using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>
/// The grid of space: straight lines along the three axes of an inertial frame, through every lattice point
/// (multiples of <see cref="Spacing"/>), shown within <see cref="Extent"/> of the camera in that frame and fading out
/// over the outer part of that sphere so lines never pop in or out. The lines are at rest in the frame whose origin
/// event is <see cref="Origin"/> and whose axes map to home by <see cref="Frame"/> (the home frame by default; a
/// body's rest frame as an option). They take the hue of a blackbody of <see cref="Temperature"/> seen with the
/// Doppler factor of their direction, so a camera moving through the lattice sees them bluer and brighter ahead and
/// redder and fainter behind; their brightness is set relative to the display (<see cref="LineShader"/>), since a
/// guide drawn on the picture has no radiance to expose for.
/// </summary>
/// <param name="Spacing">Distance between neighbouring parallel lines, light-seconds.</param>
/// <param name="Extent">Radius around the camera within which lines are drawn, light-seconds.</param>
/// <param name="Brightness">Exposed (display-linear, before the tone curve) luminance of a line at D = 1; 1 shows at about half of display white.</param>
public sealed record SpaceGrid(double Spacing, double Extent, FourVector Origin, LorentzFrame Frame, double Temperature = 6500, double Brightness = 0.25)
{
    /// <summary>Lines are drawn out to at most this many spacings from the camera, whatever the extent (bounds the line count and the frame time).</summary>
    public const int MaxLinesPerSide = 10;

    /// <summary>The radius actually drawn: the extent, or <see cref="MaxLinesPerSide"/> spacings if that is less.</summary>
    public double DrawnRadius => Math.Min(Extent, MaxLinesPerSide * Spacing);

    /// <summary>A grid at rest in the home frame.</summary>
    public static SpaceGrid AtRestInHome(double spacing, double extent) => new(spacing, extent, new FourVector(0, 0, 0, 0), LorentzFrame.Identity);

    /// <summary>
    /// Replaces the contents of <paramref name="lines"/> with the pieces of lattice lines inside the extent sphere
    /// around <paramref name="camera"/> (a position in the grid's frame), each as its two ends on that sphere. A list
    /// the caller keeps, so that a steady stream of frames does not allocate.
    /// </summary>
    public void LinesAround(Vec3 camera, List<(Vec3 From, Vec3 To)> lines)
    {
        lines.Clear();
        double radius = DrawnRadius;
        int reach = (int)Math.Ceiling(radius / Spacing);
        for (int axis = 0; axis < 3; axis++)
        {
            Vec3 along = axis == 0 ? Vec3.UnitX : axis == 1 ? Vec3.UnitY : Vec3.UnitZ;
            Vec3 first = axis == 0 ? Vec3.UnitY : Vec3.UnitX, second = axis == 2 ? Vec3.UnitY : Vec3.UnitZ;
            long baseI = (long)Math.Round(Vec3.Dot(camera, first) / Spacing), baseJ = (long)Math.Round(Vec3.Dot(camera, second) / Spacing);
            for (long i = baseI - reach; i <= baseI + reach; i++)
                for (long j = baseJ - reach; j <= baseJ + reach; j++)
                {
                    // The line's point nearest the camera, and the half-chord of the extent sphere it runs through.
                    Vec3 foot = i * Spacing * first + j * Spacing * second + Vec3.Dot(camera, along) * along;
                    double offAxis = (foot - camera).LengthSquared;
                    double halfChord = radius * radius - offAxis;
                    if (halfChord <= 0) continue;
                    halfChord = Math.Sqrt(halfChord);
                    lines.Add((foot - halfChord * along, foot + halfChord * along));
                }
        }
    }

    /// <summary>Brightness fraction of a line point at <paramref name="distance"/> from the camera: 1 inside, 0 at the extent.</summary>
    public double Fade(double distance)
    {
        // Smoothstep over the outer third of the extent sphere.
        double radius = DrawnRadius;
        double x = Math.Clamp((radius - distance) / (radius / 3), 0, 1);
        return x * x * (3 - 2 * x);
    }
}
