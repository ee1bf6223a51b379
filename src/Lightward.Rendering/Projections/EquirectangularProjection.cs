using System.Numerics;
using System.Runtime.InteropServices;
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

    public override void UnprojectRow(int row, Span<float> dx, Span<float> dy, Span<float> dz)
    {
        float latitude = (_centreY - (row + 0.5f)) * _latitudePerPixel;
        (float sinLatitude, float cosLatitude) = MathF.SinCos(latitude);
        var cosLatitudeVector = new Vector<float>(cosLatitude);
        var sinLatitudeVector = new Vector<float>(sinLatitude);
        var longitudePerPixel = new Vector<float>(_longitudePerPixel);
        var step = new Vector<float>(Vector<float>.Count);
        Vector<float> columnOffset = PixelCentreOffsets(0, _centreX);
        int vectorCount = Width / Vector<float>.Count;
        Span<Vector<float>> outX = MemoryMarshal.Cast<float, Vector<float>>(dx), outY = MemoryMarshal.Cast<float, Vector<float>>(dy), outZ = MemoryMarshal.Cast<float, Vector<float>>(dz);
        for (int i = 0; i < vectorCount; i++, columnOffset += step)
        {
            (Vector<float> sinLongitude, Vector<float> cosLongitude) = Vector.SinCos(columnOffset * longitudePerPixel);
            outX[i] = cosLatitudeVector * sinLongitude;
            outY[i] = sinLatitudeVector;
            outZ[i] = cosLatitudeVector * cosLongitude;
        }
        for (int column = vectorCount * Vector<float>.Count; column < Width; column++)
        {
            (float sinLongitude, float cosLongitude) = MathF.SinCos((column + 0.5f - _centreX) * _longitudePerPixel);
            dx[column] = cosLatitude * sinLongitude;
            dy[column] = sinLatitude;
            dz[column] = cosLatitude * cosLongitude;
        }
    }
}
