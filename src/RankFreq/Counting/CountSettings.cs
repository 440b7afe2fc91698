using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>How to count.</summary>
/// <param name="Tokenizer">Tokenizer spec.</param>
/// <param name="Source">How inputs are read.</param>
/// <param name="Threads">Worker threads (0: all cores).</param>
/// <param name="MemoryBytes">Memory budget for counting before spilling to disk (0: a quarter of the memory available to the
/// process). Tables spill before a growth would pass it, ranking falls back to runs when it would not fit, and rows
/// are read back in batches sized to it, so peak resident memory stays within it plus the runtime's fixed
/// overhead (measured: under 200 MB; benchmarks/README.md).</param>
/// <param name="ShardIndex">1-based shard to count, with <paramref name="ShardCount"/>; 0 counts everything.</param>
/// <param name="ShardCount">Number of shards.</param>
/// <param name="TempDirectory">Where spill runs go (default: the system temporary folder).</param>
/// <param name="SplitAboveBytes">Plain text files larger than this are cut into newline-aligned ranges counted in parallel.</param>
/// <param name="RouteAboveTypes">With more than one thread, once a worker's table holds this many types, tokens are
/// routed by hash to one table per thread (each partition of the key space held once, no merge of worker tables);
/// below it every worker counts into its own table, the faster way for small vocabularies.</param>
public sealed record CountSettings(
    string Tokenizer = "words",
    SourceOptions? Source = null,
    int Threads = 0,
    long MemoryBytes = 0,
    int ShardIndex = 0,
    int ShardCount = 0,
    string? TempDirectory = null,
    long SplitAboveBytes = 16L << 20,
    int RouteAboveTypes = 1 << 18)
{
    /// <summary>Effective thread count.</summary>
    public int EffectiveThreads => Threads > 0 ? Threads : Environment.ProcessorCount;
    /// <summary>Effective memory budget in bytes.</summary>
    public long EffectiveMemory => MemoryBytes > 0 ? MemoryBytes : Math.Max(64L << 20, GC.GetGCMemoryInfo().TotalAvailableMemoryBytes / 4);
}
