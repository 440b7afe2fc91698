namespace RankFreq.Tokenization;

/// <summary>End of the chunk of <paramref name="t"/> that starts at <paramref name="p"/> (<paramref name="p"/> when no rule matches).</summary>
internal delegate int ChunkMatcher(ReadOnlySpan<char> t, int p);
