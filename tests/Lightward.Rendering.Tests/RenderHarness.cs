using Lightward.Optics;
using Lightward.Spacetime;

namespace Lightward.Rendering.Tests;

/// <summary>Small skies, observers and image measurements shared by the rendering tests.</summary>
internal static class RenderHarness
{
    /// <summary>A sky of one star toward <paramref name="direction"/> (home axes = ship axes for a ship at rest with no rotation).</summary>
    public static Scene OneStar(Vec3 direction, double magnitude = 0, double temperature = 6500)
    {
        Vec3 d = direction.NormalizedOr(Vec3.UnitZ);
        var sky = new StarCatalog([(float)d.X], [(float)d.Y], [(float)d.Z], [(float)magnitude], [(float)temperature]);
        return new Scene(sky, ShowCosmicBackground: false);
    }

    public static Observer AtRest(Rotation? look = null) => new(ShipState.AtRest(default), look ?? Rotation.Identity);

    /// <summary>Luminance-weighted centroid (pixel centres at i + ½) of the image, decoding 8-bit sRGB back to linear light.</summary>
    public static (double X, double Y, double Total) Centroid(RgbaImage image)
    {
        double sumX = 0, sumY = 0, total = 0;
        for (int y = 0; y < image.Height; y++)
            for (int x = 0; x < image.Width; x++)
            {
                (byte r, byte g, byte b) = image[x, y];
                double luminance = 0.2126 * SrgbTransfer.Decode(r / 255.0) + 0.7152 * SrgbTransfer.Decode(g / 255.0) + 0.0722 * SrgbTransfer.Decode(b / 255.0);
                sumX += luminance * (x + 0.5);
                sumY += luminance * (y + 0.5);
                total += luminance;
            }
        return (sumX / total, sumY / total, total);
    }

    public static Vec3 FromDegrees(double azimuthRight, double elevationUp)
    {
        double a = azimuthRight * Math.PI / 180, e = elevationUp * Math.PI / 180;
        return new Vec3(Math.Sin(a) * Math.Cos(e), Math.Sin(e), Math.Cos(a) * Math.Cos(e));
    }
}
