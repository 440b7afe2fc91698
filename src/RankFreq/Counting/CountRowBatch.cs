using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>A slice of the rank table: row <c>i</c> has rank <c>FirstRank + i</c>.</summary>
public sealed record CountRowBatch(long FirstRank, string?[] Tokens, int[]? TokenIds, long[] Counts);
