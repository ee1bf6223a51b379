using System.Numerics;
using System.Runtime.InteropServices;
using Lightward.Spacetime;

namespace Lightward.Rendering.Projections;

/// <summary>
/// The pinhole (gnomonic) projection of a flat screen: x = cx + f·dx/dz, y = cy − f·dy/dz, with the focal length
/// f = (width/2) / tan(horizontal field of view / 2) in pixels. A pixel at angle α off the axis spans cos³α/f² sr.
/// </summary>
public sealed class PerspectiveProjection : Projection
{
    /// <summary>Closest a direction may come to the image plane (dz) and still be projected; keeps 1/dz finite.</summary>
    private const float MinimumDepth = 1e-4f;

    private readonly float _centreX, _centreY, _focal;

    public PerspectiveProjection(int width, int height, double horizontalFieldOfView) : base(width, height)
    {
        if (!(horizontalFieldOfView > 0 && horizontalFieldOfView < Math.PI))
            throw new ArgumentOutOfRangeException(nameof(horizontalFieldOfView), "field of view must lie strictly between 0 and 180 degrees");
        HorizontalFieldOfView = horizontalFieldOfView;
        FocalLength = width / 2.0 / Math.Tan(horizontalFieldOfView / 2);
        _centreX = width / 2f;
        _centreY = height / 2f;
        _focal = (float)FocalLength;
        // x ≥ −margin ⇔ dx/dz ≥ −(cx + margin)/f, and likewise for the other three edges of the kept margin.
        double across = (width / 2.0 + StarMargin) / FocalLength, down = (height / 2.0 + StarMargin) / FocalLength;
        _edgePlanes =
        [
            new Vec3(1, 0, across).NormalizedOr(Vec3.UnitZ), new Vec3(-1, 0, across).NormalizedOr(Vec3.UnitZ),
            new Vec3(0, 1, down).NormalizedOr(Vec3.UnitZ), new Vec3(0, -1, down).NormalizedOr(Vec3.UnitZ),
        ];
    }

    private readonly Vec3[] _edgePlanes;

    /// <summary>The four planes through the eye and the edges of the kept margin around the image.</summary>
    public override ReadOnlyMemory<Vec3> EdgePlanes => _edgePlanes;

    public double HorizontalFieldOfView { get; }

    /// <summary>Focal length in pixels.</summary>
    public double FocalLength { get; }

    public override double ReferencePixelSolidAngle => 1 / (FocalLength * FocalLength);

    /// <summary>The angle to the corner of the kept margin around the image (float rounding of the projection is far inside the padding).</summary>
    public override double EnclosingHalfAngle =>
        Math.Atan(Math.Sqrt(Math.Pow(Width / 2.0 + StarMargin, 2) + Math.Pow(Height / 2.0 + StarMargin, 2)) / FocalLength) + 1e-4;

    public override bool TryProject(Vec3 direction, out double x, out double y)
    {
        x = Width / 2.0 + FocalLength * direction.X / direction.Z;
        y = Height / 2.0 - FocalLength * direction.Y / direction.Z;
        return direction.Z > 0 && x >= 0 && x < Width && y >= 0 && y < Height;
    }

    public override bool TryUnproject(double x, double y, out Vec3 direction)
    {
        direction = new Vec3((x - Width / 2.0) / FocalLength, -(y - Height / 2.0) / FocalLength, 1).NormalizedOr(Vec3.UnitZ);
        return true;
    }

    public override double RadianceScale(Vec3 direction) => 1 / (direction.Z * direction.Z * direction.Z);

    public override void ProjectDirections(ReadOnlySpan<float> dx, ReadOnlySpan<float> dy, ReadOnlySpan<float> dz,
        Span<float> x, Span<float> y, Span<float> radianceScale)
    {
        int vectorCount = dx.Length / Vector<float>.Count;
        ReadOnlySpan<Vector<float>> vx = MemoryMarshal.Cast<float, Vector<float>>(dx), vy = MemoryMarshal.Cast<float, Vector<float>>(dy), vz = MemoryMarshal.Cast<float, Vector<float>>(dz);
        Span<Vector<float>> outX = MemoryMarshal.Cast<float, Vector<float>>(x), outY = MemoryMarshal.Cast<float, Vector<float>>(y), outScale = MemoryMarshal.Cast<float, Vector<float>>(radianceScale);
        var centreX = new Vector<float>(_centreX);
        var centreY = new Vector<float>(_centreY);
        var focal = new Vector<float>(_focal);
        var minimumDepth = new Vector<float>(MinimumDepth);
        var notVisible = new Vector<float>(float.NaN);
        for (int i = 0; i < vectorCount; i++)
        {
            Vector<float> depth = vz[i];
            Vector<float> inverseDepth = Vector<float>.One / Vector.Max(depth, minimumDepth);
            Vector<float> px = centreX + focal * vx[i] * inverseDepth;
            Vector<float> py = centreY - focal * vy[i] * inverseDepth;
            Vector<int> kept = Vector.GreaterThan(depth, minimumDepth) & WithinMargin(px, py);
            outX[i] = Vector.ConditionalSelect(kept, px, notVisible);
            outY[i] = py;
            outScale[i] = inverseDepth * inverseDepth * inverseDepth;
        }
        for (int i = vectorCount * Vector<float>.Count; i < dx.Length; i++)
        {
            float inverseDepth = 1 / MathF.Max(dz[i], MinimumDepth);
            float px = _centreX + _focal * dx[i] * inverseDepth, py = _centreY - _focal * dy[i] * inverseDepth;
            x[i] = dz[i] > MinimumDepth && WithinMargin(px, py) ? px : float.NaN;
            y[i] = py;
            radianceScale[i] = inverseDepth * inverseDepth * inverseDepth;
        }
    }

    public override void UnprojectRow(int row, int firstColumn, Span<float> dx, Span<float> dy, Span<float> dz) =>
        UnprojectRun(new RowUnprojection(_centreX, -(row + 0.5f - _centreY) / _focal, 1 / _focal), firstColumn, dx, dy, dz);

    /// <summary>A row of the flat screen: (right, up, 1) normalised, with right = (column centre − cx)/f and up fixed for the row.</summary>
    private readonly struct RowUnprojection(float centreX, float up, float inverseFocal) : IRowUnprojection
    {
        public void Unproject(int firstColumn, out Vector<float> dx, out Vector<float> dy, out Vector<float> dz)
        {
            Vector<float> right = PixelCentreOffsets(firstColumn, centreX) * new Vector<float>(inverseFocal), upVector = new(up);
            Vector<float> inverseLength = Vector<float>.One / Vector.SquareRoot(right * right + upVector * upVector + Vector<float>.One);
            dx = right * inverseLength;
            dy = upVector * inverseLength;
            dz = inverseLength;
        }
    }
}
