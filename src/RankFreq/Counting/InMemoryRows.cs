using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>Rows held in memory.</summary>
public sealed class InMemoryRows(string?[] tokens, int[]? ids, long[] counts) : ICountRows
{
    /// <summary>Tokens in rank order (null where redacted).</summary>
    public string?[] Tokens => tokens;
    /// <summary>Vocabulary ids in rank order (subword tokenizers only).</summary>
    public int[]? TokenIds => ids;
    /// <summary>Counts in rank order.</summary>
    public long[] Counts => counts;
    /// <inheritdoc/>
    public bool Repeatable => true;
    /// <inheritdoc/>
    public IEnumerable<CountRowBatch> Batches(int batchSize = 1 << 20)
    {
        for (int s = 0; s < counts.Length; s += batchSize)
        {
            int n = Math.Min(batchSize, counts.Length - s);
            yield return new CountRowBatch(s + 1, tokens[s..(s + n)], ids?[s..(s + n)], counts[s..(s + n)]);
        }
    }
    /// <inheritdoc/>
    public void Dispose() { }
}
