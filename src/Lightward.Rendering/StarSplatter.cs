using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using Lightward.Optics;
using Lightward.Rendering.Projections;
using Lightward.Spacetime;

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
    public const int BandHeight = 1 << BandShift;
    public const int TileWidth = 1 << TileShift;
    private const int BandShift = 4, TileShift = 7;
    /// <summary>Packing of a footprint's extent in tiles: band span in the high four bits, column span in the low four (a kernel reaches at most 129 px).</summary>
    private const int SpanShift = 4, ColumnSpanMask = 0xF;

    /// <summary>Exposed flux above which a single bilinear sample would look like a hard square: use a kernel.</summary>
    public const float BilinearLimit = 1;

    /// <summary>
    /// The star passes (projection, footprints, binning) split the stars into about this many chunks, so that both
    /// cores end each pass together (five 4096-star chunks left one core a chunk behind); the split depends on the star
    /// count alone, never on the thread count, and every tile still lists its stars in catalogue order. Since each
    /// core keeps to its own run of chunks from pass to pass (see <see cref="ParallelItems"/>), 8 did as well as 16
    /// and halved the per-chunk tile counts that <see cref="PlaceTiles"/> reads on one thread (the 1080p star frame
    /// 0.98× in one process).
    /// </summary>
    private const int ChunksPerPass = 8;
    private const int MinChunkSize = 1024, MaxChunkSize = 8192;

    /// <summary>Stars per chunk this frame: a multiple of the vector width.</summary>
    private int _chunkSize = MinChunkSize;

    private const byte Hidden = byte.MaxValue, Bilinear = 0;

    private float[] _x = [], _y = [], _radianceScale = [];
    /// <summary>Per star: luminance × radiance scale, the brightness it lends a pixel before exposure; 0 when it cannot show.</summary>
    private float[] _pixelLuminance = [];
    /// <summary>
    /// Per thread of the projection: the levels of its stars that land on the image, merged into
    /// <see cref="StarLevels"/> when the thread is done. Counts add up the same in any order, so the merged histogram
    /// does not depend on which thread took which stars; one per chunk, each cleared and merged, took 3 % of the
    /// 1080p star frame.
    /// </summary>
    private readonly ScratchPool<LevelHistogram> _threadLevels = new(() => new LevelHistogram());
    /// <summary>Per star: <see cref="Hidden"/>, <see cref="Bilinear"/>, or kernel size index + 1.</summary>
    private byte[] _footprint = [];
    /// <summary>
    /// Per star (meaningless for hidden ones): the first tile its footprint touches, and how many more row bands
    /// (high four bits) and tile columns (low four) it reaches.
    /// </summary>
    private int[] _firstTile = [];
    private byte[] _tileSpan = [];
    /// <summary>Per chunk and tile: first the count of the chunk's stars in the tile, then the tile's write cursor for the chunk.</summary>
    private int[] _chunkTileCursor = [];
    /// <summary>Where each tile's list of stars starts in <see cref="_tileStars"/> (tiles row band by row band).</summary>
    private int[] _tileStart = [];
    /// <summary>Each tile's stars, tile after tile, packed so that a tile reads its stars in one sequential sweep.</summary>
    private SplatRecord[] _tileStars = [];
    private int _bandCount, _tilesPerBand, _tileCount;
    /// <summary>Entries per chunk in <see cref="_chunkTileCursor"/>: the tile count rounded up to whole vectors, so tiles are placed a vector at a time.</summary>
    private int _tileStride;

    private readonly PointSpreadKernels _kernels = PointSpreadKernels.Shared;

    // The frame in flight, kept in fields so the parallel bodies are allocated once.
    private ApparentStars _stars = new();
    private Projection? _projection;
    private AxesTransform _shipToCamera;
    private HdrFrame? _frame;
    private RgbaImage? _image;
    /// <summary>Whether <see cref="_image"/>'s note of lit groups held when this frame's tone map began.</summary>
    private bool _litKnown;
    private int _width, _height;
    private float _exposureScale;
    private readonly Action<int> _assignChunk, _fillChunk, _splatBandIntoFrame;
    private readonly Func<int, bool, bool> _splatBandIntoImage;
    private readonly Func<LevelHistogram> _startLevels;
    private readonly Func<int, LevelHistogram, LevelHistogram> _projectChunk;
    private readonly Action<LevelHistogram> _mergeLevels;

    public StarSplatter()
    {
        _startLevels = StartLevels;
        _projectChunk = ProjectChunk;
        _mergeLevels = MergeLevels;
        _assignChunk = AssignFootprints;
        _fillChunk = FillTiles;
        _splatBandIntoFrame = SplatBandIntoFrame;
        _splatBandIntoImage = (band, _) =>
        {
            SplatBandIntoImage(band);
            return true;
        };
    }

    /// <summary>
    /// From the last <see cref="Project"/>: the pixel brightness (luminance × radiance scale, before exposure) of every
    /// star that lands on the image, for the exposure meter.
    /// </summary>
    public LevelHistogram StarLevels { get; } = new();

    /// <summary>Stage "projection": apparent directions (ship axes) → camera axes → pixel positions.</summary>
    public void Project(ApparentStars stars, AxesTransform shipToCamera, Projection projection, ParallelOptions parallel)
    {
        _stars = stars;
        _shipToCamera = shipToCamera;
        _projection = projection;
        if (_x.Length < stars.Count)
        {
            _x = new float[stars.Count]; _y = new float[stars.Count]; _radianceScale = new float[stars.Count];
            _pixelLuminance = new float[stars.Count];
            _footprint = new byte[stars.Count];
            _firstTile = new int[stars.Count]; _tileSpan = new byte[stars.Count];
        }
        _chunkSize = Math.Clamp((stars.Count / ChunksPerPass + Vector<float>.Count) & -Vector<float>.Count, MinChunkSize, MaxChunkSize);
        int chunks = (stars.Count + _chunkSize - 1) / _chunkSize;
        StarLevels.Clear();
        ParallelItems.For(0, chunks, parallel, _startLevels, _projectChunk, _mergeLevels);
    }

    private LevelHistogram StartLevels()
    {
        LevelHistogram levels = _threadLevels.Rent();
        levels.Clear();
        return levels;
    }

    private void MergeLevels(LevelHistogram levels)
    {
        lock (StarLevels) StarLevels.Add(levels);
        _threadLevels.Return(levels);
    }

    /// <summary>Stage "splat stars": bins the projected stars into tiles, then adds their light to <paramref name="frame"/> (marking the groups it touches).</summary>
    public void Splat(HdrFrame frame, float exposureScale, ParallelOptions parallel)
    {
        Bin(frame.Width, frame.Height, exposureScale, parallel);
        _frame = frame;
        ParallelItems.For(0, _bandCount, parallel, _splatBandIntoFrame);
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
        _litKnown = image.LitGroupsKnown;
        image.LitGroupsKnown = false; // until every band is written
        // Each thread fences its non-temporal writes once, when it has no more bands (once per band was about 1 % slower).
        ParallelItems.For(0, _bandCount, parallel, static () => true, _splatBandIntoImage, static _ => ToneMapper.FinishWrites());
        image.LitGroupsKnown = true;
    }

    /// <summary>
    /// Stage "splat stars" for a frame whose layers are composited band by band: bins the projected stars into tiles,
    /// after which <see cref="SplatBand"/> adds each row band's stars into a buffer of that band's own.
    /// </summary>
    public void BinForBands(int width, int height, float exposureScale, ParallelOptions parallel) => Bin(width, height, exposureScale, parallel);

    /// <summary>
    /// Adds the stars of row band <paramref name="band"/> (rows from <paramref name="band"/> × <see cref="BandHeight"/>,
    /// binned by <see cref="BinForBands"/>) into <paramref name="buffer"/>, whose row 0 is the band's first row,
    /// marking the groups they touch: the same sums in the same order as <see cref="Splat"/>.
    /// </summary>
    public void SplatBand(HdrFrame buffer, int band) => SplatBandInto(buffer, band * BandHeight, band);

    /// <summary>
    /// Adds one star's light (linear RGB flux, already scaled to radiance) centred at (x, y), touching only rows
    /// [<paramref name="firstRow"/>, <paramref name="endRow"/>) and columns [<paramref name="firstColumn"/>, <paramref name="endColumn"/>) (inside the frame).
    /// </summary>
    public unsafe void SplatOne(HdrFrame frame, float x, float y, float red, float green, float blue, int footprint,
        int firstRow, int endRow, int firstColumn, int endColumn)
    {
        fixed (float* r = frame.Red, g = frame.Green, b = frame.Blue)
        fixed (byte* marks = frame.Touched)
            SplatOne(FrameTarget(frame, r, g, b, marks), SplatRecord.At(x, y, red, green, blue, footprint), new TileBounds(firstRow, endRow, firstColumn, endColumn));
    }

    private static unsafe SplatTarget FrameTarget(HdrFrame frame, float* red, float* green, float* blue, byte* marks) =>
        new(red, green, blue, marks, frame.Width, frame.GroupsPerRow, 0, 0);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void SplatOne(in SplatTarget target, in SplatRecord star, in TileBounds clip)
    {
        if (star.Footprint == Bilinear) SplatBilinear(target, star, clip);
        else SplatKernel(target, star, clip);
    }

    /// <summary>
    /// One star as a tile splats it: the pixel its footprint is anchored at (a bilinear sample's top-left, a kernel's
    /// centre), the star's offset from that pixel, its flux already scaled to radiance, and its footprint code.
    /// Positions are whole pixels here once, so the tiles a star touches need no float-to-int conversions.
    /// </summary>
    private readonly record struct SplatRecord(float OffsetX, float OffsetY, float Red, float Green, float Blue, short Column, short Row, byte Footprint)
    {
        /// <summary>Columns and rows fit in a short: images are at most 16384 px and stars at most <see cref="Projection.StarMargin"/> outside.</summary>
        public static SplatRecord At(float x, float y, float red, float green, float blue, int footprint)
        {
            // A bilinear sample covers the 2×2 pixels from floor(x − ½), floor(y − ½); a kernel centres on floor(x), floor(y).
            float anchorX = footprint == Bilinear ? x - 0.5f : x, anchorY = footprint == Bilinear ? y - 0.5f : y;
            int column = FloorToInt(anchorX), row = FloorToInt(anchorY);
            return new SplatRecord(anchorX - column, anchorY - row, red, green, blue, (short)column, (short)row, (byte)footprint);
        }
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

        /// <summary>Marks the 2×2 pixels from (<paramref name="row"/>, <paramref name="column"/>), all inside the target.</summary>
        public void MarkSquare(int row, int column)
        {
            byte* rowMarks = marks + (row - OriginRow) * markStride;
            uint left = (uint)(column - OriginColumn) / HdrFrame.GroupWidth, right = (uint)(column + 1 - OriginColumn) / HdrFrame.GroupWidth;
            rowMarks[left] = rowMarks[right] = rowMarks[left + markStride] = rowMarks[right + markStride] = 1;
        }

        /// <summary>Marks columns [<paramref name="firstColumn"/>, <paramref name="endColumn"/>) of <paramref name="row"/> (non-empty).</summary>
        public void Mark(int row, int firstColumn, int endColumn)
        {
            byte* rowMarks = marks + (row - OriginRow) * markStride;
            // Columns never lie left of the origin, so unsigned division: a shift.
            uint lastGroup = (uint)(endColumn - 1 - OriginColumn) / HdrFrame.GroupWidth;
            for (uint group = (uint)(firstColumn - OriginColumn) / HdrFrame.GroupWidth; group <= lastGroup; group++)
                rowMarks[group] = 1;
        }
    }

    /// <summary>The footprint code for a star of exposed flux <paramref name="exposedFlux"/>: 0 bilinear, else kernel size + 1.</summary>
    public int FootprintFor(float exposedFlux) =>
        exposedFlux <= BilinearLimit ? Bilinear : _kernels.SizeFor(exposedFlux) + 1;

    private LevelHistogram ProjectChunk(int chunk, LevelHistogram levels)
    {
        int start = chunk * _chunkSize, count = Math.Min(_chunkSize, _stars.Count - start);
        Span<float> cameraX = stackalloc float[count], cameraY = stackalloc float[count], cameraZ = stackalloc float[count];
        _shipToCamera.Apply(_stars.X.AsSpan(start, count), _stars.Y.AsSpan(start, count), _stars.Z.AsSpan(start, count), cameraX, cameraY, cameraZ);
        _projection!.ProjectDirections(cameraX, cameraY, cameraZ, _x.AsSpan(start, count), _y.AsSpan(start, count), _radianceScale.AsSpan(start, count));
        MeasureLevels(levels, start, start + count);
        return levels;
    }

    /// <summary>
    /// Each star's pixel luminance (0 when it is off the image or dark), those landing on the image counted in
    /// <paramref name="levels"/>: a vector of stars at a time, then the rest one by one with the same arithmetic.
    /// </summary>
    private void MeasureLevels(LevelHistogram levels, int start, int end)
    {
        float[] red = _stars.R, green = _stars.G, blue = _stars.B;
        float width = _projection!.Width, height = _projection.Height;
        Vector<float> redWeight = new(ColorWeights.Red), greenWeight = new(ColorWeights.Green), blueWeight = new(ColorWeights.Blue);
        Vector<float> right = new(width), bottom = new(height);
        int i = start;
        for (; i <= end - Vector<float>.Count; i += Vector<float>.Count)
        {
            Vector<float> x = new Vector<float>(_x, i), y = new Vector<float>(_y, i);
            Vector<float> luminance = redWeight * new Vector<float>(red, i) + greenWeight * new Vector<float>(green, i) + blueWeight * new Vector<float>(blue, i);
            // x == x is false for NaN (off the image).
            Vector<int> shows = Vector.Equals(x, x) & Vector.GreaterThan(luminance, Vector<float>.Zero);
            Vector<float> level = Vector.ConditionalSelect(shows, luminance * new Vector<float>(_radianceScale, i), Vector<float>.Zero);
            level.CopyTo(_pixelLuminance, i);
            Vector<int> onImage = Vector.GreaterThanOrEqual(x, Vector<float>.Zero) & Vector.LessThan(x, right)
                & Vector.GreaterThanOrEqual(y, Vector<float>.Zero) & Vector.LessThan(y, bottom);
            if (onImage == Vector<int>.Zero) continue;
            if (Vector<float>.Count == Vector256<float>.Count) levels.Add(level.AsVector256(), LaneMask(onImage));
            else
                for (int lane = 0; lane < Vector<float>.Count; lane++)
                    if (onImage[lane] != 0) levels.Add(level[lane]);
        }
        for (; i < end; i++)
        {
            float x = _x[i], y = _y[i];
            float luminance = ColorWeights.Red * red[i] + ColorWeights.Green * green[i] + ColorWeights.Blue * blue[i];
            _pixelLuminance[i] = !float.IsNaN(x) && luminance > 0 ? luminance * _radianceScale[i] : 0;
            if (x >= 0 && x < width && y >= 0 && y < height) levels.Add(_pixelLuminance[i]); // false for NaN x
        }
    }

    /// <summary>
    /// Hides stars off the image, picks each visible star's footprint from its exposed flux, notes the tiles the
    /// footprint touches and counts the chunk's stars per tile. Runs of stars that are all bilinear or hidden (nearly
    /// all of them) are placed a vector at a time; a vector holding a kernel star goes star by star.
    /// </summary>
    private void AssignFootprints(int chunk)
    {
        int start = chunk * _chunkSize, end = Math.Min(_stars.Count, start + _chunkSize), cursors = chunk * _tileStride;
        Vector<float> exposureScale = new(_exposureScale), bilinearLimit = new(BilinearLimit), half = new(0.5f);
        Vector<int> lastRow = new(_height - 1), lastColumn = new(_width - 1), tilesPerBand = new(_tilesPerBand);
        int i = start;
        for (; i <= end - Vector<float>.Count; i += Vector<float>.Count)
        {
            Vector<float> level = new Vector<float>(_pixelLuminance, i);
            Vector<int> shows = Vector.GreaterThan(level, Vector<float>.Zero);
            if ((shows & Vector.GreaterThan(level * exposureScale, bilinearLimit)) != Vector<int>.Zero)
            {
                for (int star = i; star < i + Vector<float>.Count; star++) AssignStar(star, cursors);
                continue;
            }
            // A bilinear sample covers rows floor(y − ½) and the one below, columns likewise (as SplatRecord.At anchors it).
            Vector<int> top = Vector.ConvertToInt32(Vector.Floor(new Vector<float>(_y, i) - half));
            Vector<int> left = Vector.ConvertToInt32(Vector.Floor(new Vector<float>(_x, i) - half));
            shows &= Vector.GreaterThanOrEqual(top, new Vector<int>(-1)) & Vector.LessThanOrEqual(top, lastRow)
                & Vector.GreaterThanOrEqual(left, new Vector<int>(-1)) & Vector.LessThanOrEqual(left, lastColumn);
            Vector<int> firstBand = Vector.ShiftRightArithmetic(Vector.Max(top, Vector<int>.Zero), BandShift);
            Vector<int> firstTileColumn = Vector.ShiftRightArithmetic(Vector.Max(left, Vector<int>.Zero), TileShift);
            Vector<int> bandSpan = Vector.ShiftRightArithmetic(Vector.Min(top + Vector<int>.One, lastRow), BandShift) - firstBand;
            Vector<int> columnSpan = Vector.ShiftRightArithmetic(Vector.Min(left + Vector<int>.One, lastColumn), TileShift) - firstTileColumn;
            Vector<int> firstTile = firstBand * tilesPerBand + firstTileColumn;
            Vector<int> span = Vector.ShiftLeft(bandSpan, SpanShift) | columnSpan;
            // Every lane's notes in a store or two (a hidden star's tiles are never read), then the shown stars counted
            // in their tiles: lane by lane, the vectors went to the stack and back once per lane, each reload waiting
            // on the store before it.
            StoreLowBytes(Vector.AndNot(new Vector<int>(Hidden), shows), _footprint, i);
            firstTile.CopyTo(_firstTile, i);
            StoreLowBytes(span, _tileSpan, i);
            for (uint lanes = LaneMask(shows); lanes != 0; lanes &= lanes - 1)
            {
                int star = i + BitOperations.TrailingZeroCount(lanes);
                Count(_firstTile[star], _tileSpan[star], cursors);
            }
        }
        for (; i < end; i++) AssignStar(i, cursors);
    }

    /// <summary>The low byte of each lane of <paramref name="values"/>, into <paramref name="bytes"/> from <paramref name="at"/>.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static void StoreLowBytes(Vector<int> values, byte[] bytes, int at)
    {
        // Narrowing keeps the low bytes in lane order: the first Vector<int>.Count bytes are the lanes'.
        Vector<short> halves = Vector.Narrow(values, values);
        Vector<byte> lowBytes = Vector.AsVectorByte(Vector.Narrow(halves, halves));
        if (Vector<int>.Count == sizeof(ulong)) MemoryMarshal.Write(bytes.AsSpan(at, sizeof(ulong)), Vector.AsVectorUInt64(lowBytes)[0]);
        else
            for (int lane = 0; lane < Vector<int>.Count; lane++) bytes[at + lane] = lowBytes[lane];
    }

    /// <summary>Bit k set when lane k of <paramref name="mask"/> is set (all ones).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static uint LaneMask(Vector<int> mask)
    {
        if (Vector<int>.Count == Vector256<int>.Count) return mask.AsVector256().ExtractMostSignificantBits();
        uint lanes = 0;
        for (int lane = 0; lane < Vector<int>.Count; lane++)
            if (mask[lane] != 0) lanes |= 1u << lane;
        return lanes;
    }

    /// <summary><see cref="AssignFootprints"/> for one star.</summary>
    private void AssignStar(int i, int cursors)
    {
        if (!(_pixelLuminance[i] > 0))
        {
            _footprint[i] = Hidden;
            return;
        }
        int footprint = FootprintFor(_pixelLuminance[i] * _exposureScale);
        SplatRecord anchor = SplatRecord.At(_x[i], _y[i], 0, 0, 0, footprint);
        // A bilinear sample covers its anchor pixel and the next; a kernel, its radius around the anchor.
        int before = footprint == Bilinear ? 0 : PointSpreadKernels.Radii[footprint - 1], after = footprint == Bilinear ? 1 : before;
        int firstRow = anchor.Row - before, lastRow = anchor.Row + after, firstColumn = anchor.Column - before, lastColumn = anchor.Column + after;
        if (lastRow < 0 || firstRow >= _height || lastColumn < 0 || firstColumn >= _width)
        {
            _footprint[i] = Hidden;
            return;
        }
        _footprint[i] = (byte)footprint;
        int firstBand = Math.Max(firstRow, 0) >> BandShift, lastBand = Math.Min(lastRow, _height - 1) >> BandShift;
        int firstTileColumn = Math.Max(firstColumn, 0) >> TileShift, lastTileColumn = Math.Min(lastColumn, _width - 1) >> TileShift;
        Place(i, firstBand * _tilesPerBand + firstTileColumn, (lastBand - firstBand) << SpanShift | (lastTileColumn - firstTileColumn), cursors);
    }

    /// <summary>Notes star <paramref name="i"/>'s tiles (first tile, band and column span) and counts it in each.</summary>
    private void Place(int i, int firstTile, int span, int cursors)
    {
        _firstTile[i] = firstTile;
        _tileSpan[i] = (byte)span;
        Count(firstTile, span, cursors);
    }

    /// <summary>Counts a star in each tile it touches, from <paramref name="firstTile"/> over <paramref name="span"/>.</summary>
    private void Count(int firstTile, int span, int cursors)
    {
        // Nearly every star lies in one tile: counted without the loops, whose exits would be guessed per star.
        if (span == 0)
        {
            _chunkTileCursor[cursors + firstTile]++;
            return;
        }
        for (int band = 0; band <= span >> SpanShift; band++)
            for (int column = 0; column <= (span & ColumnSpanMask); column++)
                _chunkTileCursor[cursors + firstTile + band * _tilesPerBand + column]++;
    }

    /// <summary>
    /// Turns the per-chunk tile counts into write positions: each tile's list holds chunk 0's stars, then chunk 1's…,
    /// so every tile lists its stars in catalogue order whatever the thread count. A vector of tiles at a time, since
    /// this runs on one thread between the parallel passes (one tile at a time it took 2 % of the 1080p star frame).
    /// </summary>
    private void PlaceTiles(int chunks)
    {
        if (_tileStart.Length < _tileStride + 1) _tileStart = new int[_tileStride + 1];
        Span<int> counts = _chunkTileCursor.AsSpan(0, chunks * _tileStride), starts = _tileStart;
        // Each tile's star count, summed over the chunks (the padding tiles count none)…
        for (int tile = 0; tile < _tileStride; tile += Vector<int>.Count)
        {
            Vector<int> count = Vector<int>.Zero;
            for (int chunk = 0; chunk < chunks; chunk++) count += new Vector<int>(counts[(chunk * _tileStride + tile)..]);
            count.CopyTo(starts[tile..]);
        }
        // …where each tile's list starts…
        int total = 0;
        for (int tile = 0; tile < _tileCount; tile++)
        {
            int count = starts[tile];
            starts[tile] = total;
            total += count;
        }
        starts[_tileCount] = total;
        // …and where each chunk's stars go in it.
        for (int tile = 0; tile < _tileStride; tile += Vector<int>.Count)
        {
            Vector<int> cursor = new(starts[tile..]);
            for (int chunk = 0; chunk < chunks; chunk++)
            {
                Span<int> at = counts[(chunk * _tileStride + tile)..];
                Vector<int> count = new(at);
                cursor.CopyTo(at);
                cursor += count;
            }
        }
        if (_tileStars.Length < total) _tileStars = new SplatRecord[Math.Max(total, _tileStars.Length * 2)];
    }

    private void FillTiles(int chunk)
    {
        float[] red = _stars.R, green = _stars.G, blue = _stars.B;
        int start = chunk * _chunkSize, end = Math.Min(_stars.Count, start + _chunkSize), cursors = chunk * _tileStride;
        for (int i = start; i < end; i++)
        {
            if (_footprint[i] == Hidden) continue;
            float scale = _radianceScale[i];
            SplatRecord star = SplatRecord.At(_x[i], _y[i], red[i] * scale, green[i] * scale, blue[i] * scale, _footprint[i]);
            int firstTile = _firstTile[i], span = _tileSpan[i];
            if (span == 0)
            {
                _tileStars[_chunkTileCursor[cursors + firstTile]++] = star;
                continue;
            }
            for (int band = 0; band <= span >> SpanShift; band++)
                for (int column = 0; column <= (span & ColumnSpanMask); column++)
                    _tileStars[_chunkTileCursor[cursors + firstTile + band * _tilesPerBand + column]++] = star;
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
        _tileStride = (_tileCount + Vector<int>.Count - 1) & -Vector<int>.Count;
        int chunks = (_stars.Count + _chunkSize - 1) / _chunkSize;
        if (_chunkTileCursor.Length < chunks * _tileStride) _chunkTileCursor = new int[chunks * _tileStride];
        Array.Clear(_chunkTileCursor, 0, chunks * _tileStride);
        ParallelItems.For(0, chunks, parallel, _assignChunk);
        PlaceTiles(chunks);
        ParallelItems.For(0, chunks, parallel, _fillChunk);
    }

    private TileBounds Tile(int band, int tileColumn)
    {
        int firstRow = band * BandHeight, firstColumn = tileColumn * TileWidth;
        return new TileBounds(firstRow, Math.Min(_height, firstRow + BandHeight), firstColumn, Math.Min(_width, firstColumn + TileWidth));
    }

    private void SplatTile(in SplatTarget target, int band, int tileColumn, in TileBounds clip)
    {
        int tile = band * _tilesPerBand + tileColumn;
        SplatRecord[] tileStars = _tileStars;
        for (int entry = _tileStart[tile]; entry < _tileStart[tile + 1]; entry++)
        {
            SplatOne(target, tileStars[entry], clip);
        }
    }

    /// <summary>One row band of the HDR frame, tile by tile: each tile's stars clipped to the tile.</summary>
    private void SplatBandIntoFrame(int band) => SplatBandInto(_frame!, 0, band);

    /// <summary>Row band <paramref name="band"/>'s stars, tile by tile, into <paramref name="target"/>, whose row 0 is image row <paramref name="originRow"/>.</summary>
    private unsafe void SplatBandInto(HdrFrame target, int originRow, int band)
    {
        fixed (float* red = target.Red, green = target.Green, blue = target.Blue)
        fixed (byte* marks = target.Touched)
        {
            var into = new SplatTarget(red, green, blue, marks, target.Width, target.GroupsPerRow, originRow, 0);
            for (int tileColumn = 0; tileColumn < _tilesPerBand; tileColumn++) SplatTile(into, band, tileColumn, Tile(band, tileColumn));
        }
    }

    /// <summary>One row band of the image, tile by tile: splat into the scratch tile, tone map the touched groups, black elsewhere.</summary>
    private unsafe void SplatBandIntoImage(int band)
    {
        const int TilePixels = BandHeight * TileWidth, GroupsPerTileRow = TileWidth / HdrFrame.GroupWidth;
        const int LitEntriesPerTile = GroupsPerTileRow / RgbaImage.GroupsPerLitEntry;
        // The scratch tile is all zeros between tiles: the tone map zeroes what it reads, and nothing else was written.
        float* scratch = stackalloc float[3 * TilePixels];
        byte* marks = stackalloc byte[BandHeight * GroupsPerTileRow];
        new Span<float>(scratch, 3 * TilePixels).Clear();
        new Span<byte>(marks, BandHeight * GroupsPerTileRow).Clear();
        fixed (byte* pixels = _image!.RendererPixels)
        fixed (ushort* lit = _image.LitGroups)
        {
            uint* rgba = (uint*)pixels;
            for (int tileColumn = 0; tileColumn < _tilesPerBand; tileColumn++)
            {
                TileBounds clip = Tile(band, tileColumn);
                var target = new SplatTarget(scratch, scratch + TilePixels, scratch + 2 * TilePixels, marks, TileWidth, GroupsPerTileRow, clip.FirstRow, clip.FirstColumn);
                SplatTile(target, band, tileColumn, clip);
                ToneMapper.MapMarkedRows(new ToneMapper.MarkedPlanes(scratch, scratch + TilePixels, scratch + 2 * TilePixels, TileWidth, marks, GroupsPerTileRow),
                    rgba + (long)clip.FirstRow * _width + clip.FirstColumn, _width, clip.EndColumn - clip.FirstColumn, clip.EndRow - clip.FirstRow, _exposureScale,
                    lit + _image.LitEntry(clip.FirstRow, tileColumn * LitEntriesPerTile), _litKnown);
            }
        }
    }

    /// <summary>
    /// floor as an int with the processor's own conversion, without the saturating checks of a C# cast: star
    /// positions are finite and within <see cref="Projection.StarMargin"/> of an image at most 16384 px wide.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int FloorToInt(float value) => float.ConvertToIntegerNative<int>(MathF.Floor(value));

    /// <summary>A bilinear sample: inline for the common case of a star wholly inside the tile, else clipped to it.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void SplatBilinear(in SplatTarget target, in SplatRecord star, in TileBounds clip)
    {
        int left = star.Column, top = star.Row;
        if (left >= clip.FirstColumn && left + 2 <= clip.EndColumn && top >= clip.FirstRow && top + 2 <= clip.EndRow)
        {
            // Four weights, the same products as the clipped loop, taken into locals once: the pixel stores could alias
            // the record as far as the compiler knows, so it would reload and recompute them for every channel.
            float ax = star.OffsetX, ay = star.OffsetY;
            var weights = new SquareWeights((1 - ay) * (1 - ax), (1 - ay) * ax, ay * (1 - ax), ay * ax);
            float red = star.Red, green = star.Green, blue = star.Blue;
            int index = target.Index(top, left), below = index + target.Stride;
            AddSquare(target.Red, index, below, weights, red);
            AddSquare(target.Green, index, below, weights, green);
            AddSquare(target.Blue, index, below, weights, blue);
            target.MarkSquare(top, left);
        }
        else SplatBilinearClipped(target, star, clip);
    }

    [MethodImpl(MethodImplOptions.NoInlining)]
    private static unsafe void SplatBilinearClipped(in SplatTarget target, in SplatRecord star, in TileBounds clip)
    {
        int left = star.Column, top = star.Row;
        float ax = star.OffsetX, ay = star.OffsetY, red = star.Red, green = star.Green, blue = star.Blue;
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

    /// <summary>A bilinear sample's weights on its anchor pixel, the one right of it, the one below and the one below right.</summary>
    private readonly record struct SquareWeights(float Anchor, float Right, float Below, float BelowRight);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void AddSquare(float* plane, int index, int below, in SquareWeights weights, float value)
    {
        plane[index] += weights.Anchor * value;
        plane[index + 1] += weights.Right * value;
        plane[below] += weights.Below * value;
        plane[below + 1] += weights.BelowRight * value;
    }

    private unsafe void SplatKernel(in SplatTarget target, in SplatRecord star, in TileBounds clip)
    {
        int size = star.Footprint - 1, radius = PointSpreadKernels.Radii[size], side = 2 * radius + 1;
        float[] weights = _kernels.Weights(size, PointSpreadKernels.PhaseOf(star.OffsetX), PointSpreadKernels.PhaseOf(star.OffsetY));
        int top = star.Row - radius, left = star.Column - radius;
        float red = star.Red, green = star.Green, blue = star.Blue;
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

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static unsafe void AddScaled(float* pixels, Vector256<float> weight, Vector256<float> value) =>
        Vector256.Store(Vector256.Load(pixels) + weight * value, pixels);
}
