namespace RankFreq.Tokenization;

/// <summary>Receives the tokens a tokenizer session finds, in corpus order.</summary>
public interface ITokenSink
{
    /// <summary>One occurrence of a token given by its UTF-8 bytes (already normalised by the tokenizer).</summary>
    void AddToken(ReadOnlySpan<byte> utf8);

    /// <summary>
    /// One occurrence of a token of 1 to 16 bytes, packed: <paramref name="lo"/> holds bytes 0–7 and
    /// <paramref name="hi"/> bytes 8–15, little-endian, zero past <paramref name="length"/>. A hot-path form of
    /// <see cref="AddToken"/> that lets a counter hash and compare the token as two words without reading it again.
    /// </summary>
    void AddShortToken(ulong lo, ulong hi, int length)
    {
        Span<byte> b = stackalloc byte[16];
        System.Buffers.Binary.BinaryPrimitives.WriteUInt64LittleEndian(b, lo);
        System.Buffers.Binary.BinaryPrimitives.WriteUInt64LittleEndian(b[8..], hi);
        AddToken(b[..length]);
    }

    /// <summary>One occurrence of a subword token given by its vocabulary id.</summary>
    void AddId(int id);
}

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
