namespace RankFreq.Comparison;

/// <summary>What changing the tokenizer did to the distribution of one text.</summary>
/// <param name="Baseline">Figures of the baseline tokenizer.</param>
/// <param name="Candidate">Figures of the candidate tokenizer.</param>
/// <param name="AlphaDiff">α(candidate) − α(baseline); NaN unless both fits succeeded.</param>
/// <param name="AlphaDiffLo">2.5th percentile of the bootstrap difference.</param>
/// <param name="AlphaDiffHi">97.5th percentile of the bootstrap difference.</param>
/// <param name="Unseen">Vocabulary entries of the candidate never seen (empty without a vocabulary).</param>
/// <param name="BaselineUnseen">Vocabulary entries of the baseline never seen (empty without a vocabulary).</param>
public sealed record ShiftResult(
    TokenizerFigures Baseline,
    TokenizerFigures Candidate,
    double AlphaDiff,
    double AlphaDiffLo,
    double AlphaDiffHi,
    IReadOnlyList<UnseenEntry> Unseen,
    IReadOnlyList<UnseenEntry> BaselineUnseen)
{
    /// <summary>Candidate tokens per baseline token (tokens per word when the baseline is <c>words</c>).</summary>
    public double Fertility => Baseline.Tokens > 0 ? Candidate.Tokens / (double)Baseline.Tokens : double.NaN;

    /// <summary>Relative change in token count: fertility − 1 (−0.12 means 12% fewer tokens).</summary>
    public double TokenChange => Fertility - 1;

    /// <summary>The group key of <see cref="Groups"/> as written (<c>field:source</c>); null without one.</summary>
    public string? GroupKey { get; init; }

    /// <summary>Fertility and bytes per token per group, in the key's order; empty without a group key.</summary>
    public IReadOnlyList<ShiftGroup> Groups { get; init; } = [];
}
