using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using BenchmarkDotNet.Jobs;

namespace RankFreq.Benchmarks;

/// <summary>The job a benchmark class runs with unless the command line names one. It is a BenchmarkDotNet
/// default job: a job given on the command line (<c>--job dry</c>, <c>--job short</c>) replaces it, where a
/// <c>[SimpleJob]</c> would run beside it; options such as <c>--launchCount 7</c> alone adjust it.</summary>
[AttributeUsage(AttributeTargets.Class, AllowMultiple = false)]
public sealed class DefaultJobAttribute(string id, RunStrategy strategy, int launchCount, int warmupCount, int iterationCount)
    : JobConfigBaseAttribute(new Job(id)
    {
        Run = { RunStrategy = strategy, LaunchCount = launchCount, WarmupCount = warmupCount, IterationCount = iterationCount },
    }.AsDefault());
