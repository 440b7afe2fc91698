using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using RankFreq.Jobs;
using RankFreq.Counting;
using RankFreq.Storage;

namespace RankFreq.Benchmarks;

/// <summary>Where a whole `count` of the file named by RANKFREQ_BENCH_INPUT goes, in process: the counting run
/// (2 threads, default settings) and the count-table write of its result. Two rounds each, no warm-up, as the
/// first round's start-up cost is part of what a command pays (per-round times are in the log).</summary>
[Config(typeof(InputFileConfig))]
[DefaultJob("Monitoring", RunStrategy.Monitoring, launchCount: 1, warmupCount: 0, iterationCount: 2)]
public class CountPhases
{
    private string _input = "";
    private readonly string _output = Path.Combine(Path.GetTempPath(), $"rankfreq-phases-{Environment.ProcessId}.parquet");
    private CountResult? _counted;

    [GlobalSetup(Target = nameof(Count))]
    public void SetupCount() => _input = BenchInput.PathFor(nameof(CountPhases));

    [GlobalSetup(Target = nameof(WriteTable))]
    public void SetupWrite()
    {
        SetupCount();
        _counted = CountJob.Count([_input], new CountSettings(Threads: 2));
        Console.WriteLine($"// {_counted.Summary.Types:N0} types");
    }

    [GlobalCleanup]
    public void Cleanup()
    {
        _counted?.Dispose();
        File.Delete(_output);
    }

    [Benchmark(Description = "count, 2 threads (result: types)")]
    public long Count()
    {
        using var result = CountJob.Count([_input], new CountSettings(Threads: 2));
        return result.Summary.Types;
    }

    [Benchmark(Description = "write the count table")]
    public void WriteTable() =>
        CountTableFile.WriteAsync(_output, _counted!.Rows, _counted.HasTokenIds, CountTableMetadata.From(_counted.Summary, 0))
            .GetAwaiter().GetResult();
}
