namespace Lightward.Spacetime;

/// <summary>
/// Runs a loop's items over the threads one item at a time, each thread taking the lowest item no thread has taken
/// yet. <see cref="Parallel.For(int, int, ParallelOptions, Action{int})"/> hands each thread a block of neighbouring
/// items and lets it take them in growing batches, which suits items of equal cost; a frame's items are not (the few
/// bands that hold a body, the grid lines that pass near the camera), and with two threads one of them often ended up
/// working through all the heavy items while the other sat idle. Every item still writes only its own output, so the
/// result never depends on which thread ran it.
/// <para>
/// A frame runs several such loops back to back with short serial steps between them. Thread-pool workers go to
/// sleep between loops, and waking one costs 10–20 µs on a 2-core VM, every loop. So the calling thread is joined by
/// helper threads of our own (one per further core) that keep spinning for <see cref="HelperSpin"/> after each loop
/// before they sleep: the next loop of the frame finds them awake. One loop at a time uses them; a loop started
/// while they are busy (another renderer on another thread, a loop inside a loop) runs on the thread pool instead.
/// </para>
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
        void Drain() => queue.Drain(localInit, body, localFinally);
        if (!Team.TryRun(Drain, threads - 1)) Parallel.For(0, threads, parallel, _ => Drain());
    }

    /// <summary>How long a helper keeps spinning for the next loop before it sleeps: longer than the serial steps between a frame's loops.</summary>
    private static readonly TimeSpan HelperSpin = TimeSpan.FromMilliseconds(0.5);

    /// <summary>The helper threads, made on first use; at most one loop uses them at a time.</summary>
    private static class Team
    {
        private static readonly Helper[] Helpers = [.. Enumerable.Range(0, Environment.ProcessorCount - 1).Select(i => new Helper(i))];
        private static int _inUse;

        /// <summary>
        /// Runs <paramref name="drain"/> on this thread and on up to <paramref name="helpers"/> helpers, returning once
        /// all have finished; false (nothing run) when the helpers are taken.
        /// </summary>
        public static bool TryRun(Action drain, int helpers)
        {
            helpers = Math.Min(helpers, Helpers.Length);
            if (helpers == 0 || Interlocked.CompareExchange(ref _inUse, 1, 0) != 0) return false;
            List<Exception>? failures = null;
            try
            {
                for (int i = 0; i < helpers; i++) Helpers[i].Post(drain);
                try
                {
                    drain();
                }
                catch (Exception failure)
                {
                    (failures ??= []).Add(failure);
                }
                for (int i = 0; i < helpers; i++)
                    if (Helpers[i].Join() is Exception failure) (failures ??= []).Add(failure);
            }
            finally
            {
                Volatile.Write(ref _inUse, 0);
            }
            if (failures is not null) throw new AggregateException(failures);
            return true;
        }
    }

    /// <summary>One helper thread and its job slot: idle → posted (by the caller) → running (taken by the helper) → idle.</summary>
    private sealed class Helper
    {
        private const int Idle = 0, Posted = 1, Running = 2;
        private int _state;
        private Action? _job;
        private Exception? _failure;
        private readonly SemaphoreSlim _wake = new(0);
        private int _sleeping;

        public Helper(int index) => new Thread(Work) { IsBackground = true, Name = $"ParallelItems helper {index + 1}" }.Start();

        public void Post(Action job)
        {
            _job = job;
            _failure = null;
            Volatile.Write(ref _state, Posted);
            if (Interlocked.Exchange(ref _sleeping, 0) == 1) _wake.Release();
        }

        /// <summary>
        /// Waits for the posted job: takes it back if the helper never started it (the caller has run every item by
        /// then), else waits for the helper to finish. Returns what the job threw, if anything.
        /// </summary>
        public Exception? Join()
        {
            if (Interlocked.CompareExchange(ref _state, Idle, Posted) == Posted)
            {
                _job = null;
                return null;
            }
            var spin = new SpinWait();
            while (Volatile.Read(ref _state) != Idle) spin.SpinOnce(sleep1Threshold: -1);
            return _failure;
        }

        private void Work()
        {
            long idleSince = System.Diagnostics.Stopwatch.GetTimestamp();
            while (true)
            {
                if (Interlocked.CompareExchange(ref _state, Running, Posted) == Posted)
                {
                    try
                    {
                        _job!();
                    }
                    catch (Exception failure)
                    {
                        _failure = failure;
                    }
                    _job = null;
                    Volatile.Write(ref _state, Idle);
                    idleSince = System.Diagnostics.Stopwatch.GetTimestamp();
                }
                else if (System.Diagnostics.Stopwatch.GetElapsedTime(idleSince) < HelperSpin) Thread.SpinWait(20);
                else
                {
                    // Announce the sleep, then look once more: a job posted in between either sees the flag and wakes
                    // us, or is seen here (and if its poster saw the flag too, its wake-up is taken).
                    Interlocked.Exchange(ref _sleeping, 1);
                    if (Volatile.Read(ref _state) != Posted || Interlocked.Exchange(ref _sleeping, 0) == 0) _wake.Wait();
                    idleSince = System.Diagnostics.Stopwatch.GetTimestamp();
                }
            }
        }
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
