namespace RankFreq.Fitting;

/// <summary>
/// Everything the tail fit found, with what a reader needs to trust it. Field names follow the fit-result table.
/// </summary>
/// <param name="PowerLaw">The fit on the observed data.</param>
/// <param name="NTypes">Types in the whole spectrum.</param>
/// <param name="AlphaSd">Bootstrap standard deviation of α (NaN if not run).</param>
/// <param name="AlphaLo">2.5th percentile of bootstrap α.</param>
/// <param name="AlphaHi">97.5th percentile of bootstrap α.</param>
/// <param name="XminLo">2.5th percentile of bootstrap xmin.</param>
/// <param name="XminHi">97.5th percentile of bootstrap xmin.</param>
/// <param name="NTailSd">Bootstrap standard deviation of n_tail.</param>
/// <param name="GofP">Share of synthetic power-law sets whose KS distance is at least the observed one (NaN if not run).
/// A large value means the power law is not ruled out at this sample size, not that it is proven.</param>
/// <param name="GofReps">Replicates behind <paramref name="GofP"/>.</param>
/// <param name="CiReps">Replicates behind the uncertainty figures.</param>
/// <param name="ZipfS">Zipf's rank exponent s = 1/(α − 1).</param>
/// <param name="ZipfSSe">Delta-method standard error of s: se(α)/(α − 1)².</param>
/// <param name="LsqSlope">Least-squares slope of log frequency on log rank over all types: a biased comparison figure, not an estimate.</param>
/// <param name="Seed">Seed used.</param>
/// <param name="Options">Settings used.</param>
/// <param name="Alternatives">Comparisons with other families.</param>
/// <param name="Seconds">Wall time.</param>
public sealed record TailFitResult(
    PowerLawFit PowerLaw,
    long NTypes,
    double AlphaSd,
    double AlphaLo,
    double AlphaHi,
    double XminLo,
    double XminHi,
    double NTailSd,
    double GofP,
    int GofReps,
    int CiReps,
    double ZipfS,
    double ZipfSSe,
    double LsqSlope,
    ulong Seed,
    FitOptions Options,
    IReadOnlyList<AlternativeComparison> Alternatives,
    double Seconds)
{
    /// <summary>
    /// The finite α of every uncertainty replicate, ascending (empty when the bootstrap was not run), so that readers
    /// can see the whole bootstrap distribution behind <see cref="AlphaLo"/>, <see cref="AlphaHi"/> and <see cref="AlphaSd"/>.
    /// </summary>
    public IReadOnlyList<double> AlphaReplicates { get; init; } = [];
}
