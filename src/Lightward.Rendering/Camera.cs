using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering;

/// <summary>The image shapes the renderer draws.</summary>
public enum ProjectionKind
{
    /// <summary>A flat screen (pinhole camera) with a horizontal field of view.</summary>
    Perspective,
    /// <summary>A square fulldome master: angular fisheye, zenith at the centre, the front at the bottom edge.</summary>
    Domemaster,
    /// <summary>The full sphere on a 2:1 image, the look direction at the centre.</summary>
    Equirectangular,
}

/// <summary>
/// How bright the image is. Manual: the HDR frame (radiance in units where a V = 0 star on the reference pixel sums
/// to 1) is multiplied by 2^<see cref="Stops"/> before tone mapping. Automatic: the renderer meters the frame and
/// <see cref="Stops"/> is a compensation added to the metered value.
/// </summary>
public readonly record struct Exposure(bool Automatic, double Stops)
{
    public static readonly Exposure Auto = new(true, 0);

    public static Exposure Manual(double stops) => new(false, stops);
}

/// <summary>
/// The virtual camera: image shape and size, field of view (horizontal for perspective, the disc's aperture for a
/// domemaster; the equirectangular image always covers the whole sphere), the dome's forward tilt, and exposure.
/// Scenario files and command-line flags fill this record.
/// </summary>
public sealed record Camera(ProjectionKind Kind, int Width, int Height, double FieldOfView, double DomeTilt, Exposure Exposure)
{
    /// <summary>Largest image side accepted: a 16k dome master.</summary>
    public const int MaximumSide = 16384;

    public Projection CreateProjection() => Kind switch
    {
        ProjectionKind.Perspective => new PerspectiveProjection(Width, Height, FieldOfView),
        ProjectionKind.Domemaster => new DomemasterProjection(Width, FieldOfView),
        _ => new EquirectangularProjection(Width, Height),
    };

    /// <summary>
    /// The rig: camera axes → look axes (+Z the look direction, +Y up). A flat screen and the equirectangular
    /// image face the look direction. The dome's camera +Z is its zenith, which points up (look +Y) and leans
    /// toward the front by the tilt; camera −Y (image down) points at the front, camera +X stays right.
    /// </summary>
    public Rotation Rig => Kind == ProjectionKind.Domemaster
        ? Rotation.FromAxisAngle(Vec3.UnitX, -Math.PI / 2 + DomeTilt)
        : Rotation.Identity;
}

/// <summary>
/// Where the picture is taken from: the ship (event, frame, clock) and where the viewer looks, as the rotation from
/// look axes (+Z the look direction, +Y the viewer's up) to ship axes.
/// </summary>
public readonly record struct Observer(ShipState Ship, Rotation Look)
{
    /// <summary>Camera axes → ship axes for <paramref name="camera"/>.</summary>
    public Rotation CameraToShip(Camera camera) => (Look * camera.Rig).Normalized();
}
