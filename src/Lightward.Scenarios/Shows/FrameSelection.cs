using System.Globalization;
using Lightward.Spacetime;

namespace Lightward.Scenarios.Shows;

/// <summary>
/// The frames one render run is responsible for: a range of frame numbers (1-based, as in the file names), cut into
/// <c>n</c> contiguous shards of near-equal size so that independent runs (a cluster job array, an indexed job)
/// together render every frame exactly once.
/// </summary>
public readonly record struct FrameSelection(int First, int Last)
{
    public int Count => Math.Max(0, Last - First + 1);

    public IEnumerable<int> Frames => Enumerable.Range(First, Count);

    /// <summary>Reads <c>--frames a..b</c> and <c>--shard i/n</c> (i from 0 to n−1) for a show of <paramref name="frameCount"/> frames.</summary>
    public static FrameSelection Parse(string? frames, string? shard, int frameCount)
    {
        FrameSelection range = frames is null ? new FrameSelection(1, frameCount) : ParseRange(frames, frameCount);
        return shard is null ? range : range.Shard(ParseShard(shard));
    }

    /// <summary>Shard <paramref name="index"/> of <paramref name="count"/>: frames First + ⌊i·C/n⌋ … First + ⌊(i+1)·C/n⌋ − 1.</summary>
    public FrameSelection Shard((int Index, int Count) shard)
    {
        long total = Count;
        int start = First + (int)(shard.Index * total / shard.Count);
        int end = First + (int)((shard.Index + 1) * total / shard.Count) - 1;
        return new FrameSelection(start, end);
    }

    private static FrameSelection ParseRange(string text, int frameCount)
    {
        string allowed = $"'a..b' with 1 <= a <= b <= {frameCount} (this show has {frameCount} frames)";
        string[] parts = text.Trim().Split("..");
        if (parts.Length != 2 || !TryFrame(parts[0], out int first) || !TryFrame(parts[1], out int last))
            throw new UserInputException($"--frames: '{text}' is not a frame range; expected {allowed}");
        if (first < 1 || last > frameCount || first > last)
            throw new UserInputException($"--frames: {text} is outside the show; expected {allowed}");
        return new FrameSelection(first, last);
    }

    private static (int Index, int Count) ParseShard(string text)
    {
        const string allowed = "'i/n' with n from 1 to 100000 and i from 0 to n-1, e.g. 0/4 for the first of four shards";
        string[] parts = text.Trim().Split('/');
        if (parts.Length != 2 || !TryFrame(parts[0], out int index) || !TryFrame(parts[1], out int count))
            throw new UserInputException($"--shard: '{text}' is not a shard; expected {allowed}");
        if (count < 1 || count > 100_000 || index >= count)
            throw new UserInputException($"--shard: {text} is out of range; expected {allowed}");
        return (index, count);
    }

    private static bool TryFrame(string text, out int value) =>
        int.TryParse(text.Trim(), NumberStyles.None, CultureInfo.InvariantCulture, out value);
}
