namespace Lightward.Spacetime;

/// <summary>
/// Runs a loop's items over the threads one item at a time, each thread taking the lowest item no thread has taken
/// yet. <see cref="Parallel.For(int, int, ParallelOptions, Action{int})"/> hands each thread a block of neighbouring
/// items and lets it take them in growing batches, which suits items of equal cost; a frame's items are not (the few
/// bands that hold a body, the grid lines that pass near the camera), and with two threads one of them often ended up
/// working through all the heavy items while the other sat idle. Every item still writes only its own output, so the
/// result never depends on which thread ran it.
/// </summary>
public static class ParallelItems
{
    /// <summary>Runs <paramref name="body"/> for every item in [<paramref name="fromInclusive"/>, <paramref name="toExclusive"/>).</summary>
    public static void For(int fromInclusive, int toExclusive, ParallelOptions parallel, Action<int> body) =>
        For(fromInclusive, toExclusive, parallel, static () => 0, (item, local) => { body(item); return local; }, static _ => { });

    /// <summary>
    /// Runs <paramref name="body"/> for every item in [<paramref name="fromInclusive"/>, <paramref name="toExclusive"/>),
    /// each thread with state of its own from <paramref name="localInit"/>, handed back to <paramref name="localFinally"/>
    /// when the thread has no more items.
    /// </summary>
    public static void For<TLocal>(int fromInclusive, int toExclusive, ParallelOptions parallel, Func<TLocal> localInit,
        Func<int, TLocal, TLocal> body, Action<TLocal> localFinally)
    {
        int count = toExclusive - fromInclusive;
        if (count <= 0) return;
        int threads = Math.Min(count, parallel.MaxDegreeOfParallelism > 0 ? parallel.MaxDegreeOfParallelism : Environment.ProcessorCount);
        var queue = new Queue(fromInclusive, toExclusive);
        if (threads == 1)
        {
            queue.Drain(localInit, body, localFinally);
            return;
        }
        Parallel.For(0, threads, parallel, _ => queue.Drain(localInit, body, localFinally));
    }

    private sealed class Queue(int first, int end)
    {
        private int _next = first - 1;
        /// <summary>Set when an item failed, so the other threads stop taking items.</summary>
        private volatile bool _failed;

        public void Drain<TLocal>(Func<TLocal> localInit, Func<int, TLocal, TLocal> body, Action<TLocal> localFinally)
        {
            // A thread that starts after the others took every item has nothing to set up for.
            if (Volatile.Read(ref _next) + 1 >= end) return;
            TLocal local = localInit();
            try
            {
                int item;
                while (!_failed && (item = Interlocked.Increment(ref _next)) < end) local = body(item, local);
            }
            catch
            {
                _failed = true;
                throw;
            }
            finally
            {
                localFinally(local);
            }
        }
    }
}
