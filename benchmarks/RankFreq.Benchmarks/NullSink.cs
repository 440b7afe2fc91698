using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>A token sink that only counts what it is given: the tokenizer's cost without a table.</summary>
internal sealed class NullSink : ITokenSink
{
    public long N;
    public void AddToken(ReadOnlySpan<byte> utf8) { N++; }
    public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens) { N += tokens.Length; }
    public void AddId(int id) { N++; }
}
