using System.Numerics;
using Lightward.Spacetime;

namespace Lightward.Rendering.Projections;

/// <summary>
/// The fulldome master frame: a square image holding a disc in the azimuthal-equidistant (angular fisheye) projection,
/// the dome's zenith (camera +Z) at the centre and the angle from the zenith proportional to the distance from the
/// centre, so the rim is at half the aperture (90° for the usual 180° dome). Camera +X is image right and camera +Y
/// image up; the camera rig (see <see cref="Camera"/>) points image-down at the front, as fulldome practice expects.
/// A pixel at angle θ from the zenith spans k²·sinθ/θ sr, k the angle per pixel.
/// </summary>
public sealed class DomemasterProjection : Projection
{
    private readonly float _centre, _anglePerPixel, _halfAperture;
    private readonly VectorMapping _projectVector;

    public DomemasterProjection(int size, double aperture) : base(size, size)
    {
        if (!(aperture > 0 && aperture <= 2 * Math.PI))
            throw new ArgumentOutOfRangeException(nameof(aperture), "aperture must lie in (0, 360] degrees");
        Aperture = aperture;
        AnglePerPixel = aperture / 2 / (size / 2.0);
        _centre = size / 2f;
        _anglePerPixel = (float)AnglePerPixel;
        _halfAperture = (float)(aperture / 2);
        _projectVector = ProjectVector;
    }

    /// <summary>Full angle across the disc, radians (π for a hemisphere).</summary>
    public double Aperture { get; }

    /// <summary>Angle from the zenith per pixel of distance from the centre, radians.</summary>
    public double AnglePerPixel { get; }

    public override double ReferencePixelSolidAngle => AnglePerPixel * AnglePerPixel;

    /// <summary>Stars are kept out to the rim of the disc (padded for the single-precision zenith angle).</summary>
    public override double EnclosingHalfAngle => Math.Min(Math.PI, Aperture / 2 + 1e-4);

    public override bool TryProject(Vec3 direction, out double x, out double y)
    {
        double across = Math.Sqrt(direction.X * direction.X + direction.Y * direction.Y);
        double zenithAngle = Math.Atan2(across, direction.Z);
        double radius = zenithAngle / AnglePerPixel;
        double scale = across > 0 ? radius / across : 0;
        x = Width / 2.0 + scale * direction.X;
        y = Height / 2.0 - scale * direction.Y;
        return zenithAngle <= Aperture / 2 && x >= 0 && x < Width && y >= 0 && y < Height;
    }

    public override bool TryUnproject(double x, double y, out Vec3 direction)
    {
        double right = x - Width / 2.0, up = Height / 2.0 - y;
        double radius = Math.Sqrt(right * right + up * up);
        double zenithAngle = radius * AnglePerPixel;
        double sinOverRadius = radius > 0 ? Math.Sin(zenithAngle) / radius : AnglePerPixel;
        direction = new Vec3(sinOverRadius * right, sinOverRadius * up, Math.Cos(zenithAngle));
        return zenithAngle <= Aperture / 2;
    }

    public override double RadianceScale(Vec3 direction)
    {
        double zenithAngle = Vec3.AngleBetween(direction, Vec3.UnitZ);
        return ZenithRadianceScale(zenithAngle, Math.Sin(zenithAngle), AnglePerPixel / 2);
    }

    /// <summary>
    /// θ / sin θ, the ratio of the centre pixel's solid angle to one at zenith angle θ. Near the zenith it tends to 1;
    /// at the anti-zenith of a 360° disc half a pixel's angle bounds sin θ away from zero.
    /// </summary>
    private static double ZenithRadianceScale(double zenithAngle, double sine, double minimumSine) =>
        zenithAngle < Math.PI / 2 ? (sine > 1e-4 ? zenithAngle / sine : 1) : zenithAngle / Math.Max(sine, minimumSine);

    public override void ProjectDirections(ReadOnlySpan<float> dx, ReadOnlySpan<float> dy, ReadOnlySpan<float> dz,
        Span<float> x, Span<float> y, Span<float> radianceScale) =>
        ForEachVector(dx, dy, dz, x, y, radianceScale, _projectVector);

    /// <summary>The vector form of the mapping and of <see cref="ZenithRadianceScale"/>.</summary>
    private void ProjectVector(Vector<float> dx, Vector<float> dy, Vector<float> dz, out Vector<float> x, out Vector<float> y, out Vector<float> radianceScale)
    {
        Vector<float> across = Vector.SquareRoot(dx * dx + dy * dy);
        Vector<float> zenithAngle = VectorAngles.Atan2(across, dz);
        Vector<int> offAxis = Vector.GreaterThan(across, Vector<float>.Zero);
        Vector<float> scale = Vector.ConditionalSelect(offAxis, zenithAngle / new Vector<float>(_anglePerPixel) / across, Vector<float>.Zero);
        Vector<float> px = new Vector<float>(_centre) + scale * dx, py = new Vector<float>(_centre) - scale * dy;
        x = Vector.ConditionalSelect(Vector.LessThanOrEqual(zenithAngle, new Vector<float>(_halfAperture)) & WithinMargin(px, py), px, new Vector<float>(float.NaN));
        y = py;
        Vector<float> frontScale = Vector.ConditionalSelect(Vector.GreaterThan(across, new Vector<float>(1e-4f)), zenithAngle / across, Vector<float>.One);
        Vector<float> backScale = zenithAngle / Vector.Max(across, new Vector<float>(_anglePerPixel / 2));
        radianceScale = Vector.ConditionalSelect(Vector.LessThan(zenithAngle, new Vector<float>(MathF.PI / 2)), frontScale, backScale);
    }

    public override void UnprojectRow(int row, int firstColumn, Span<float> dx, Span<float> dy, Span<float> dz) =>
        UnprojectRun(new RowUnprojection(_centre, _centre - (row + 0.5f), _anglePerPixel, _halfAperture), firstColumn, dx, dy, dz);

    /// <summary>A row of the dome: each pixel's zenith angle is its distance from the disc centre times the angle per pixel.</summary>
    private readonly struct RowUnprojection(float centre, float up, float anglePerPixel, float halfAperture) : IRowUnprojection
    {
        public void Unproject(int firstColumn, out Vector<float> dx, out Vector<float> dy, out Vector<float> dz)
        {
            Vector<float> right = PixelCentreOffsets(firstColumn, centre), upVector = new(up), noDirection = new(float.NaN);
            // Pixel centres are never exactly at the disc centre for the even sizes used, but guard odd sizes.
            Vector<float> radius = Vector.Max(Vector.SquareRoot(right * right + upVector * upVector), new Vector<float>(1e-6f));
            Vector<float> zenithAngle = radius * new Vector<float>(anglePerPixel);
            (Vector<float> sine, Vector<float> cosine) = Vector.SinCos(zenithAngle);
            Vector<float> sinOverRadius = sine / radius;
            Vector<int> inside = Vector.LessThanOrEqual(zenithAngle, new Vector<float>(halfAperture));
            dx = Vector.ConditionalSelect(inside, sinOverRadius * right, noDirection);
            dy = Vector.ConditionalSelect(inside, sinOverRadius * upVector, noDirection);
            dz = Vector.ConditionalSelect(inside, cosine, noDirection);
        }
    }
}
