namespace RankFreq.Fitting;

/// <summary>Input that cannot be fitted (not a count table, bad counts, an empty list).</summary>
public sealed class FitInputException(string message, Exception? inner = null) : Exception(message, inner);

/// <summary>How to fit a tail.</summary>
/// <param name="MinTail">Fewest tail points an xmin candidate may leave.</param>
/// <param name="Xmin">Fixed xmin (0: chosen by the KS criterion).</param>
/// <param name="Reps">Goodness-of-fit bootstrap replicates (0 skips the test).</param>
/// <param name="CiReps">Nonparametric bootstrap replicates for the uncertainty of α, xmin and n_tail (0 skips).</param>
/// <param name="Seed">Seed of every random draw.</param>
/// <param name="Threads">Worker threads (0: all cores); results do not depend on it.</param>
/// <param name="Alternatives">Alternative families to compare with.</param>
public sealed record FitOptions(
    int MinTail = 50,
    long Xmin = 0,
    int Reps = 2500,
    int CiReps = 1000,
    ulong Seed = 1,
    int Threads = 0,
    IReadOnlyList<string>? Alternatives = null)
{
    /// <summary>Alternatives to compare (default: all).</summary>
    public IReadOnlyList<string> EffectiveAlternatives => Alternatives ?? Fitting.Alternatives.Names;
    /// <summary>Effective thread count.</summary>
    public int EffectiveThreads => Threads > 0 ? Threads : Environment.ProcessorCount;
}

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
    double Seconds);

/// <summary>Progress of the bootstraps.</summary>
public readonly record struct FitProgress(string Stage, int Done, int Total);
