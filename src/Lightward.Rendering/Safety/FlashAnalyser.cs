namespace Lightward.Rendering.Safety;

/// <summary>Which rule of ITU-R BT.1702 a flash breaks.</summary>
public enum FlashKind
{
    /// <summary>Opposing luminance changes of 20 cd/m² or more with the darker image below 160 cd/m².</summary>
    Luminance,
    /// <summary>Transitions to or from a saturated red, whatever the luminance.</summary>
    SaturatedRed,
}

/// <summary>A stretch of show time in which flashes break the limits.</summary>
/// <param name="PeakFlashesPerSecond">Most flashes (pairs of opposing transitions) found in one second.</param>
/// <param name="PeakArea">Largest fraction of the screen area changing together in one frame.</param>
public sealed record FlashFinding(FlashKind Kind, double Start, double End, double PeakFlashesPerSecond, double PeakArea);

/// <summary>
/// Checks a frame sequence for photosensitive flashing following ITU-R BT.1702 (Guidance for the reduction of
/// photosensitive epileptic seizures caused by television): a flash is a pair of opposing luminance changes of at least
/// 20 cd/m² where the darker image is below 160 cd/m²; a sequence is harmful when concurrent flashes cover more than a
/// quarter of the screen and there are more than three flashes in any one second; transitions to or from saturated red
/// count regardless of luminance. Saturated red and its change use the W3C WCAG 2.2 definitions (R/(R+G+B) ≥ 0.8 and a
/// change of (R−G−B)×320 above 20, on linear values), since BT.1702 gives no number for them.
///
/// Frames are averaged onto a grid of cells (each cell tracked on its own, so a change confined to a small part of
/// the screen never masks or dilutes another); pixel values are decoded from sRGB (IEC 61966-2-1), turned into
/// relative luminance Y = 0.2126 R + 0.7152 G + 0.0722 B (ITU-R BT.709) and scaled by the dome's peak luminance.
/// Each cell follows its luminance with a 20 cd/m² hysteresis: a transition is counted when the value has moved 20
/// cd/m² from the last turning point, so slow fades count once and noise below the threshold never does.
/// </summary>
public sealed class FlashAnalyser
{
    /// <summary>ITU-R BT.1702: smallest luminance change that can make a flash, cd/m².</summary>
    public const double LuminanceChange = 20;
    /// <summary>ITU-R BT.1702: a flash only counts when its darker image is below this, cd/m².</summary>
    public const double DarkerImageLimit = 160;
    /// <summary>ITU-R BT.1702: concurrent flashes over more than this fraction of the screen count.</summary>
    public const double AreaLimit = 0.25;
    /// <summary>ITU-R BT.1702: more than three flashes in any one second is harmful; a flash is two opposing transitions.</summary>
    public const int FlashesAllowedPerSecond = 3;
    /// <summary>W3C WCAG 2.2 "general flash and red flash thresholds": a red is saturated when R/(R+G+B) ≥ 0.8.</summary>
    public const double SaturatedRedShare = 0.8;
    /// <summary>W3C WCAG 2.2: red changes are measured as (R−G−B)×320, negative values set to 0, and count above 20.</summary>
    public const double RedScale = 320, RedChange = 20;

    private static readonly float[] DecodeSrgb = BuildDecodeTable();

    private readonly int _gridWidth, _gridHeight;
    private readonly double _framesPerSecond, _peakLuminance;
    private readonly float[] _cellArea;
    private readonly float[] _red, _green, _blue;
    private readonly Hysteresis[] _luminanceState, _redState;
    private readonly List<float> _luminanceArea = [], _redArea = [];

    /// <param name="cellArea">Share of the screen each cell covers (row-major, summing to 1); <see cref="ScreenArea"/> builds them.</param>
    public FlashAnalyser(int gridWidth, int gridHeight, double framesPerSecond, double peakLuminance, float[] cellArea)
    {
        if (gridWidth <= 0 || gridHeight <= 0) throw new ArgumentOutOfRangeException(nameof(gridWidth), "grid must have cells");
        if (cellArea.Length != gridWidth * gridHeight) throw new ArgumentException("one area per cell", nameof(cellArea));
        if (!(framesPerSecond > 0) || !(peakLuminance > 0)) throw new ArgumentOutOfRangeException(nameof(framesPerSecond), "frame rate and peak luminance must be positive");
        _gridWidth = gridWidth;
        _gridHeight = gridHeight;
        _framesPerSecond = framesPerSecond;
        _peakLuminance = peakLuminance;
        _cellArea = cellArea;
        int cells = gridWidth * gridHeight;
        _red = new float[cells]; _green = new float[cells]; _blue = new float[cells];
        _luminanceState = new Hysteresis[cells];
        _redState = new Hysteresis[cells];
    }

    public int FrameCount => _luminanceArea.Count;

    /// <summary>Adds the next frame: 8-bit sRGB RGBA, rows top to bottom, <paramref name="width"/> × <paramref name="height"/> pixels.</summary>
    public void AddFrame(ReadOnlySpan<byte> rgba, int width, int height)
    {
        if (rgba.Length < width * height * 4) throw new ArgumentException("frame smaller than its size", nameof(rgba));
        if (width < _gridWidth || height < _gridHeight) throw new ArgumentException("frame smaller than the analysis grid", nameof(width));
        AverageIntoCells(rgba, width, height);

        double luminanceArea = 0, redArea = 0;
        bool first = FrameCount == 0;
        for (int cell = 0; cell < _cellArea.Length; cell++)
        {
            double r = _red[cell], g = _green[cell], b = _blue[cell];
            double luminance = (0.2126 * r + 0.7152 * g + 0.0722 * b) * _peakLuminance;
            double redness = Math.Max(0, r - g - b) * RedScale;
            double sum = r + g + b;
            bool saturatedRed = sum > 0 && r / sum >= SaturatedRedShare;
            if (first)
            {
                _luminanceState[cell] = Hysteresis.Start(luminance, saturatedRed);
                _redState[cell] = Hysteresis.Start(redness, saturatedRed);
                continue;
            }
            if (_luminanceState[cell].Update(luminance, LuminanceChange, saturatedRed, CountsAsLuminanceFlash)) luminanceArea += _cellArea[cell];
            if (_redState[cell].Update(redness, RedChange, saturatedRed, CountsAsRedFlash)) redArea += _cellArea[cell];
        }
        _luminanceArea.Add((float)luminanceArea);
        _redArea.Add((float)redArea);
    }

    /// <summary>BT.1702: the darker of the two images must be below 160 cd/m².</summary>
    private static bool CountsAsLuminanceFlash(double darker, bool fromSaturatedRed, bool toSaturatedRed) => darker < DarkerImageLimit;

    /// <summary>WCAG 2.2: a red transition involves a saturated red at one end.</summary>
    private static bool CountsAsRedFlash(double darker, bool fromSaturatedRed, bool toSaturatedRed) => fromSaturatedRed || toSaturatedRed;

    /// <summary>The findings so far: every stretch of time where either rule is broken.</summary>
    public IReadOnlyList<FlashFinding> Findings() =>
        [.. FindingsOf(FlashKind.Luminance, _luminanceArea), .. FindingsOf(FlashKind.SaturatedRed, _redArea)];

    private IEnumerable<FlashFinding> FindingsOf(FlashKind kind, List<float> transitionArea)
    {
        // A frame takes part when its concurrent transitions cover more than a quarter of the screen; a window
        // of one second fails with more than 2 × 3 such transitions (more than three flashes).
        var events = new List<int>();
        FlashFinding? open = null;
        for (int frame = 0; frame < transitionArea.Count; frame++)
        {
            if (transitionArea[frame] > AreaLimit) events.Add(frame);
            while (events.Count > 0 && (frame - events[0]) / _framesPerSecond >= 1) events.RemoveAt(0);
            double flashes = events.Count / 2.0;
            bool harmful = events.Count > 2 * FlashesAllowedPerSecond;
            if (harmful)
            {
                double peakArea = events.Max(e => transitionArea[e]);
                double start = events[0] / _framesPerSecond, end = frame / _framesPerSecond;
                open = open is null
                    ? new FlashFinding(kind, start, end, flashes, peakArea)
                    : open with { End = end, PeakFlashesPerSecond = Math.Max(open.PeakFlashesPerSecond, flashes), PeakArea = Math.Max(open.PeakArea, peakArea) };
            }
            else if (open is not null)
            {
                yield return open;
                open = null;
            }
        }
        if (open is not null) yield return open;
    }

    private void AverageIntoCells(ReadOnlySpan<byte> rgba, int width, int height)
    {
        // Each cell row is summed by one thread in a fixed order, so results never depend on scheduling.
        unsafe
        {
            fixed (byte* pixels = rgba)
            {
                byte* source = pixels;
                Parallel.For(0, _gridHeight, cellRow => SumCellRow(source, width, height, cellRow));
            }
        }
    }

    private unsafe void SumCellRow(byte* pixels, int width, int height, int cellRow)
    {
        int y0 = (int)((long)cellRow * height / _gridHeight), y1 = (int)((long)(cellRow + 1) * height / _gridHeight);
        for (int cellColumn = 0; cellColumn < _gridWidth; cellColumn++)
        {
            int x0 = (int)((long)cellColumn * width / _gridWidth), x1 = (int)((long)(cellColumn + 1) * width / _gridWidth);
            double r = 0, g = 0, b = 0;
            for (int y = y0; y < y1; y++)
            {
                byte* row = pixels + ((long)y * width + x0) * 4;
                float rowR = 0, rowG = 0, rowB = 0;
                for (int x = x0; x < x1; x++, row += 4)
                {
                    rowR += DecodeSrgb[row[0]];
                    rowG += DecodeSrgb[row[1]];
                    rowB += DecodeSrgb[row[2]];
                }
                r += rowR; g += rowG; b += rowB;
            }
            double count = (double)(y1 - y0) * (x1 - x0);
            int cell = cellRow * _gridWidth + cellColumn;
            _red[cell] = (float)(r / count); _green[cell] = (float)(g / count); _blue[cell] = (float)(b / count);
        }
    }

    /// <summary>IEC 61966-2-1 sRGB decoding of 8-bit values to linear 0…1.</summary>
    private static float[] BuildDecodeTable()
    {
        var table = new float[256];
        for (int i = 0; i < 256; i++)
        {
            double c = i / 255.0;
            table[i] = (float)(c <= 0.04045 ? c / 12.92 : Math.Pow((c + 0.055) / 1.055, 2.4));
        }
        return table;
    }

    /// <summary>
    /// Follows one value with a hysteresis band: a transition is confirmed when the value has moved <c>threshold</c>
    /// from the last turning point. A transition that does not count yet (its darker end not dark enough, no saturated
    /// red at either end) may still count later in the same move, as the value goes on further.
    /// </summary>
    private struct Hysteresis
    {
        // Before the first transition: the range seen so far. After: the move in progress.
        private double _min, _max, _from, _extreme;
        private bool _minRed, _maxRed, _fromRed, _extremeRed, _pending;
        private int _direction;

        public static Hysteresis Start(double value, bool saturatedRed) =>
            new() { _min = value, _max = value, _minRed = saturatedRed, _maxRed = saturatedRed };

        /// <summary>Feeds the next value; true when a counting transition completes at this frame.</summary>
        public bool Update(double value, double threshold, bool saturatedRed, Func<double, bool, bool, bool> counts)
        {
            if (_direction == 0)
            {
                if (value - _min >= threshold) return Confirm(1, _min, _minRed, value, saturatedRed, counts);
                if (_max - value >= threshold) return Confirm(-1, _max, _maxRed, value, saturatedRed, counts);
                if (value < _min) (_min, _minRed) = (value, saturatedRed);
                if (value > _max) (_max, _maxRed) = (value, saturatedRed);
                return false;
            }
            bool reverses = _direction > 0 ? _extreme - value >= threshold : value - _extreme >= threshold;
            if (reverses) return Confirm(-_direction, _extreme, _extremeRed, value, saturatedRed, counts);
            if (_direction > 0 ? value <= _extreme : value >= _extreme) return false;
            _extreme = value;
            _extremeRed = saturatedRed;
            if (!_pending || !counts(Math.Min(_from, value), _fromRed, saturatedRed)) return false;
            _pending = false;
            return true;
        }

        private bool Confirm(int direction, double from, bool fromRed, double value, bool saturatedRed, Func<double, bool, bool, bool> counts)
        {
            _direction = direction;
            _from = from;
            _fromRed = fromRed;
            _extreme = value;
            _extremeRed = saturatedRed;
            bool counted = counts(Math.Min(from, value), fromRed, saturatedRed);
            _pending = !counted;
            return counted;
        }
    }
}
