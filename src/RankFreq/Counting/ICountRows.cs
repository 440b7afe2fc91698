using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>The rank table as batches in rank order (streamed from disk after a spill, so it may be read once).</summary>
public interface ICountRows : IDisposable
{
    /// <summary>Whether the rows can be enumerated more than once.</summary>
    bool Repeatable { get; }
    /// <summary>The rows in rank order, in batches of at most <paramref name="batchSize"/>.</summary>
    IEnumerable<CountRowBatch> Batches(int batchSize = 1 << 20);
}
