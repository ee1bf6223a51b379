using Lightward.Optics;
using Lightward.Rendering.Projections;

namespace Lightward.Rendering;

/// <summary>
/// Puts stars into the HDR frame: projects their apparent directions to pixels, bins them by the row bands their
/// footprints touch, and splats each band on its own thread. Bands are a fixed height whatever the thread count and
/// each band adds its stars in catalogue order, so every pixel sums the same numbers in the same order on any
/// number of cores. A dim star is one bilinear sample; a star whose exposed flux exceeds
/// <see cref="BilinearLimit"/> gets a <see cref="PointSpreadKernels"/> footprint sized by its brightness.
/// Scratch arrays grow with the star count and are then reused, so steady-state frames allocate nothing.
/// </summary>
public sealed class StarSplatter
{
    public const int BandHeight = 16;

    /// <summary>Exposed flux above which a single bilinear sample would look like a hard square: use a kernel.</summary>
    public const float BilinearLimit = 1;

    /// <summary>Stars per chunk of the projection loop: a fixed split, so chunk boundaries do not depend on the thread count.</summary>
    private const int ChunkSize = 4096;

    private const byte Hidden = byte.MaxValue, Bilinear = 0;

    private float[] _x = [], _y = [], _radianceScale = [];
    /// <summary>Per star: <see cref="Hidden"/>, <see cref="Bilinear"/>, or kernel size index + 1.</summary>
    private byte[] _footprint = [];
    private int[] _bandStart = [];
    private int[] _bandStars = [];

    private readonly PointSpreadKernels _kernels = PointSpreadKernels.Shared;

    // The frame in flight, kept in fields so the parallel bodies are allocated once.
    private ApparentStars _stars = new();
    private Projection? _projection;
    private AxesTransform _shipToCamera;
    private HdrFrame? _frame;
    private float _exposureScale;
    private readonly Action<int> _projectChunk, _assignChunk, _splatBand;

    public StarSplatter()
    {
        _projectChunk = ProjectChunk;
        _assignChunk = AssignFootprints;
        _splatBand = SplatBand;
    }

    /// <summary>Pixel x of each star from the last <see cref="Project"/>, NaN when off the image.</summary>
    public ReadOnlySpan<float> X => _x.AsSpan(0, _stars.Count);
    public ReadOnlySpan<float> Y => _y.AsSpan(0, _stars.Count);
    /// <summary>Reference pixel solid angle ÷ the solid angle of the pixel each star lands on.</summary>
    public ReadOnlySpan<float> RadianceScale => _radianceScale.AsSpan(0, _stars.Count);

    /// <summary>Stage "projection": apparent directions (ship axes) → camera axes → pixel positions.</summary>
    public void Project(ApparentStars stars, AxesTransform shipToCamera, Projection projection, ParallelOptions parallel)
    {
        _stars = stars;
        _shipToCamera = shipToCamera;
        _projection = projection;
        if (_x.Length < stars.Count)
        {
            _x = new float[stars.Count]; _y = new float[stars.Count]; _radianceScale = new float[stars.Count];
            _footprint = new byte[stars.Count];
        }
        Parallel.For(0, (stars.Count + ChunkSize - 1) / ChunkSize, parallel, _projectChunk);
    }

    /// <summary>Stage "splat stars": bins the projected stars into row bands, then adds their light to <paramref name="frame"/>.</summary>
    public void Splat(HdrFrame frame, float exposureScale, ParallelOptions parallel)
    {
        _frame = frame;
        _exposureScale = exposureScale;
        int bandCount = (frame.Height + BandHeight - 1) / BandHeight;
        Parallel.For(0, (_stars.Count + ChunkSize - 1) / ChunkSize, parallel, _assignChunk);
        BinByBand(bandCount, frame.Height);
        Parallel.For(0, bandCount, parallel, _splatBand);
    }

    /// <summary>Adds one star's light (linear RGB flux, already scaled to radiance) centred at (x, y), touching only rows [firstRow, endRow).</summary>
    public void SplatOne(HdrFrame frame, float x, float y, float red, float green, float blue, int footprint, int firstRow, int endRow)
    {
        if (footprint == Bilinear) SplatBilinear(frame, x, y, red, green, blue, firstRow, endRow);
        else SplatKernel(frame, x, y, red, green, blue, footprint - 1, firstRow, endRow);
    }

    /// <summary>The footprint code for a star of exposed flux <paramref name="exposedFlux"/>: 0 bilinear, else kernel size + 1.</summary>
    public int FootprintFor(float exposedFlux) =>
        exposedFlux <= BilinearLimit ? Bilinear : _kernels.SizeFor(exposedFlux) + 1;

    private void ProjectChunk(int chunk)
    {
        int start = chunk * ChunkSize, count = Math.Min(ChunkSize, _stars.Count - start);
        Span<float> cameraX = stackalloc float[count], cameraY = stackalloc float[count], cameraZ = stackalloc float[count];
        _shipToCamera.Apply(_stars.X.AsSpan(start, count), _stars.Y.AsSpan(start, count), _stars.Z.AsSpan(start, count), cameraX, cameraY, cameraZ);
        _projection!.ProjectDirections(cameraX, cameraY, cameraZ, _x.AsSpan(start, count), _y.AsSpan(start, count), _radianceScale.AsSpan(start, count));
    }

    /// <summary>Hides stars off the image and picks each visible star's footprint from its exposed flux.</summary>
    private void AssignFootprints(int chunk)
    {
        float[] red = _stars.R, green = _stars.G, blue = _stars.B;
        float exposureScale = _exposureScale;
        int height = _frame!.Height, start = chunk * ChunkSize, end = Math.Min(_stars.Count, start + ChunkSize);
        for (int i = start; i < end; i++)
        {
            float y = _y[i];
            if (float.IsNaN(_x[i]) || y < -Projection.StarMargin || y > height + Projection.StarMargin)
            {
                _footprint[i] = Hidden;
                continue;
            }
            float luminance = ColorWeights.Red * red[i] + ColorWeights.Green * green[i] + ColorWeights.Blue * blue[i];
            float exposed = luminance * _radianceScale[i] * exposureScale;
            _footprint[i] = luminance > 0 ? (byte)FootprintFor(exposed) : Hidden;
        }
    }

    private void BinByBand(int bandCount, int height)
    {
        if (_bandStart.Length < bandCount + 1) _bandStart = new int[bandCount + 1];
        Array.Clear(_bandStart, 0, bandCount + 1);
        for (int i = 0; i < _stars.Count; i++)
        {
            if (!TouchedBands(i, height, out int firstBand, out int lastBand)) continue;
            for (int band = firstBand; band <= lastBand; band++) _bandStart[band + 1]++;
        }
        for (int band = 0; band < bandCount; band++) _bandStart[band + 1] += _bandStart[band];
        int total = _bandStart[bandCount];
        if (_bandStars.Length < total) _bandStars = new int[Math.Max(total, _bandStars.Length * 2)];
        // Fill each band in star order: _bandStart[band] serves as the band's write cursor, then is restored.
        for (int i = 0; i < _stars.Count; i++)
        {
            if (!TouchedBands(i, height, out int firstBand, out int lastBand)) continue;
            for (int band = firstBand; band <= lastBand; band++) _bandStars[_bandStart[band]++] = i;
        }
        for (int band = bandCount; band > 0; band--) _bandStart[band] = _bandStart[band - 1];
        _bandStart[0] = 0;
    }

    private bool TouchedBands(int star, int height, out int firstBand, out int lastBand)
    {
        firstBand = lastBand = 0;
        byte footprint = _footprint[star];
        if (footprint == Hidden) return false;
        int firstRow, lastRow;
        if (footprint == Bilinear)
        {
            firstRow = (int)MathF.Floor(_y[star] - 0.5f);
            lastRow = firstRow + 1;
        }
        else
        {
            int radius = PointSpreadKernels.Radii[footprint - 1];
            int centreRow = (int)MathF.Floor(_y[star]);
            firstRow = centreRow - radius;
            lastRow = centreRow + radius;
        }
        if (lastRow < 0 || firstRow >= height) return false;
        firstBand = Math.Max(firstRow, 0) / BandHeight;
        lastBand = Math.Min(lastRow, height - 1) / BandHeight;
        return true;
    }

    private void SplatBand(int band)
    {
        HdrFrame frame = _frame!;
        int firstRow = band * BandHeight, endRow = Math.Min(frame.Height, firstRow + BandHeight);
        float[] red = _stars.R, green = _stars.G, blue = _stars.B;
        for (int entry = _bandStart[band]; entry < _bandStart[band + 1]; entry++)
        {
            int i = _bandStars[entry];
            float scale = _radianceScale[i];
            SplatOne(frame, _x[i], _y[i], red[i] * scale, green[i] * scale, blue[i] * scale, _footprint[i], firstRow, endRow);
        }
    }

    private static void SplatBilinear(HdrFrame frame, float x, float y, float red, float green, float blue, int firstRow, int endRow)
    {
        float fx = x - 0.5f, fy = y - 0.5f;
        int left = (int)MathF.Floor(fx), top = (int)MathF.Floor(fy);
        float ax = fx - left, ay = fy - top;
        for (int row = Math.Max(top, firstRow); row <= top + 1 && row < endRow; row++)
        {
            float rowWeight = row == top ? 1 - ay : ay;
            for (int column = Math.Max(left, 0); column <= left + 1 && column < frame.Width; column++)
            {
                float weight = rowWeight * (column == left ? 1 - ax : ax);
                int index = row * frame.Width + column;
                frame.Red[index] += weight * red;
                frame.Green[index] += weight * green;
                frame.Blue[index] += weight * blue;
            }
        }
    }

    private void SplatKernel(HdrFrame frame, float x, float y, float red, float green, float blue, int size, int firstRow, int endRow)
    {
        int radius = PointSpreadKernels.Radii[size], side = 2 * radius + 1;
        int centreColumn = (int)MathF.Floor(x), centreRow = (int)MathF.Floor(y);
        float[] weights = _kernels.Weights(size, PointSpreadKernels.PhaseOf(x - centreColumn), PointSpreadKernels.PhaseOf(y - centreRow));
        int top = centreRow - radius, left = centreColumn - radius;
        int rowStart = Math.Max(top, firstRow), rowEnd = Math.Min(top + side, endRow);
        int columnStart = Math.Max(left, 0), columnEnd = Math.Min(left + side, frame.Width);
        float[] r = frame.Red, g = frame.Green, b = frame.Blue;
        for (int row = rowStart; row < rowEnd; row++)
        {
            int kernelRow = (row - top) * side - left, pixelRow = row * frame.Width;
            for (int column = columnStart; column < columnEnd; column++)
            {
                float weight = weights[kernelRow + column];
                r[pixelRow + column] += weight * red;
                g[pixelRow + column] += weight * green;
                b[pixelRow + column] += weight * blue;
            }
        }
    }
}
