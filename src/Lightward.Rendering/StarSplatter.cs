using System.Runtime.Intrinsics;
using Lightward.Optics;
using Lightward.Rendering.Projections;

namespace Lightward.Rendering;

/// <summary>
/// Puts stars on the image: projects their apparent directions to pixels, bins them by the tiles their footprints
/// touch (<see cref="BandHeight"/> rows by <see cref="TileWidth"/> columns: small enough that a tile's three float
/// planes stay in the first-level cache), and splats each row band of tiles on its own thread — into the HDR frame
/// when other stages draw there too, or into a scratch tile tone-mapped straight to the image when the stars are alone.
/// Tiles are a fixed size whatever the thread count and each tile adds its stars in catalogue order, so every pixel
/// sums the same numbers in the same order on any number of cores. A dim star is one bilinear sample; a star whose
/// exposed flux exceeds <see cref="BilinearLimit"/> gets a <see cref="PointSpreadKernels"/> footprint sized by its
/// brightness.
/// Scratch arrays grow with the star count and are then reused, so steady-state frames allocate nothing.
/// </summary>
public sealed class StarSplatter
{
    public const int BandHeight = 16;
    public const int TileWidth = 128;

    /// <summary>Exposed flux above which a single bilinear sample would look like a hard square: use a kernel.</summary>
    public const float BilinearLimit = 1;

    /// <summary>Stars per chunk of the projection loop: a fixed split, so chunk boundaries do not depend on the thread count.</summary>
    private const int ChunkSize = 4096;

    private const byte Hidden = byte.MaxValue, Bilinear = 0;

    private float[] _x = [], _y = [], _radianceScale = [];
    /// <summary>Per star: <see cref="Hidden"/>, <see cref="Bilinear"/>, or kernel size index + 1.</summary>
    private byte[] _footprint = [];
    /// <summary>Per star: the first and last row band and tile column its footprint touches (meaningless for hidden stars).</summary>
    private short[] _firstBand = [], _lastBand = [], _firstTileColumn = [], _lastTileColumn = [];
    /// <summary>Per chunk and tile: first the count of the chunk's stars in the tile, then the tile's write cursor for the chunk.</summary>
    private int[] _chunkTileCursor = [];
    /// <summary>Where each tile's list of stars starts in <see cref="_tileStars"/> (tiles row band by row band).</summary>
    private int[] _tileStart = [];
    /// <summary>Each tile's stars, as indices, tile after tile.</summary>
    private int[] _tileStars = [];
    private int _bandCount, _tilesPerBand, _tileCount;

    private readonly PointSpreadKernels _kernels = PointSpreadKernels.Shared;

    // The frame in flight, kept in fields so the parallel bodies are allocated once.
    private ApparentStars _stars = new();
    private Projection? _projection;
    private AxesTransform _shipToCamera;
    private HdrFrame? _frame;
    private RgbaImage? _image;
    private int _width, _height;
    private float _exposureScale;
    private readonly Action<int> _projectChunk, _assignChunk, _fillChunk, _splatBandIntoFrame, _splatBandIntoImage;

    public StarSplatter()
    {
        _projectChunk = ProjectChunk;
        _assignChunk = AssignFootprints;
        _fillChunk = FillTiles;
        _splatBandIntoFrame = SplatBandIntoFrame;
        _splatBandIntoImage = SplatBandIntoImage;
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
            _firstBand = new short[stars.Count]; _lastBand = new short[stars.Count];
            _firstTileColumn = new short[stars.Count]; _lastTileColumn = new short[stars.Count];
        }
        Parallel.For(0, (stars.Count + ChunkSize - 1) / ChunkSize, parallel, _projectChunk);
    }

    /// <summary>Stage "splat stars": bins the projected stars into tiles, then adds their light to <paramref name="frame"/> (marking the groups it touches).</summary>
    public void Splat(HdrFrame frame, float exposureScale, ParallelOptions parallel)
    {
        Bin(frame.Width, frame.Height, exposureScale, parallel);
        _frame = frame;
        Parallel.For(0, _bandCount, parallel, _splatBandIntoFrame);
    }

    /// <summary>
    /// Stages "splat stars" and "tone map" in one, for a frame that holds nothing but stars: each tile's stars are
    /// added into a scratch tile that stays in the first-level cache and tone-mapped from there straight into
    /// <paramref name="image"/>; groups no star touched are written black. Same bytes as <see cref="Splat"/> followed by
    /// <see cref="ToneMapper.MapAndClearRows"/>, without ever reading or writing a full-frame HDR buffer.
    /// </summary>
    public void SplatAndToneMap(RgbaImage image, float exposureScale, ParallelOptions parallel)
    {
        Bin(image.Width, image.Height, exposureScale, parallel);
        _image = image;
        Parallel.For(0, _bandCount, parallel, _splatBandIntoImage);
    }

    /// <summary>
    /// Adds one star's light (linear RGB flux, already scaled to radiance) centred at (x, y), touching only rows
    /// [<paramref name="firstRow"/>, <paramref name="endRow"/>) and columns [<paramref name="firstColumn"/>, <paramref name="endColumn"/>) (inside the frame).
    /// </summary>
    public unsafe void SplatOne(HdrFrame frame, float x, float y, float red, float green, float blue, int footprint,
        int firstRow, int endRow, int firstColumn, int endColumn)
    {
        fixed (float* r = frame.Red, g = frame.Green, b = frame.Blue)
        fixed (byte* marks = frame.Touched)
            SplatOne(FrameTarget(frame, r, g, b, marks), x, y, red, green, blue, footprint, new TileBounds(firstRow, endRow, firstColumn, endColumn));
    }

    private static unsafe SplatTarget FrameTarget(HdrFrame frame, float* red, float* green, float* blue, byte* marks) =>
        new(red, green, blue, marks, frame.Width, frame.GroupsPerRow, 0, 0);

    private void SplatOne(in SplatTarget target, float x, float y, float red, float green, float blue, int footprint, in TileBounds clip)
    {
        if (footprint == Bilinear) SplatBilinear(target, x, y, red, green, blue, clip);
        else SplatKernel(target, x, y, red, green, blue, footprint - 1, clip);
    }

    /// <summary>Rows [FirstRow, EndRow) and columns [FirstColumn, EndColumn) of one tile.</summary>
    private readonly record struct TileBounds(int FirstRow, int EndRow, int FirstColumn, int EndColumn);

    /// <summary>
    /// Where splats land: three float planes holding a rectangle of the image whose top-left pixel is
    /// (<see cref="OriginRow"/>, <see cref="OriginColumn"/>), <see cref="Stride"/> floats per row, and one mark byte
    /// per <see cref="HdrFrame.GroupWidth"/>-pixel group. The origin column is a multiple of the group width, so the
    /// groups are the image's own.
    /// </summary>
    private readonly unsafe struct SplatTarget(float* red, float* green, float* blue, byte* marks, int stride, int markStride, int originRow, int originColumn)
    {
        public readonly float* Red = red, Green = green, Blue = blue;
        public readonly int Stride = stride, OriginRow = originRow, OriginColumn = originColumn;

        public int Index(int row, int column) => (row - OriginRow) * Stride + column - OriginColumn;

        /// <summary>Marks columns [<paramref name="firstColumn"/>, <paramref name="endColumn"/>) of <paramref name="row"/> (non-empty).</summary>
        public void Mark(int row, int firstColumn, int endColumn)
        {
            byte* rowMarks = marks + (row - OriginRow) * markStride;
            for (int group = (firstColumn - OriginColumn) / HdrFrame.GroupWidth; group <= (endColumn - 1 - OriginColumn) / HdrFrame.GroupWidth; group++)
                rowMarks[group] = 1;
        }
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

    /// <summary>
    /// Hides stars off the image, picks each visible star's footprint from its exposed flux, notes the tiles the
    /// footprint touches and counts the chunk's stars per tile.
    /// </summary>
    private void AssignFootprints(int chunk)
    {
        float[] red = _stars.R, green = _stars.G, blue = _stars.B;
        float exposureScale = _exposureScale;
        int height = _height, width = _width, start = chunk * ChunkSize, end = Math.Min(_stars.Count, start + ChunkSize);
        int cursors = chunk * _tileCount;
        for (int i = start; i < end; i++)
        {
            float y = _y[i];
            float luminance = ColorWeights.Red * red[i] + ColorWeights.Green * green[i] + ColorWeights.Blue * blue[i];
            if (float.IsNaN(_x[i]) || y < -Projection.StarMargin || y > height + Projection.StarMargin || !(luminance > 0))
            {
                _footprint[i] = Hidden;
                continue;
            }
            int footprint = FootprintFor(luminance * _radianceScale[i] * exposureScale);
            int radius = footprint == Bilinear ? 0 : PointSpreadKernels.Radii[footprint - 1];
            // A bilinear sample covers rows floor(y − ½) and the one below; a kernel, its radius around floor(y).
            int firstRow = footprint == Bilinear ? (int)MathF.Floor(y - 0.5f) : (int)MathF.Floor(y) - radius;
            int lastRow = footprint == Bilinear ? firstRow + 1 : (int)MathF.Floor(y) + radius;
            int firstColumn = footprint == Bilinear ? (int)MathF.Floor(_x[i] - 0.5f) : (int)MathF.Floor(_x[i]) - radius;
            int lastColumn = footprint == Bilinear ? firstColumn + 1 : (int)MathF.Floor(_x[i]) + radius;
            if (lastRow < 0 || firstRow >= height || lastColumn < 0 || firstColumn >= width)
            {
                _footprint[i] = Hidden;
                continue;
            }
            _footprint[i] = (byte)footprint;
            int firstBand = Math.Max(firstRow, 0) / BandHeight, lastBand = Math.Min(lastRow, height - 1) / BandHeight;
            int firstTile = Math.Max(firstColumn, 0) / TileWidth, lastTile = Math.Min(lastColumn, width - 1) / TileWidth;
            _firstBand[i] = (short)firstBand;
            _lastBand[i] = (short)lastBand;
            _firstTileColumn[i] = (short)firstTile;
            _lastTileColumn[i] = (short)lastTile;
            for (int band = firstBand; band <= lastBand; band++)
                for (int tile = firstTile; tile <= lastTile; tile++) _chunkTileCursor[cursors + band * _tilesPerBand + tile]++;
        }
    }

    /// <summary>
    /// Turns the per-chunk tile counts into write positions: each tile's list holds chunk 0's stars, then chunk 1's…,
    /// so every tile lists its stars in catalogue order whatever the thread count.
    /// </summary>
    private void PlaceTiles(int chunks)
    {
        if (_tileStart.Length < _tileCount + 1) _tileStart = new int[_tileCount + 1];
        int total = 0;
        for (int tile = 0; tile < _tileCount; tile++)
        {
            _tileStart[tile] = total;
            for (int chunk = 0; chunk < chunks; chunk++)
            {
                int count = _chunkTileCursor[chunk * _tileCount + tile];
                _chunkTileCursor[chunk * _tileCount + tile] = total;
                total += count;
            }
        }
        _tileStart[_tileCount] = total;
        if (_tileStars.Length < total) _tileStars = new int[Math.Max(total, _tileStars.Length * 2)];
    }

    private void FillTiles(int chunk)
    {
        int start = chunk * ChunkSize, end = Math.Min(_stars.Count, start + ChunkSize), cursors = chunk * _tileCount;
        for (int i = start; i < end; i++)
        {
            if (_footprint[i] == Hidden) continue;
            for (int band = _firstBand[i]; band <= _lastBand[i]; band++)
                for (int tile = _firstTileColumn[i]; tile <= _lastTileColumn[i]; tile++)
                    _tileStars[_chunkTileCursor[cursors + band * _tilesPerBand + tile]++] = i;
        }
    }

    /// <summary>Bins the projected stars: footprints from the exposure, then each tile's list of stars in catalogue order.</summary>
    private void Bin(int width, int height, float exposureScale, ParallelOptions parallel)
    {
        _width = width;
        _height = height;
        _exposureScale = exposureScale;
        _bandCount = (height + BandHeight - 1) / BandHeight;
        _tilesPerBand = (width + TileWidth - 1) / TileWidth;
        _tileCount = _bandCount * _tilesPerBand;
        int chunks = (_stars.Count + ChunkSize - 1) / ChunkSize;
        if (_chunkTileCursor.Length < chunks * _tileCount) _chunkTileCursor = new int[chunks * _tileCount];
        Array.Clear(_chunkTileCursor, 0, chunks * _tileCount);
        Parallel.For(0, chunks, parallel, _assignChunk);
        PlaceTiles(chunks);
        Parallel.For(0, chunks, parallel, _fillChunk);
    }

    private TileBounds Tile(int band, int tileColumn)
    {
        int firstRow = band * BandHeight, firstColumn = tileColumn * TileWidth;
        return new TileBounds(firstRow, Math.Min(_height, firstRow + BandHeight), firstColumn, Math.Min(_width, firstColumn + TileWidth));
    }

    private void SplatTile(in SplatTarget target, int band, int tileColumn, in TileBounds clip)
    {
        int tile = band * _tilesPerBand + tileColumn;
        float[] red = _stars.R, green = _stars.G, blue = _stars.B, x = _x, y = _y, radianceScale = _radianceScale;
        int[] tileStars = _tileStars;
        for (int entry = _tileStart[tile]; entry < _tileStart[tile + 1]; entry++)
        {
            int i = tileStars[entry];
            float scale = radianceScale[i];
            SplatOne(target, x[i], y[i], red[i] * scale, green[i] * scale, blue[i] * scale, _footprint[i], clip);
        }
    }

    /// <summary>One row band of the HDR frame, tile by tile: each tile's stars clipped to the tile.</summary>
    private unsafe void SplatBandIntoFrame(int band)
    {
        HdrFrame frame = _frame!;
        fixed (float* red = frame.Red, green = frame.Green, blue = frame.Blue)
        fixed (byte* marks = frame.Touched)
        {
            SplatTarget target = FrameTarget(frame, red, green, blue, marks);
            for (int tileColumn = 0; tileColumn < _tilesPerBand; tileColumn++) SplatTile(target, band, tileColumn, Tile(band, tileColumn));
        }
    }

    /// <summary>One row band of the image, tile by tile: splat into the scratch tile, tone map the touched groups, black elsewhere.</summary>
    private unsafe void SplatBandIntoImage(int band)
    {
        const int TilePixels = BandHeight * TileWidth, GroupsPerTileRow = TileWidth / HdrFrame.GroupWidth;
        // The scratch tile is all zeros between tiles: the tone map zeroes what it reads, and nothing else was written.
        float* scratch = stackalloc float[3 * TilePixels];
        byte* marks = stackalloc byte[BandHeight * GroupsPerTileRow];
        new Span<float>(scratch, 3 * TilePixels).Clear();
        new Span<byte>(marks, BandHeight * GroupsPerTileRow).Clear();
        fixed (byte* pixels = _image!.Pixels)
        {
            uint* rgba = (uint*)pixels;
            for (int tileColumn = 0; tileColumn < _tilesPerBand; tileColumn++)
            {
                TileBounds clip = Tile(band, tileColumn);
                var target = new SplatTarget(scratch, scratch + TilePixels, scratch + 2 * TilePixels, marks, TileWidth, GroupsPerTileRow, clip.FirstRow, clip.FirstColumn);
                SplatTile(target, band, tileColumn, clip);
                for (int row = clip.FirstRow; row < clip.EndRow; row++)
                {
                    int at = (row - clip.FirstRow) * TileWidth;
                    ToneMapper.MapMarkedRow(scratch + at, scratch + TilePixels + at, scratch + 2 * TilePixels + at, marks + (row - clip.FirstRow) * GroupsPerTileRow,
                        rgba + (long)row * _width + clip.FirstColumn, clip.EndColumn - clip.FirstColumn, _exposureScale);
                }
            }
        }
    }

    private static unsafe void SplatBilinear(in SplatTarget target, float x, float y, float red, float green, float blue, in TileBounds clip)
    {
        float fx = x - 0.5f, fy = y - 0.5f;
        int left = (int)MathF.Floor(fx), top = (int)MathF.Floor(fy);
        float ax = fx - left, ay = fy - top;
        if (left >= clip.FirstColumn && left + 2 <= clip.EndColumn && top >= clip.FirstRow && top + 2 <= clip.EndRow)
        {
            // The common case, wholly inside the tile: four weights, the same products as the general loop below.
            int index = target.Index(top, left), below = index + target.Stride;
            AddPair(target.Red, index, below, ax, ay, red);
            AddPair(target.Green, index, below, ax, ay, green);
            AddPair(target.Blue, index, below, ax, ay, blue);
            target.Mark(top, left, left + 2);
            target.Mark(top + 1, left, left + 2);
            return;
        }
        int columnStart = Math.Max(left, clip.FirstColumn), columnEnd = Math.Min(left + 2, clip.EndColumn);
        if (columnStart >= columnEnd) return;
        for (int row = Math.Max(top, clip.FirstRow); row <= top + 1 && row < clip.EndRow; row++)
        {
            target.Mark(row, columnStart, columnEnd);
            float rowWeight = row == top ? 1 - ay : ay;
            for (int column = columnStart; column < columnEnd; column++)
            {
                float weight = rowWeight * (column == left ? 1 - ax : ax);
                int index = target.Index(row, column);
                target.Red[index] += weight * red;
                target.Green[index] += weight * green;
                target.Blue[index] += weight * blue;
            }
        }
    }

    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static unsafe void AddPair(float* plane, int index, int below, float ax, float ay, float value)
    {
        plane[index] += (1 - ay) * (1 - ax) * value;
        plane[index + 1] += (1 - ay) * ax * value;
        plane[below] += ay * (1 - ax) * value;
        plane[below + 1] += ay * ax * value;
    }

    private unsafe void SplatKernel(in SplatTarget target, float x, float y, float red, float green, float blue, int size, in TileBounds clip)
    {
        int radius = PointSpreadKernels.Radii[size], side = 2 * radius + 1;
        int centreColumn = (int)MathF.Floor(x), centreRow = (int)MathF.Floor(y);
        float[] weights = _kernels.Weights(size, PointSpreadKernels.PhaseOf(x - centreColumn), PointSpreadKernels.PhaseOf(y - centreRow));
        int top = centreRow - radius, left = centreColumn - radius;
        int rowStart = Math.Max(top, clip.FirstRow), rowEnd = Math.Min(top + side, clip.EndRow);
        int columnStart = Math.Max(left, clip.FirstColumn), columnEnd = Math.Min(left + side, clip.EndColumn);
        if (columnStart >= columnEnd) return;
        var redVector = Vector256.Create(red);
        var greenVector = Vector256.Create(green);
        var blueVector = Vector256.Create(blue);
        fixed (float* kernel = weights)
            for (int row = rowStart; row < rowEnd; row++)
            {
                target.Mark(row, columnStart, columnEnd);
                float* weightRow = kernel + (row - top) * side - left;
                int pixelRow = target.Index(row, 0), column = columnStart;
                // Eight columns at a time, the same product and sum per pixel as the scalar tail.
                for (; column + Vector256<float>.Count <= columnEnd; column += Vector256<float>.Count)
                {
                    Vector256<float> weight = Vector256.Load(weightRow + column);
                    AddScaled(target.Red + pixelRow + column, weight, redVector);
                    AddScaled(target.Green + pixelRow + column, weight, greenVector);
                    AddScaled(target.Blue + pixelRow + column, weight, blueVector);
                }
                for (; column < columnEnd; column++)
                {
                    float weight = weightRow[column];
                    target.Red[pixelRow + column] += weight * red;
                    target.Green[pixelRow + column] += weight * green;
                    target.Blue[pixelRow + column] += weight * blue;
                }
            }
    }

    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static unsafe void AddScaled(float* pixels, Vector256<float> weight, Vector256<float> value) =>
        Vector256.Store(Vector256.Load(pixels) + weight * value, pixels);
}
