using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>
/// The frequency spectrum: <c>Types[i]</c> types occur exactly <c>Values[i]</c> times; values strictly increasing.
/// Every statistic downstream works on these (value, multiplicity) pairs, never one value per type.
/// </summary>
public sealed record FrequencySpectrum(long[] Values, long[] Types)
{
    /// <summary>Number of types (Σ multiplicities).</summary>
    public long TypeCount { get; } = Types.Sum();

    /// <summary>Number of tokens (Σ value × multiplicity).</summary>
    public long TokenCount { get; } = Values.Zip(Types, (v, m) => v * m).Sum();

    /// <summary>Builds a spectrum from (value, multiplicity) pairs in any order; equal values are added up.</summary>
    public static FrequencySpectrum FromPairs(IEnumerable<(long Value, long Types)> pairs)
    {
        var d = new SortedDictionary<long, long>();
        foreach (var (v, m) in pairs)
        {
            if (m == 0) continue;
            d[v] = d.TryGetValue(v, out var x) ? x + m : m;
        }
        return new FrequencySpectrum(d.Keys.ToArray(), d.Values.ToArray());
    }

    /// <summary>Equal when the (value, multiplicity) pairs are equal.</summary>
    public bool Equals(FrequencySpectrum? other) => other is not null && Values.AsSpan().SequenceEqual(other.Values) && Types.AsSpan().SequenceEqual(other.Types);

    /// <inheritdoc/>
    public override int GetHashCode() => HashCode.Combine(Values.Length, TypeCount, TokenCount);

    /// <summary>Builds a spectrum from one count per type.</summary>
    public static FrequencySpectrum FromCounts(IEnumerable<long> counts) => FromPairs(counts.Select(c => (c, 1L)));
}

/// <summary>Observed vocabulary growth: after the first <c>Tokens[i]</c> tokens in corpus order, <c>Types[i]</c> types had been seen.</summary>
public sealed record GrowthCurve(long[] Tokens, long[] Types)
{
    /// <summary>About <paramref name="points"/> log-spaced checkpoints from 1 to <paramref name="total"/>, always ending at the total.</summary>
    public static long[] Checkpoints(long total, int points = 200)
    {
        if (total <= 0) return [];
        var s = new long[points + 2];
        int n = 0;
        // total^(i/points) rises with i, so duplicates are adjacent
        for (int i = 0; i <= points + 1; i++)
        {
            long c = i > points ? total : Math.Min(total, Math.Max(1, (long)Math.Round(Math.Pow(total, i / (double)points))));
            if (n == 0 || c > s[n - 1]) s[n++] = c;
        }
        return s[..n];
    }
}

/// <summary>An input as recorded in the count table metadata.</summary>
public sealed record InputInfo(string Path, long Bytes);

/// <summary>What a counting run did.</summary>
public sealed record CountSummary(
    string TokenizerSpec,
    string Normalization,
    string CaseRule,
    long Tokens,
    long Types,
    long StoredBytes,
    long TextBytes,
    long ReplacedBytes,
    long Records,
    long MalformedRecords,
    long MissingField,
    IReadOnlyList<SkippedFile> SkippedFiles,
    IReadOnlyList<InputInfo> Inputs,
    int Threads,
    int SpilledRuns,
    double Seconds);

/// <summary>A slice of the rank table: row <c>i</c> has rank <c>FirstRank + i</c>.</summary>
public sealed record CountRowBatch(long FirstRank, string?[] Tokens, int[]? TokenIds, long[] Counts);

/// <summary>The rank table as batches in rank order (streamed from disk after a spill, so it may be read once).</summary>
public interface ICountRows : IDisposable
{
    /// <summary>Whether the rows can be enumerated more than once.</summary>
    bool Repeatable { get; }
    /// <summary>The rows in rank order, in batches of at most <paramref name="batchSize"/>.</summary>
    IEnumerable<CountRowBatch> Batches(int batchSize = 1 << 20);
}

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

/// <summary>The outcome of counting: summary, rank table, spectrum and observed growth. Dispose removes temporary files.</summary>
public sealed class CountResult(CountSummary summary, ICountRows rows, FrequencySpectrum spectrum, GrowthCurve growth, bool hasTokenIds) : IDisposable
{
    /// <summary>What the run did.</summary>
    public CountSummary Summary => summary;
    /// <summary>The rank table.</summary>
    public ICountRows Rows => rows;
    /// <summary>The frequency spectrum of the counts.</summary>
    public FrequencySpectrum Spectrum => spectrum;
    /// <summary>Vocabulary growth in corpus order.</summary>
    public GrowthCurve Growth => growth;
    /// <summary>Whether rows carry vocabulary ids.</summary>
    public bool HasTokenIds => hasTokenIds;
    /// <inheritdoc/>
    public void Dispose() => rows.Dispose();
}

/// <summary>How to count.</summary>
/// <param name="Tokenizer">Tokenizer spec.</param>
/// <param name="Source">How inputs are read.</param>
/// <param name="Threads">Worker threads (0: all cores).</param>
/// <param name="MemoryBytes">Memory budget for count tables before spilling to disk (0: a quarter of physical memory).</param>
/// <param name="ShardIndex">1-based shard to count, with <paramref name="ShardCount"/>; 0 counts everything.</param>
/// <param name="ShardCount">Number of shards.</param>
/// <param name="TempDirectory">Where spill runs go (default: the system temporary folder).</param>
/// <param name="SplitAboveBytes">Plain text files larger than this are cut into newline-aligned ranges counted in parallel.</param>
public sealed record CountSettings(
    string Tokenizer = "words",
    SourceOptions? Source = null,
    int Threads = 0,
    long MemoryBytes = 0,
    int ShardIndex = 0,
    int ShardCount = 0,
    string? TempDirectory = null,
    long SplitAboveBytes = 16L << 20)
{
    /// <summary>Effective thread count.</summary>
    public int EffectiveThreads => Threads > 0 ? Threads : Environment.ProcessorCount;
    /// <summary>Effective memory budget in bytes.</summary>
    public long EffectiveMemory => MemoryBytes > 0 ? MemoryBytes : Math.Max(64L << 20, GC.GetGCMemoryInfo().TotalAvailableMemoryBytes / 4);
}

/// <summary>Progress of a counting run.</summary>
/// <param name="DoneBytes">Stored bytes consumed.</param>
/// <param name="TotalBytes">Stored bytes in all (0 when unknown, e.g. standard input).</param>
/// <param name="Tokens">Tokens counted so far.</param>
/// <param name="Elapsed">Time since start.</param>
public readonly record struct CountProgress(long DoneBytes, long TotalBytes, long Tokens, TimeSpan Elapsed);

/// <summary>Errors of the counting stage (memory, temporary files, incompatible tables).</summary>
public sealed class CountingException(string message, Exception? inner = null) : Exception(message, inner);
