using System.Collections.Concurrent;

namespace Lightward.Spacetime.Tests;

public class ParallelItemsTests
{
    [Theory]
    [InlineData(0, 0, -1)]
    [InlineData(3, 4, -1)]
    [InlineData(-5, 200, -1)]
    [InlineData(0, 200, 1)]
    [InlineData(0, 7, 2)]
    public void Every_item_runs_once_and_every_thread_state_set_up_is_handed_back(int from, int to, int threads)
    {
        var runs = new ConcurrentDictionary<int, int>();
        var setUp = new ConcurrentBag<object>();
        var handedBack = new ConcurrentBag<object>();
        ParallelItems.For(from, to, new ParallelOptions { MaxDegreeOfParallelism = threads },
            () => { var state = new object(); setUp.Add(state); return state; },
            (item, state) =>
            {
                runs.AddOrUpdate(item, 1, (_, count) => count + 1);
                // Uneven items, as a frame's bands are.
                if (item % 5 == 0) Thread.SpinWait(20_000);
                return state;
            },
            handedBack.Add);
        Assert.Equal(Enumerable.Range(from, Math.Max(0, to - from)), runs.Keys.Order());
        Assert.All(runs.Values, count => Assert.Equal(1, count));
        Assert.Equal(setUp.OrderBy(RuntimeHelpersHash), handedBack.OrderBy(RuntimeHelpersHash));
        if (threads == 1) Assert.True(setUp.Count <= 1);
    }

    [Fact]
    public void A_failing_item_stops_the_loop_and_its_exception_reaches_the_caller()
    {
        int ran = 0;
        var failure = Assert.ThrowsAny<Exception>(() => ParallelItems.For(0, 10_000, new ParallelOptions(), item =>
        {
            Interlocked.Increment(ref ran);
            if (item == 10) throw new InvalidOperationException("item 10 failed");
        }));
        Exception inner = failure is AggregateException aggregate ? aggregate.Flatten().InnerExceptions.Single() : failure;
        Assert.Equal("item 10 failed", inner.Message);
        Assert.True(ran < 10_000, "the other threads went on taking items after the failure");
    }

    [Fact]
    public void Loops_inside_loops_and_loops_on_several_threads_at_once_each_run_every_item_once()
    {
        // The helper threads serve one loop at a time; the others (an inner loop, another caller) take the thread pool.
        var runs = new int[4, 50, 20];
        Parallel.For(0, 4, caller =>
        {
            for (int repeat = 0; repeat < 20; repeat++)
                ParallelItems.For(0, 50, new ParallelOptions(), outer =>
                    ParallelItems.For(0, 20, new ParallelOptions(), inner => Interlocked.Increment(ref runs[caller, outer, inner])));
        });
        Assert.All(runs.Cast<int>(), count => Assert.Equal(20, count));
    }

    [Fact]
    public void Loops_far_apart_in_time_still_run_every_item_once()
    {
        // Helpers sleep once idle for a while; a loop must wake them (or do without them) and still run every item.
        for (int loop = 0; loop < 3; loop++)
        {
            Thread.Sleep(5);
            var runs = new int[64];
            ParallelItems.For(0, 64, new ParallelOptions { MaxDegreeOfParallelism = 2 }, item =>
            {
                Thread.SpinWait(2_000);
                Interlocked.Increment(ref runs[item]);
            });
            Assert.All(runs, count => Assert.Equal(1, count));
        }
    }

    private static int RuntimeHelpersHash(object o) => System.Runtime.CompilerServices.RuntimeHelpers.GetHashCode(o);
}
