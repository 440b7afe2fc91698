using RankFreq.Primitives;
using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>Rows held in memory.</summary>
public sealed class InMemoryRows : ICountRows
{
    private string?[]? _tokens;
    private readonly Utf8Tokens[]? _chunks;
    private readonly int[]? _ids;
    private readonly long[] _counts;

    /// <summary>Rows whose tokens are strings (null where redacted).</summary>
    public InMemoryRows(string?[] tokens, int[]? ids, long[] counts)
    {
        _tokens = tokens;
        _ids = ids;
        _counts = counts;
    }

    /// <summary>
    /// Rows whose tokens are UTF-8, in chunks of <see cref="ChunkRows"/> rows (the last one shorter): the form the
    /// counting engine makes, written without a string per type.
    /// </summary>
    internal InMemoryRows(Utf8Tokens[] chunks, int[]? ids, long[] counts)
    {
        _chunks = chunks;
        _ids = ids;
        _counts = counts;
    }

    /// <summary>Rows per UTF-8 chunk: one row group of a count table (<see cref="RowGroups.Rows"/>).</summary>
    internal const int ChunkRows = RowGroups.Rows;

    /// <summary>Tokens in rank order (null where redacted); made on first use when the rows hold UTF-8.</summary>
    public string?[] Tokens => _tokens ??= _chunks!.SelectMany(c => c.ToStrings()).ToArray();
    /// <summary>Vocabulary ids in rank order (subword tokenizers only).</summary>
    public int[]? TokenIds => _ids;
    /// <summary>Counts in rank order.</summary>
    public long[] Counts => _counts;
    /// <inheritdoc/>
    public bool Repeatable => true;
    /// <inheritdoc/>
    public IEnumerable<CountRowBatch> Batches(int batchSize = 1 << 20)
    {
        if (_chunks is not null && _tokens is null)
        {
            // a chunk at a time (cut further if a smaller batch was asked for)
            for (int c = 0; c < _chunks.Length; c++)
            {
                var chunk = _chunks[c];
                long start = (long)c * ChunkRows;
                for (int s = 0; s < chunk.Length; s += batchSize)
                {
                    int n = Math.Min(batchSize, chunk.Length - s);
                    int from = checked((int)start + s);
                    yield return new CountRowBatch(from + 1, chunk.Slice(s, n), _ids?[from..(from + n)],
                        _counts[from..(from + n)]);
                }
            }
            yield break;
        }
        var tokens = Tokens;
        for (int s = 0; s < _counts.Length; s += batchSize)
        {
            int n = Math.Min(batchSize, _counts.Length - s);
            yield return new CountRowBatch(s + 1, tokens[s..(s + n)], _ids?[s..(s + n)], _counts[s..(s + n)]);
        }
    }

    /// <summary>
    /// Rows <paramref name="rows"/> long in rank order, their tokens written by <paramref name="key"/> into UTF-8
    /// chunks on the run's cores (<see cref="CoreLimit"/>) (<paramref name="key"/> must be safe to call from several threads).
    /// </summary>
    internal static Utf8Tokens[] MakeChunks(int rows, Utf8Tokens.KeyOf key)
    {
        var chunks = new Utf8Tokens[(rows + ChunkRows - 1) / ChunkRows];
        Parallel.For(0, chunks.Length, CoreLimit.Options, c =>
        {
            int start = c * ChunkRows;
            chunks[c] = Utf8Tokens.Build(Math.Min(ChunkRows, rows - start), (i, scratch) => key(start + i, scratch));
        });
        return chunks;
    }

    /// <inheritdoc/>
    public void Dispose() { }
}
