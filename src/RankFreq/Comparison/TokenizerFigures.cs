using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Comparison;

/// <summary>What one tokenizer made of the text: sizes, vocabulary use, concentration, entropy and the tail fit.</summary>
/// <param name="Spec">Tokenizer spec.</param>
/// <param name="Tokens">Tokens counted.</param>
/// <param name="Types">Distinct types seen.</param>
/// <param name="TextBytes">UTF-8 bytes of text tokenized.</param>
/// <param name="VocabularySize">Entries in the tokenizer's vocabulary; 0 for tokenizers without one (words, chars).</param>
/// <param name="SeenEntries">Vocabulary entries seen at least once; null without a vocabulary.</param>
/// <param name="Top10Share">Share of the tokens taken by the 10 most frequent types.</param>
/// <param name="Top100Share">Share of the tokens taken by the 100 most frequent types.</param>
/// <param name="Top1000Share">Share of the tokens taken by the 1,000 most frequent types.</param>
/// <param name="EntropyBits">Shannon entropy of the unigram distribution, bits per token.</param>
/// <param name="RenyiOrder">Order of <paramref name="RenyiEfficiency"/>.</param>
/// <param name="RenyiEfficiency">H_α / log₂|V| with |V| the vocabulary size, or the types seen without a vocabulary.</param>
/// <param name="Fit">The tail fit of the frequency spectrum.</param>
public sealed record TokenizerFigures(
    string Spec,
    long Tokens,
    long Types,
    long TextBytes,
    int VocabularySize,
    long? SeenEntries,
    double Top10Share,
    double Top100Share,
    double Top1000Share,
    double EntropyBits,
    double RenyiOrder,
    double RenyiEfficiency,
    TailFitResult Fit)
{
    /// <summary>UTF-8 bytes per token (compression); NaN with no tokens.</summary>
    public double BytesPerToken => Tokens > 0 ? TextBytes / (double)Tokens : double.NaN;

    /// <summary>Share of vocabulary entries seen; null without a vocabulary.</summary>
    public double? Utilisation => VocabularySize > 0 && SeenEntries is { } s ? s / (double)VocabularySize : null;

    /// <summary>The frequency spectrum the figures were computed from (for plots).</summary>
    public FrequencySpectrum? Spectrum { get; init; }

    /// <summary>What the Rényi denominator |V| is.</summary>
    public string RenyiBase => VocabularySize > 0 ? "vocabulary size" : "types seen";
}
