using System.Globalization;
using Lightward.Rendering;
using Lightward.Spacetime;

namespace Lightward.Cli.Commands;

/// <summary>Turns the camera flags (projection, size, field of view, tilt, exposure, look) into a <see cref="Camera"/> and a look rotation.</summary>
public static class ViewCamera
{
    public static Camera FromFlags(string? projection, string? size, string? fieldOfView, string? tilt, string? exposure)
    {
        ProjectionKind kind = (projection ?? "perspective").Trim().ToLowerInvariant() switch
        {
            "perspective" => ProjectionKind.Perspective,
            "dome" => ProjectionKind.Domemaster,
            "equirect" => ProjectionKind.Equirectangular,
            _ => throw new UserInputException($"--projection: unknown projection '{projection}'; expected perspective, dome or equirect"),
        };
        (int width, int height) = size is null ? DefaultSize(kind) : ParseSize(size);
        if (kind == ProjectionKind.Domemaster && width != height)
            throw new UserInputException($"--size: a dome master is square, but {size} is not; give e.g. 4096x4096");
        if (kind == ProjectionKind.Equirectangular && width != 2 * height)
            throw new UserInputException($"--size: an equirectangular image is twice as wide as high, but {size} is not; give e.g. 4096x2048");
        if (tilt is not null && kind != ProjectionKind.Domemaster)
            throw new UserInputException("--tilt applies to --projection dome only");
        if (fieldOfView is not null && kind == ProjectionKind.Equirectangular)
            throw new UserInputException("--fov does not apply to --projection equirect (it always shows the whole sphere)");

        double field = kind == ProjectionKind.Domemaster ? 180 : 90;
        if (fieldOfView is not null)
        {
            field = ViewParsing.Degrees(fieldOfView, "--fov");
            bool allowed = kind == ProjectionKind.Domemaster ? field > 0 && field <= 360 : field > 0 && field < 180;
            if (!allowed)
                throw new UserInputException(kind == ProjectionKind.Domemaster
                    ? $"--fov: the dome aperture must be above 0 and at most 360 degrees, not {fieldOfView}"
                    : $"--fov: the field of view must be above 0 and below 180 degrees, not {fieldOfView}");
        }
        double tiltDegrees = tilt is null ? 0 : ViewParsing.Degrees(tilt, "--tilt");
        if (tiltDegrees < 0 || tiltDegrees > 90) throw new UserInputException($"--tilt: {tilt} is outside 0 to 90 degrees");
        return new Camera(kind, width, height, field * Math.PI / 180, tiltDegrees * Math.PI / 180, ParseExposure(exposure));
    }

    /// <summary>forward, aft, left, right, up, down or 'azimuth,elevation' in degrees → look axes → ship axes.</summary>
    public static Rotation ParseLook(string? text)
    {
        (double azimuth, double elevation) = (text ?? "forward").Trim().ToLowerInvariant() switch
        {
            "forward" => (0.0, 0.0),
            "aft" => (180.0, 0.0),
            "right" => (90.0, 0.0),
            "left" => (-90.0, 0.0),
            "up" => (0.0, 90.0),
            "down" => (0.0, -90.0),
            _ => ViewParsing.TryAnglePair(text!, "--look", out double a, out double e)
                ? (a, e)
                : throw new UserInputException($"--look: '{text}' is not forward, aft, left, right, up, down or 'azimuth,elevation' in degrees"),
        };
        if (Math.Abs(elevation) > 90) throw new UserInputException($"--look: elevation {elevation.ToString(CultureInfo.InvariantCulture)} is outside -90…90 degrees");
        // Turn right by the azimuth about the ship's up axis, then raise the view by the elevation.
        return (Rotation.FromAxisAngle(Vec3.UnitY, azimuth * Math.PI / 180) * Rotation.FromAxisAngle(Vec3.UnitX, -elevation * Math.PI / 180)).Normalized();
    }

    private static Exposure ParseExposure(string? text)
    {
        string trimmed = (text ?? "auto").Trim().ToLowerInvariant();
        if (trimmed == "auto") return Exposure.Auto;
        bool automatic = trimmed.StartsWith("auto", StringComparison.Ordinal);
        string number = automatic ? trimmed[4..] : trimmed;
        if (double.TryParse(number, NumberStyles.Float, CultureInfo.InvariantCulture, out double stops) && double.IsFinite(stops) && Math.Abs(stops) <= 40)
            return new Exposure(automatic, stops);
        throw new UserInputException($"--exposure: '{text}' is not auto, auto+N, auto-N or a number of stops from -40 to 40");
    }

    private static (int Width, int Height) DefaultSize(ProjectionKind kind) => kind switch
    {
        ProjectionKind.Domemaster => (2048, 2048),
        ProjectionKind.Equirectangular => (4096, 2048),
        _ => (1920, 1080),
    };

    private static (int Width, int Height) ParseSize(string text)
    {
        string[] parts = text.Trim().ToLowerInvariant().Split('x');
        if (parts.Length == 2
            && int.TryParse(parts[0], NumberStyles.None, CultureInfo.InvariantCulture, out int width)
            && int.TryParse(parts[1], NumberStyles.None, CultureInfo.InvariantCulture, out int height))
        {
            if (width < 1 || height < 1 || width > Camera.MaximumSide || height > Camera.MaximumSide)
                throw new UserInputException($"--size: {text} is out of range; each side must be 1 to {Camera.MaximumSide} pixels");
            return (width, height);
        }
        throw new UserInputException($"--size: '{text}' is not WIDTHxHEIGHT in whole pixels (e.g. 1920x1080)");
    }
}
