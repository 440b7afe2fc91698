using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>A slice of the rank table: row <c>i</c> has rank <c>FirstRank + i</c>.</summary>
/// <remarks>
/// Tokens come as strings or, from the counting engine, as UTF-8 (<see cref="Utf8"/>); <see cref="Tokens"/> gives
/// strings either way (made on first use), while writers that can take the bytes read <see cref="Utf8"/>.
/// </remarks>
public sealed class CountRowBatch
{
    private string?[]? _tokens;

    /// <summary>A batch of tokens given as strings (null where redacted).</summary>
    public CountRowBatch(long firstRank, string?[] tokens, int[]? tokenIds, long[] counts)
    {
        FirstRank = firstRank;
        _tokens = tokens;
        TokenIds = tokenIds;
        Counts = counts;
    }

    /// <summary>A batch of tokens given as UTF-8 bytes.</summary>
    public CountRowBatch(long firstRank, Utf8Tokens tokens, int[]? tokenIds, long[] counts)
    {
        FirstRank = firstRank;
        Utf8 = tokens;
        TokenIds = tokenIds;
        Counts = counts;
    }

    /// <summary>Rank of the first row.</summary>
    public long FirstRank { get; }

    /// <summary>The tokens as strings (null where redacted).</summary>
    public string?[] Tokens => _tokens ??= Utf8!.ToStrings();

    /// <summary>The tokens as UTF-8 when the batch was made from bytes (no token is null then), else null.</summary>
    public Utf8Tokens? Utf8 { get; }

    /// <summary>Vocabulary ids (subword tokenizers only).</summary>
    public int[]? TokenIds { get; }

    /// <summary>Counts.</summary>
    public long[] Counts { get; }
}
