using Lightward.Spacetime;

namespace Lightward.Rendering;

/// <summary>
/// Scratch buffers lent to the threads of a parallel loop, one each, and kept for the next loop, so that a steady
/// stream of frames does not allocate. <see cref="Rent"/> and <see cref="Return"/> are delegates made once, ready for
/// the per-thread state of <see cref="ParallelItems.For{TLocal}"/>.
/// </summary>
/// <param name="create">Makes a new buffer when none kept fits.</param>
/// <param name="fits">Whether a kept buffer still suits (e.g. the frame's width); kept buffers that do not are dropped. Null: every one fits.</param>
internal sealed class ScratchPool<T>(Func<T> create, Func<T, bool>? fits = null) where T : class
{
    private readonly Stack<T> _kept = new();

    public Func<T> Rent => field ??= RentOne;

    public Action<T> Return => field ??= ReturnOne;

    /// <summary>Drops every kept buffer (after a loop that failed half way may have left one dirty).</summary>
    public void Clear()
    {
        lock (_kept) _kept.Clear();
    }

    private T RentOne()
    {
        lock (_kept)
            while (_kept.TryPop(out T? buffer))
                if (fits?.Invoke(buffer) ?? true) return buffer;
        return create();
    }

    private void ReturnOne(T buffer)
    {
        lock (_kept) _kept.Push(buffer);
    }
}
