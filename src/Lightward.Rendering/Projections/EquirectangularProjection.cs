using System.Numerics;
using Lightward.Spacetime;

namespace Lightward.Rendering.Projections;

/// <summary>
/// The equirectangular (plate carrée) projection of the full sphere: longitude (from the view axis +Z toward +X)
/// across, latitude (toward +Y) up, linear in both, the view axis at the image centre. At the usual 2:1 aspect every
/// pixel spans the same angle in both directions; a pixel at latitude b spans k_lon·k_lat·cos b sr.
/// </summary>
public sealed class EquirectangularProjection : Projection
{
    private readonly float _centreX, _centreY, _longitudePerPixel, _latitudePerPixel;
    private readonly VectorMapping _projectVector;

    public EquirectangularProjection(int width, int height) : base(width, height)
    {
        LongitudePerPixel = 2 * Math.PI / width;
        LatitudePerPixel = Math.PI / height;
        _centreX = width / 2f;
        _centreY = height / 2f;
        _longitudePerPixel = (float)LongitudePerPixel;
        _latitudePerPixel = (float)LatitudePerPixel;
        _projectVector = ProjectVector;
    }

    public double LongitudePerPixel { get; }
    public double LatitudePerPixel { get; }

    public override double ReferencePixelSolidAngle => LongitudePerPixel * LatitudePerPixel;

    public override double EnclosingHalfAngle => Math.PI;

    public override bool TryProject(Vec3 direction, out double x, out double y)
    {
        double longitude = Math.Atan2(direction.X, direction.Z);
        double latitude = Math.Atan2(direction.Y, Math.Sqrt(direction.X * direction.X + direction.Z * direction.Z));
        x = Width / 2.0 + longitude / LongitudePerPixel;
        y = Height / 2.0 - latitude / LatitudePerPixel;
        return x >= 0 && x < Width && y >= 0 && y < Height;
    }

    public override bool TryUnproject(double x, double y, out Vec3 direction)
    {
        double longitude = (x - Width / 2.0) * LongitudePerPixel, latitude = (Height / 2.0 - y) * LatitudePerPixel;
        direction = new Vec3(Math.Cos(latitude) * Math.Sin(longitude), Math.Sin(latitude), Math.Cos(latitude) * Math.Cos(longitude));
        return true;
    }

    public override double RadianceScale(Vec3 direction)
    {
        double cosLatitude = Math.Sqrt(direction.X * direction.X + direction.Z * direction.Z);
        // The poles' pixels are triangles of finite area: bound cos b by half a pixel.
        return 1 / Math.Max(cosLatitude, LatitudePerPixel / 2);
    }

    public override void ProjectDirections(ReadOnlySpan<float> dx, ReadOnlySpan<float> dy, ReadOnlySpan<float> dz,
        Span<float> x, Span<float> y, Span<float> radianceScale) =>
        ForEachVector(dx, dy, dz, x, y, radianceScale, _projectVector);

    private void ProjectVector(Vector<float> dx, Vector<float> dy, Vector<float> dz, out Vector<float> x, out Vector<float> y, out Vector<float> radianceScale)
    {
        Vector<float> cosLatitude = Vector.SquareRoot(dx * dx + dz * dz);
        x = new Vector<float>(_centreX) + VectorAngles.Atan2(dx, dz) / new Vector<float>(_longitudePerPixel);
        y = new Vector<float>(_centreY) - VectorAngles.Atan2(dy, cosLatitude) / new Vector<float>(_latitudePerPixel);
        radianceScale = Vector<float>.One / Vector.Max(cosLatitude, new Vector<float>(_latitudePerPixel / 2));
    }

    public override void UnprojectRow(int row, int firstColumn, Span<float> dx, Span<float> dy, Span<float> dz)
    {
        (float sinLatitude, float cosLatitude) = MathF.SinCos((_centreY - (row + 0.5f)) * _latitudePerPixel);
        UnprojectRun(new RowUnprojection(_centreX, _longitudePerPixel, sinLatitude, cosLatitude), firstColumn, dx, dy, dz);
    }

    /// <summary>A row of the map: one latitude, each pixel's longitude proportional to its column centre's offset.</summary>
    private readonly struct RowUnprojection(float centreX, float longitudePerPixel, float sinLatitude, float cosLatitude) : IRowUnprojection
    {
        public void Unproject(int firstColumn, out Vector<float> dx, out Vector<float> dy, out Vector<float> dz)
        {
            (Vector<float> sinLongitude, Vector<float> cosLongitude) = Vector.SinCos(PixelCentreOffsets(firstColumn, centreX) * new Vector<float>(longitudePerPixel));
            dx = new Vector<float>(cosLatitude) * sinLongitude;
            dy = new Vector<float>(sinLatitude);
            dz = new Vector<float>(cosLatitude) * cosLongitude;
        }
    }
}
