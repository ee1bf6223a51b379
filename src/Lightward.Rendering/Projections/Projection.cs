using System.Numerics;
using System.Runtime.InteropServices;
using Lightward.Spacetime;

namespace Lightward.Rendering.Projections;

/// <summary>
/// Maps directions in camera axes (+Z the view axis, +X right, +Y up) to image pixels and back. Pixel coordinates run
/// x to the right and y downward; pixel (i, j) covers [i, i+1) × [j, j+1), so its centre is (i + ½, j + ½).
/// Besides the mapping each projection knows its pixels' solid angles, because the HDR frame holds radiance: a star's
/// flux is divided over the solid angle of the pixel it lands on, relative to the <see cref="ReferencePixelSolidAngle"/>.
/// </summary>
public abstract class Projection
{
    /// <summary>How far outside the image a star may land and still be kept, so the halo of a star just off the edge shows.</summary>
    public const float StarMargin = 64;

    protected Projection(int width, int height)
    {
        if (width <= 0 || height <= 0) throw new ArgumentOutOfRangeException(nameof(width), "image size must be positive");
        Width = width;
        Height = height;
    }

    public int Width { get; }
    public int Height { get; }

    /// <summary>Solid angle (sr) of the image's reference pixel (its centre); HDR values are radiance × this.</summary>
    public abstract double ReferencePixelSolidAngle { get; }

    /// <summary>
    /// Half-angle (radians) about the view axis +Z of a cone holding every direction for which
    /// <see cref="ProjectDirections"/> keeps a star; π when the image can show any direction.
    /// </summary>
    public abstract double EnclosingHalfAngle { get; }

    /// <summary>
    /// Planes through the eye that bound, with the enclosing cone, the directions for which
    /// <see cref="ProjectDirections"/> keeps a star: inward unit normals n in camera axes, the star kept only where
    /// d · n ≥ 0 for each. Empty when the cone is all the bound there is.
    /// </summary>
    public virtual ReadOnlyMemory<Vec3> EdgePlanes => default;

    /// <summary>Unit direction in camera axes → pixel position; false when the direction is not on the image.</summary>
    public abstract bool TryProject(Vec3 direction, out double x, out double y);

    /// <summary>Pixel position → unit direction in camera axes; false where the image shows no direction (outside a dome's disc).</summary>
    public abstract bool TryUnproject(double x, double y, out Vec3 direction);

    /// <summary>Reference pixel solid angle ÷ the solid angle of a pixel at <paramref name="direction"/> (camera axes, unit).</summary>
    public abstract double RadianceScale(Vec3 direction);

    /// <summary>
    /// Projects unit directions (camera axes, flat arrays) to pixel positions and radiance scales; a direction that
    /// does not land within <see cref="StarMargin"/> of the image gets x = NaN. Single-precision and vectorised where
    /// the mapping allows; each index is written independently, so callers may split the range across threads.
    /// </summary>
    public abstract void ProjectDirections(ReadOnlySpan<float> dx, ReadOnlySpan<float> dy, ReadOnlySpan<float> dz,
        Span<float> x, Span<float> y, Span<float> radianceScale);

    /// <summary>A projection's per-star mapping for one vector of directions.</summary>
    protected delegate void VectorMapping(Vector<float> dx, Vector<float> dy, Vector<float> dz, out Vector<float> x, out Vector<float> y, out Vector<float> radianceScale);

    /// <summary>
    /// Runs <paramref name="mapping"/> over the directions a vector at a time. The last vector overlaps the one before
    /// it (those stars are mapped twice, to the same values); fewer directions than a vector are padded.
    /// </summary>
    protected static void ForEachVector(ReadOnlySpan<float> dx, ReadOnlySpan<float> dy, ReadOnlySpan<float> dz,
        Span<float> x, Span<float> y, Span<float> radianceScale, VectorMapping mapping)
    {
        int lanes = Vector<float>.Count, count = dx.Length;
        if (count == 0) return;
        if (count < lanes)
        {
            Span<float> padded = stackalloc float[6 * lanes];
            padded.Clear();
            Span<float> px = padded[..lanes], py = padded[lanes..(2 * lanes)], pz = padded[(2 * lanes)..(3 * lanes)];
            Span<float> outX = padded[(3 * lanes)..(4 * lanes)], outY = padded[(4 * lanes)..(5 * lanes)], outScale = padded[(5 * lanes)..];
            dx.CopyTo(px); dy.CopyTo(py); dz.CopyTo(pz);
            ForEachVector(px, py, pz, outX, outY, outScale, mapping);
            outX[..count].CopyTo(x); outY[..count].CopyTo(y); outScale[..count].CopyTo(radianceScale);
            return;
        }
        for (int start = 0; ; start += lanes)
        {
            int at = Math.Min(start, count - lanes);
            mapping(new Vector<float>(dx[at..]), new Vector<float>(dy[at..]), new Vector<float>(dz[at..]),
                out Vector<float> vx, out Vector<float> vy, out Vector<float> scale);
            vx.CopyTo(x[at..]); vy.CopyTo(y[at..]); scale.CopyTo(radianceScale[at..]);
            if (at == count - lanes) return;
        }
    }

    /// <summary>
    /// Unit directions (camera axes) through the centres of pixels [<paramref name="firstColumn"/>,
    /// <paramref name="firstColumn"/> + <paramref name="dx"/>.Length) of a row; NaN where the image shows no direction.
    /// Each pixel's value depends only on its own column, so any run of a row gives the same values as the whole row.
    /// </summary>
    public abstract void UnprojectRow(int row, int firstColumn, Span<float> dx, Span<float> dy, Span<float> dz);

    /// <summary>One row's unprojection, a vector of neighbouring pixels at a time (with whatever the row shares worked out once).</summary>
    protected interface IRowUnprojection
    {
        /// <summary>Directions through the centres of columns <paramref name="firstColumn"/>, <paramref name="firstColumn"/> + 1, … (one per lane).</summary>
        void Unproject(int firstColumn, out Vector<float> dx, out Vector<float> dy, out Vector<float> dz);
    }

    /// <summary>
    /// Runs <paramref name="unprojection"/> over a run of a row, the last partial vector too, so that every pixel
    /// goes through the same arithmetic wherever the run starts and ends.
    /// </summary>
    protected static void UnprojectRun<TRow>(in TRow unprojection, int firstColumn, Span<float> dx, Span<float> dy, Span<float> dz)
        where TRow : struct, IRowUnprojection
    {
        int lanes = Vector<float>.Count, whole = dx.Length / lanes;
        Span<Vector<float>> outX = MemoryMarshal.Cast<float, Vector<float>>(dx), outY = MemoryMarshal.Cast<float, Vector<float>>(dy), outZ = MemoryMarshal.Cast<float, Vector<float>>(dz);
        for (int i = 0; i < whole; i++) unprojection.Unproject(firstColumn + i * lanes, out outX[i], out outY[i], out outZ[i]);
        int done = whole * lanes, rest = dx.Length - done;
        if (rest == 0) return;
        unprojection.Unproject(firstColumn + done, out Vector<float> x, out Vector<float> y, out Vector<float> z);
        Span<float> lanesOut = stackalloc float[lanes];
        x.CopyTo(lanesOut); lanesOut[..rest].CopyTo(dx[done..]);
        y.CopyTo(lanesOut); lanesOut[..rest].CopyTo(dy[done..]);
        z.CopyTo(lanesOut); lanesOut[..rest].CopyTo(dz[done..]);
    }

    /// <summary>True when (x, y) lies within the kept margin around the image.</summary>
    protected bool WithinMargin(float x, float y) =>
        x >= -StarMargin && x <= Width + StarMargin && y >= -StarMargin && y <= Height + StarMargin;

    /// <summary>Vector form of <see cref="WithinMargin(float, float)"/>.</summary>
    protected Vector<int> WithinMargin(Vector<float> x, Vector<float> y) =>
        Vector.GreaterThanOrEqual(x, new Vector<float>(-StarMargin)) & Vector.LessThanOrEqual(x, new Vector<float>(Width + StarMargin))
        & Vector.GreaterThanOrEqual(y, new Vector<float>(-StarMargin)) & Vector.LessThanOrEqual(y, new Vector<float>(Height + StarMargin));

    /// <summary>0, 1, 2, …: the lane numbers of a vector.</summary>
    private static readonly Vector<int> LaneNumbers = Vector<int>.Indices;

    /// <summary>
    /// The x coordinates of the pixel centres of columns <paramref name="firstColumn"/>… relative to
    /// <paramref name="centreX"/>, for the vectorised row loops: per lane (column + ½) − centreX, rounded as the scalar
    /// expression <c>column + 0.5f - centreX</c> is.
    /// </summary>
    protected static Vector<float> PixelCentreOffsets(int firstColumn, float centreX) =>
        Vector.ConvertToSingle(new Vector<int>(firstColumn) + LaneNumbers) + new Vector<float>(0.5f) - new Vector<float>(centreX);
}
