using RankFreq.Counting;
using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>A token sink that adds every token to one table, as a counting thread does (ids are ignored).</summary>
internal sealed class TableSink(TokenTable table) : ITokenSink
{
    public void AddToken(ReadOnlySpan<byte> utf8) => table.Add(utf8, 1, 0);
    public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens) => table.AddPacked(tokens, 0);
    public void AddId(int id) { }
}
