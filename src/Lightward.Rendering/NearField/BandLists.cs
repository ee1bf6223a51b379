namespace Lightward.Rendering.NearField;

/// <summary>
/// Items numbered in the order they are added, each reaching a range of row bands, listed under every band they
/// reach (a counting sort): a band reads exactly its items, in the order they were added, so what is drawn from
/// the lists never depends on how the bands are split between threads. Kept between frames, so steady use does not
/// allocate.
/// </summary>
internal sealed class BandLists
{
    private readonly List<(int First, int Last)> _ranges = [];
    /// <summary>Where each band's indices start in <see cref="_order"/>; band b's run ends where band b + 1's starts.</summary>
    private int[] _bandStart = [];
    private int[] _order = [];

    /// <summary>Forgets every item, for <paramref name="bandCount"/> bands.</summary>
    public void Clear(int bandCount)
    {
        _ranges.Clear();
        if (_bandStart.Length != bandCount + 1) _bandStart = new int[bandCount + 1];
        else Array.Clear(_bandStart);
    }

    /// <summary>Adds the next item, reaching bands <paramref name="firstBand"/> to <paramref name="lastBand"/>.</summary>
    public void Add(int firstBand, int lastBand)
    {
        _ranges.Add((firstBand, lastBand));
        for (int band = firstBand; band <= lastBand; band++) _bandStart[band + 1]++;
    }

    /// <summary>Lists the items added since <see cref="Clear"/> under their bands; call once, before reading <see cref="In"/>.</summary>
    public void Sort()
    {
        for (int band = 1; band < _bandStart.Length; band++) _bandStart[band] += _bandStart[band - 1];
        if (_order.Length < _bandStart[^1]) _order = new int[Math.Max(_bandStart[^1], 2 * _order.Length)];
        Span<int> next = stackalloc int[_bandStart.Length];
        _bandStart.CopyTo(next);
        for (int item = 0; item < _ranges.Count; item++)
            for (int band = _ranges[item].First; band <= _ranges[item].Last; band++) _order[next[band]++] = item;
    }

    /// <summary>The items reaching band <paramref name="band"/>, by number, in the order they were added.</summary>
    public ReadOnlySpan<int> In(int band) => _order.AsSpan(_bandStart[band], _bandStart[band + 1] - _bandStart[band]);
}
