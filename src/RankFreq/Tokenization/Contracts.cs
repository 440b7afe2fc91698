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

/// <summary>
/// A token of 1 to 16 UTF-8 bytes: <see cref="Lo"/> holds bytes 0–7 and <see cref="Hi"/> bytes 8–15, little-endian,
/// zero past <see cref="Length"/>.
/// </summary>
/// <param name="Lo">Bytes 0–7.</param>
/// <param name="Hi">Bytes 8–15.</param>
/// <param name="Length">Length in bytes (1–16).</param>
public readonly record struct PackedToken(ulong Lo, ulong Hi, int Length);

/// <summary>Stateful tokenizer for one worker: text arrives in blocks; a token never breaks at a block edge.</summary>
public interface ITokenizerSession
{
    /// <summary>Feeds a block of valid UTF-8. <paramref name="endOfDocument"/> flushes any token held back at the edge.</summary>
    void Feed(ReadOnlySpan<byte> utf8, bool endOfDocument);
}

/// <summary>How a tokenizer identifies its types.</summary>
public enum TokenIdentity
{
    /// <summary>Types are byte strings (word rules).</summary>
    Bytes,
    /// <summary>Types are vocabulary ids (subword vocabularies).</summary>
    Ids,
}

/// <summary>A tokenizer built from a spec string such as <c>words</c> or <c>o200k_base</c>.</summary>
public interface ITokenizer
{
    /// <summary>The spec string this tokenizer was made from, normalised.</summary>
    string Spec { get; }

    /// <summary>Normalisation applied before splitting (written to the count table metadata).</summary>
    string Normalization { get; }

    /// <summary>Case rule (<c>folded</c> or <c>kept</c>).</summary>
    string CaseRule { get; }

    /// <summary>Whether types are byte strings or vocabulary ids.</summary>
    TokenIdentity Identity { get; }

    /// <summary>Vocabulary size for id tokenizers (ids are in [0, size)); 0 for byte tokenizers.</summary>
    int VocabularySize { get; }

    /// <summary>Where a long plain-text file may be cut into ranges counted in parallel without changing any token.</summary>
    Sources.RangeCut RangeCut { get; }

    /// <summary>Readable, unique form of a vocabulary id: valid UTF-8 text as is, other bytes escaped as <c>\xHH</c>.</summary>
    string DisplayToken(int id);

    /// <summary>Creates a session that reports tokens to <paramref name="sink"/>.</summary>
    ITokenizerSession CreateSession(ITokenSink sink);
}

/// <summary>A bad tokenizer spec or vocabulary file.</summary>
public sealed class TokenizerException(string message, Exception? inner = null) : Exception(message, inner);
