namespace RankFreq.Comparison;

/// <summary>How the candidate serves one group compared with the text as a whole.</summary>
public enum GroupService
{
    /// <summary>Fertility within 5% of the whole text's.</summary>
    Similar,
    /// <summary>Fertility more than 5% above the whole text's: the candidate spends more tokens here.</summary>
    Worse,
    /// <summary>Fertility more than 5% below the whole text's.</summary>
    Better,
    /// <summary>Fewer baseline tokens than <see cref="ShiftGroups.MinTokens"/>: too little text to judge.</summary>
    TooSmall,
}

/// <summary>One group's share of a tokenizer shift (<c>tokshift --by</c>).</summary>
/// <param name="Group">Label.</param>
/// <param name="Documents">Documents (records, or work units of a file for per-file keys).</param>
/// <param name="TextBytes">UTF-8 bytes of text both tokenizers read in this group.</param>
/// <param name="BaselineTokens">Baseline tokens.</param>
/// <param name="CandidateTokens">Candidate tokens.</param>
/// <param name="CorpusFertility">Fertility of the whole text, the yardstick of <see cref="Service"/>.</param>
public sealed record ShiftGroup(string Group, long Documents, long TextBytes, long BaselineTokens, long CandidateTokens,
    double CorpusFertility)
{
    /// <summary>Candidate tokens per baseline token in this group; NaN without baseline tokens.</summary>
    public double Fertility => BaselineTokens > 0 ? CandidateTokens / (double)BaselineTokens : double.NaN;

    /// <summary>Fertility relative to the whole text's, minus one (+0.20: 20% more candidate tokens per baseline
    /// token than over the whole text).</summary>
    public double RelativeFertility => Fertility / CorpusFertility - 1;

    /// <summary>UTF-8 bytes per baseline token; NaN without tokens.</summary>
    public double BaselineBytesPerToken => BaselineTokens > 0 ? TextBytes / (double)BaselineTokens : double.NaN;

    /// <summary>UTF-8 bytes per candidate token; NaN without tokens.</summary>
    public double CandidateBytesPerToken => CandidateTokens > 0 ? TextBytes / (double)CandidateTokens : double.NaN;

    /// <summary>The verdict: worse or better than the whole text by more than <see cref="ShiftGroups.Margin"/>.</summary>
    public GroupService Service =>
        BaselineTokens < ShiftGroups.MinTokens || !double.IsFinite(RelativeFertility) ? GroupService.TooSmall
        : RelativeFertility > ShiftGroups.Margin ? GroupService.Worse
        : RelativeFertility < -ShiftGroups.Margin ? GroupService.Better
        : GroupService.Similar;
}
