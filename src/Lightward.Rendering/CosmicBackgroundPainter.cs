using System.Buffers;
using System.Numerics;
using System.Runtime.InteropServices;
using Lightward.Optics;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

namespace Lightward.Rendering;

/// <summary>
/// Paints the cosmic microwave background into every pixel of the HDR frame from the Doppler factor of that pixel's
/// direction. D depends only on the apparent angle θ′ from the direction of motion, so each frame tabulates the CMB
/// radiance once against s = sin²(θ′/2) = |d − n|²/4 (free of cancellation near the apex) and each pixel only computes
/// s and looks it up. The table is indexed by the bits of s as a float — exponent and top mantissa bits, i.e.
/// <see cref="BinsPerStop"/> bins per factor of two — so it resolves the narrow forward glow at high rapidity as
/// finely as the broad sky behind. The CMB is invisible below rapidity ≈ 6 (D·T₀ far below visible temperatures);
/// then nothing is painted.
/// </summary>
public sealed class CosmicBackgroundPainter
{
    public const int BinsPerStop = 256;

    /// <summary>Smallest s tabulated, 2⁻⁴⁰ (θ′ ≈ 2 µrad, far below a pixel); the apex pixel takes this bin's value.</summary>
    private const int SmallestExponent = -40;

    /// <summary>Radiance × reference solid angle below which the background cannot show at any exposure we allow (V ≈ 45 per pixel).</summary>
    private const double InvisibleLevel = 1e-18;

    private const int BinShift = 23 - 8; // 2⁸ = BinsPerStop mantissa bins
    private static readonly int BaseBin = BitConverter.SingleToInt32Bits(MathF.Pow(2, SmallestExponent)) >> BinShift;
    private static readonly int TableLength = (BitConverter.SingleToInt32Bits(1f) >> BinShift) - BaseBin + 1;

    private readonly float[] _red = new float[TableLength], _green = new float[TableLength], _blue = new float[TableLength];
    private readonly Action<int> _paintBand, _clearBand;
    private HdrFrame? _frame;
    private Projection? _projection;
    private Vector3 _motion;

    public CosmicBackgroundPainter()
    {
        _paintBand = PaintBand;
        _clearBand = band => _frame!.ClearRows(band * StarSplatter.BandHeight, Math.Min(_frame.Height, (band + 1) * StarSplatter.BandHeight));
    }

    /// <summary>
    /// Stage "background": writes every pixel of <paramref name="frame"/> with CMB radiance × reference pixel solid
    /// angle. Returns false, leaving the frame untouched, when the CMB is too faint to show at any exposure.
    /// </summary>
    public bool Paint(HdrFrame frame, Projection projection, LorentzFrame shipFrame, AxesTransform shipToCamera, ParallelOptions parallel)
    {
        _frame = frame;
        _projection = projection;
        Velocity velocity = shipFrame.Velocity;
        Vec3 motionInShip = shipFrame.Orientation.Inverse.Rotate(velocity.Direction);
        Vec3 motion = shipToCamera.Apply(motionInShip);
        _motion = new Vector3((float)motion.X, (float)motion.Y, (float)motion.Z);

        if (!Tabulate(velocity, projection.ReferencePixelSolidAngle)) return false;
        ParallelItems.For(0, BandCount(frame), parallel, _paintBand);
        return true;
    }

    /// <summary>Zeroes the whole frame, a band per task (a frame without background).</summary>
    public void Clear(HdrFrame frame, ParallelOptions parallel)
    {
        _frame = frame;
        ParallelItems.For(0, BandCount(frame), parallel, _clearBand);
    }

    private static int BandCount(HdrFrame frame) => (frame.Height + StarSplatter.BandHeight - 1) / StarSplatter.BandHeight;

    /// <summary>Fills the radiance table for this velocity; false when even the brightest entry (dead ahead) is invisible.</summary>
    private bool Tabulate(Velocity velocity, double referenceSolidAngle)
    {
        // Any direction at apparent angle θ′ from the motion gives the same D; build one in the plane of n and a perpendicular.
        Vec3 n = velocity.Direction, across = n.AnyPerpendicular();
        CosmicBackground.Radiance((float)Math.Log(Doppler.FactorFromApparent(n, velocity)), out float r, out float g, out float b);
        if (!(ColorWeights.Red * r + ColorWeights.Green * g + ColorWeights.Blue * b > InvisibleLevel / referenceSolidAngle)) return false;
        float solidAngle = (float)referenceSolidAngle;
        for (int i = 0; i < TableLength; i++)
        {
            double s = BitConverter.Int32BitsToSingle((BaseBin + i) << BinShift | 1 << (BinShift - 1));
            double halfAngle = Math.Asin(Math.Sqrt(Math.Min(s, 1)));
            Vec3 direction = Math.Cos(2 * halfAngle) * n + Math.Sin(2 * halfAngle) * across;
            CosmicBackground.Radiance((float)Math.Log(Doppler.FactorFromApparent(direction, velocity)), out r, out g, out b);
            _red[i] = r * solidAngle;
            _green[i] = g * solidAngle;
            _blue[i] = b * solidAngle;
        }
        return true;
    }

    private void PaintBand(int band)
    {
        HdrFrame frame = _frame!;
        int width = frame.Width, firstRow = band * StarSplatter.BandHeight, endRow = Math.Min(frame.Height, firstRow + StarSplatter.BandHeight);
        float[] scratch = ArrayPool<float>.Shared.Rent(4 * width);
        try
        {
            Span<float> dx = scratch.AsSpan(0, width), dy = scratch.AsSpan(width, width), dz = scratch.AsSpan(2 * width, width);
            Span<int> bins = MemoryMarshal.Cast<float, int>(scratch.AsSpan(3 * width, width));
            for (int row = firstRow; row < endRow; row++)
            {
                _projection!.UnprojectRow(row, 0, dx, dy, dz);
                TableIndices(dx, dy, dz, bins);
                int offset = row * width;
                for (int column = 0; column < width; column++)
                {
                    int bin = bins[column];
                    bool mapped = bin >= 0;
                    frame.Red[offset + column] = mapped ? _red[bin] : 0;
                    frame.Green[offset + column] = mapped ? _green[bin] : 0;
                    frame.Blue[offset + column] = mapped ? _blue[bin] : 0;
                }
            }
        }
        finally
        {
            ArrayPool<float>.Shared.Return(scratch);
        }
    }

    /// <summary>Table index of s = |d − n|²/4 per pixel; −1 where the projection shows no direction (NaN).</summary>
    private void TableIndices(ReadOnlySpan<float> dx, ReadOnlySpan<float> dy, ReadOnlySpan<float> dz, Span<int> bins)
    {
        var nx = new Vector<float>(_motion.X);
        var ny = new Vector<float>(_motion.Y);
        var nz = new Vector<float>(_motion.Z);
        var quarter = new Vector<float>(0.25f);
        var baseBin = new Vector<int>(BaseBin);
        var lastBin = new Vector<int>(TableLength - 1);
        var unmapped = new Vector<int>(-1);
        int vectorCount = dx.Length / Vector<float>.Count;
        ReadOnlySpan<Vector<float>> vx = MemoryMarshal.Cast<float, Vector<float>>(dx), vy = MemoryMarshal.Cast<float, Vector<float>>(dy), vz = MemoryMarshal.Cast<float, Vector<float>>(dz);
        Span<Vector<int>> outBins = MemoryMarshal.Cast<int, Vector<int>>(bins);
        for (int i = 0; i < vectorCount; i++)
        {
            Vector<float> ex = vx[i] - nx, ey = vy[i] - ny, ez = vz[i] - nz;
            Vector<float> s = (ex * ex + ey * ey + ez * ez) * quarter;
            Vector<int> bin = Vector.ShiftRightArithmetic(Vector.AsVectorInt32(s), BinShift) - baseBin;
            bin = Vector.Min(Vector.Max(bin, Vector<int>.Zero), lastBin);
            outBins[i] = Vector.ConditionalSelect(Vector.Equals(s, s), bin, unmapped);
        }
        for (int i = vectorCount * Vector<float>.Count; i < dx.Length; i++)
        {
            float ex = dx[i] - _motion.X, ey = dy[i] - _motion.Y, ez = dz[i] - _motion.Z;
            float s = (ex * ex + ey * ey + ez * ez) * 0.25f;
            bins[i] = float.IsNaN(s) ? -1 : Math.Clamp((BitConverter.SingleToInt32Bits(s) >> BinShift) - BaseBin, 0, TableLength - 1);
        }
    }
}
