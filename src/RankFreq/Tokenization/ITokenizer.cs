namespace RankFreq.Tokenization;

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
