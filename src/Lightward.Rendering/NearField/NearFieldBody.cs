using Lightward.Spacetime;

namespace Lightward.Rendering.NearField;

/// <summary>How a body's surface gives off light, in its own rest frame.</summary>
public enum SurfaceKind
{
    /// <summary>Every face glows with the same luminance, as a blackbody of <see cref="BodySurface.Temperature"/>.</summary>
    Glowing,
    /// <summary>Faces reflect (Lambert) a distant light whose spectrum is a blackbody of <see cref="BodySurface.Temperature"/>.</summary>
    Lit,
}

/// <summary>
/// A body's surface light in its rest frame. Glowing: each face has luminance <see cref="Luminance"/>; lit: a face
/// turned squarely toward the light has luminance <see cref="Luminance"/> (albedo × illuminance / π) and others
/// follow the cosine of the incidence angle. Either way the spectrum is a blackbody's at <see cref="Temperature"/>, so
/// a camera with Doppler factor D sees a blackbody at D·T (I_ν/ν³ is invariant).
/// </summary>
/// <param name="Temperature">Colour temperature of the emitted or reflected light, K.</param>
/// <param name="Luminance">Rest-frame luminance, cd/m².</param>
/// <param name="TowardLight">Unit direction toward the light, body axes (used when lit).</param>
public sealed record BodySurface(SurfaceKind Kind, double Temperature, double Luminance, Vec3 TowardLight)
{
    /// <summary>A surface glowing at its own blackbody luminance for <paramref name="temperature"/>.</summary>
    public static BodySurface Blackbody(double temperature) =>
        new(SurfaceKind.Glowing, temperature, Math.Exp(Optics.BlackbodyColor.LogLuminance(temperature)), Vec3.UnitZ);
}

/// <summary>
/// A body of the near field: a mesh fixed in the body's own axes, carried rigidly along its worldline. When
/// <see cref="CarriesClock"/> is set, the body shows its own clock to the camera: the worldline's proper time plus
/// <see cref="ClockOffset"/>.
/// </summary>
public sealed record NearFieldBody(string Name, TriangleMesh Mesh, IWorldline Worldline, BodySurface Surface, bool CarriesClock = false, double ClockOffset = 0);
