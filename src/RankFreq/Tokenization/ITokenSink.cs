namespace RankFreq.Tokenization;

/// <summary>Receives the tokens a tokenizer session finds, in corpus order.</summary>
public interface ITokenSink
{
    /// <summary>One occurrence of a token given by its UTF-8 bytes (already normalised by the tokenizer).</summary>
    void AddToken(ReadOnlySpan<byte> utf8);

    /// <summary>
    /// Occurrences of tokens of 1 to 16 bytes each, in corpus order, packed as <see cref="PackedToken"/>s: a hot-path
    /// form of <see cref="AddToken"/> that lets a counter hash and compare each token as two words, a batch at a time.
    /// </summary>
    void AddPackedTokens(ReadOnlySpan<PackedToken> tokens)
    {
        Span<byte> b = stackalloc byte[16];
        foreach (var t in tokens)
        {
            System.Buffers.Binary.BinaryPrimitives.WriteUInt64LittleEndian(b, t.Lo);
            System.Buffers.Binary.BinaryPrimitives.WriteUInt64LittleEndian(b[8..], t.Hi);
            AddToken(b[..t.Length]);
        }
    }

    /// <summary>One occurrence of a subword token given by its vocabulary id.</summary>
    void AddId(int id);

    /// <summary>Occurrences of subword tokens given by their vocabulary ids, in order (one call per chunk).</summary>
    void AddIds(ReadOnlySpan<int> ids)
    {
        foreach (int id in ids) AddId(id);
    }
}
