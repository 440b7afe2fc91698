using System.Collections.Concurrent;
using Xunit;
using RankFreq.Primitives;

namespace RankFreq.Tests.Primitives;

/// <summary>The run's core limit: it reaches parallel loops and tasks of the run, and ends with the run's method.</summary>
public class CoreLimitTests
{
    [Fact]
    public async Task LimitFlowsIntoTheRunsLoopsAndEndsWithIt()
    {
        int outside = CoreLimit.Cores;
        Assert.Equal(Environment.ProcessorCount, outside);
        var seen = await Run(1);
        Assert.All(seen.Limits, c => Assert.Equal(1, c));
        // a degree of one runs the loop on the calling thread alone
        Assert.Single(seen.Threads);
        Assert.Equal(Environment.ProcessorCount, CoreLimit.Cores);
        var all = await Run(0);
        Assert.All(all.Limits, c => Assert.Equal(Environment.ProcessorCount, c));
    }

    [Fact]
    public async Task RunsSideBySideKeepTheirOwnLimits()
    {
        var a = Task.Run(() => Run(1));
        var b = Task.Run(() => Run(64));
        var (la, lb) = (await a, await b);
        Assert.All(la.Limits, c => Assert.Equal(1, c));
        Assert.All(lb.Limits, c => Assert.Equal(Environment.ProcessorCount, c)); // never more than the machine has
    }

    private static async Task<(int[] Limits, int[] Threads)> Run(int threads)
    {
        CoreLimit.Set(threads);
        await Task.Yield();
        var limits = new ConcurrentBag<int>();
        var ids = new ConcurrentDictionary<int, bool>();
        Parallel.For(0, 64, CoreLimit.Options, _ =>
        {
            limits.Add(CoreLimit.Cores);
            ids[Environment.CurrentManagedThreadId] = true;
            Thread.SpinWait(2000);
        });
        limits.Add(await Task.Run(() => CoreLimit.Cores));
        return ([.. limits], [.. ids.Keys]);
    }
}
