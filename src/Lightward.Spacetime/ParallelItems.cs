namespace Lightward.Spacetime;

/// <summary>
/// Runs a loop's items over the threads one item at a time: each thread takes the items of its own run (a stretch of
/// the items, the same for the same thread in every loop of a frame) in order, then the last items left in the
/// others' runs (see <see cref="Queue"/>). <see cref="Parallel.For(int, int, ParallelOptions, Action{int})"/> lets
/// threads take neighbouring items in growing batches, which suits items of equal cost; a frame's items are not (the
/// few bands that hold a body, the grid lines that pass near the camera), and with two threads one of them often
/// ended up working through all the heavy items while the other sat idle. Every item still writes only its own
/// output, so the result never depends on which thread ran it.
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
        var queue = new Queue(fromInclusive, toExclusive, threads);
        if (threads == 1)
        {
            queue.Drain(0, localInit, body, localFinally);
            return;
        }
        void Drain(int run) => queue.Drain(run, localInit, body, localFinally);
        if (!Team.TryRun(Drain, threads - 1)) Parallel.For(0, threads, parallel, Drain);
    }

    /// <summary>How long a helper keeps spinning for the next loop before it sleeps: longer than the serial steps between a frame's loops.</summary>
    private static readonly TimeSpan HelperSpin = TimeSpan.FromMilliseconds(0.5);

    /// <summary>The helper threads, made on first use; at most one loop uses them at a time.</summary>
    private static class Team
    {
        private static readonly Helper[] Helpers = [.. Enumerable.Range(0, Environment.ProcessorCount - 1).Select(i => new Helper(i))];
        private static int _inUse;

        /// <summary>
        /// Runs <paramref name="drain"/> on this thread (with run 0) and on up to <paramref name="helpers"/> helpers
        /// (helper i with run i + 1, so that each thread keeps its run from loop to loop), returning once all have
        /// finished; false (nothing run) when the helpers are taken.
        /// </summary>
        public static bool TryRun(Action<int> drain, int helpers)
        {
            helpers = Math.Min(helpers, Helpers.Length);
            if (helpers == 0 || Interlocked.CompareExchange(ref _inUse, 1, 0) != 0) return false;
            List<Exception>? failures = null;
            try
            {
                for (int i = 0; i < helpers; i++) Helpers[i].Post(drain);
                try
                {
                    drain(0);
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
        private readonly int _run;
        private Action<int>? _job;
        private Exception? _failure;
        private readonly SemaphoreSlim _wake = new(0);
        private int _sleeping;

        public Helper(int index)
        {
            _run = index + 1;
            new Thread(Work) { IsBackground = true, Name = $"ParallelItems helper {_run}" }.Start();
        }

        public void Post(Action<int> job)
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
                        _job!(_run);
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

    /// <summary>
    /// The items cut into one run per thread, in order: each thread takes its own run's items from the front and, once
    /// that is empty, the last items of the other runs, one at a time. So a thread works through the same stretch of
    /// items in every loop of a frame and finds in its own core's caches what it wrote in the loop before (a star
    /// chunk's pixel positions, then its footprints); handed out in turn, an item went to either core and its data
    /// often had to come over from the other. Taking the others' items one by one still evens out unequal items.
    /// </summary>
    private sealed class Queue
    {
        /// <summary>Per run: its next item from the front (high half) and its end (low half), claimed by compare-and-swap.</summary>
        private readonly long[] _runs;
        /// <summary>Set when an item failed, so the other threads stop taking items.</summary>
        private volatile bool _failed;

        public Queue(int first, int end, int runs)
        {
            _runs = new long[runs];
            long count = end - first;
            for (int run = 0; run < runs; run++) _runs[run] = Pack(first + (int)(count * run / runs), first + (int)(count * (run + 1) / runs));
        }

        /// <summary>Runs items for one thread, starting with run <paramref name="own"/>'s.</summary>
        public void Drain<TLocal>(int own, Func<TLocal> localInit, Func<int, TLocal, TLocal> body, Action<TLocal> localFinally)
        {
            // A thread that starts after the others took every item has nothing to set up for.
            if (!TryTake(own, out int item)) return;
            TLocal local = localInit();
            try
            {
                do local = body(item, local);
                while (!_failed && TryTake(own, out item));
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

        /// <summary>The next item of run <paramref name="own"/>, else the last left in another run; false when none is left.</summary>
        private bool TryTake(int own, out int item)
        {
            if (TryTakeFrom(own, fromFront: true, out item)) return true;
            for (int other = 1; other < _runs.Length; other++)
                if (TryTakeFrom((own + other) % _runs.Length, fromFront: false, out item)) return true;
            return false;
        }

        private bool TryTakeFrom(int run, bool fromFront, out int item)
        {
            while (true)
            {
                long state = Volatile.Read(ref _runs[run]);
                int front = (int)(state >> 32), back = (int)state;
                item = fromFront ? front : back - 1;
                if (front >= back) return false;
                if (Interlocked.CompareExchange(ref _runs[run], fromFront ? Pack(front + 1, back) : Pack(front, back - 1), state) == state) return true;
            }
        }

        private static long Pack(int front, int back) => (long)front << 32 | (uint)back;
    }
}
