namespace RankFreq.Tokenization;

/// <summary>Stateful tokenizer for one worker: text arrives in blocks; a token never breaks at a block edge.</summary>
public interface ITokenizerSession
{
    /// <summary>Feeds a block of valid UTF-8. <paramref name="endOfDocument"/> flushes any token held back at the edge.</summary>
    void Feed(ReadOnlySpan<byte> utf8, bool endOfDocument);
}
