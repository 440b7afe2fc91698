using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Comparison;

/// <summary>How to contrast document sets.</summary>
/// <param name="Reps">Goodness-of-fit bootstrap replicates per group (0 skips the test).</param>
/// <param name="BootReps">Nonparametric bootstrap replicates per group behind the intervals of α and the pair tests.</param>
/// <param name="ThinReps">Thinning replicates per group for the size-matched figures.</param>
/// <param name="Matched">Whether to compare at matched size (each group thinned to the smallest fitted group's tokens).</param>
/// <param name="MinTail">Fewest tail points an xmin candidate may leave.</param>
/// <param name="RenyiOrder">Order of the Rényi entropy behind the efficiency figure.</param>
/// <param name="Level">Family-wise error rate for the Holm-adjusted pair tests.</param>
/// <param name="Seed">Seed of every random draw.</param>
/// <param name="Threads">Worker threads (0: all cores); results do not depend on it.</param>
public sealed record ContrastOptions(
    int Reps = 200,
    int BootReps = 200,
    int ThinReps = 50,
    bool Matched = true,
    int MinTail = 50,
    double RenyiOrder = 2.5,
    double Level = 0.05,
    ulong Seed = 1,
    int Threads = 0)
{
    /// <summary>Effective thread count.</summary>
    public int EffectiveThreads => Threads > 0 ? Threads : Environment.ProcessorCount;
}

/// <summary>One document set to compare: its label and spectrum.</summary>
/// <param name="Group">Label (a file, folder, field value or bin such as <c>1750–1799</c>).</param>
/// <param name="Spectrum">Its frequency spectrum.</param>
/// <param name="Documents">Documents (records or files) behind it, for the report.</param>
public sealed record GroupSpectrum(string Group, FrequencySpectrum Spectrum, long Documents = 0);

/// <summary>Mean and spread of a figure over replicates.</summary>
/// <param name="Mean">Mean over the replicates where the figure exists.</param>
/// <param name="Sd">Standard deviation over those replicates (n − 1 denominator).</param>
/// <param name="Lo">2.5th percentile.</param>
/// <param name="Hi">97.5th percentile.</param>
/// <param name="Count">Replicates where the figure exists.</param>
public sealed record FigureSpread(double Mean, double Sd, double Lo, double Hi, int Count)
{
    /// <summary>Summary of the finite values of <paramref name="x"/>.</summary>
    public static FigureSpread Of(IEnumerable<double> x)
    {
        var a = x.Where(double.IsFinite).Order().ToArray();
        if (a.Length == 0) return new FigureSpread(double.NaN, double.NaN, double.NaN, double.NaN, 0);
        double mean = a.Average();
        double sd = a.Length > 1 ? Math.Sqrt(a.Sum(t => (t - mean) * (t - mean)) / (a.Length - 1)) : 0;
        return new FigureSpread(mean, sd, TailFitter.Percentile(a, 0.025), TailFitter.Percentile(a, 0.975), a.Length);
    }
}

/// <summary>A figure a contrast reports, and whether it depends on sample size.</summary>
/// <param name="Name">snake_case name used in JSON and tables.</param>
/// <param name="Description">What it is.</param>
/// <param name="SizeSensitive">True when the figure moves with N even for samples of one population, so raw values of
/// groups of different sizes are not comparable; compare those at matched size.</param>
public sealed record FigureInfo(string Name, string Description, bool SizeSensitive);

/// <summary>Whether a group or a matched comparison could be computed.</summary>
public enum ContrastStatus
{
    /// <summary>Computed.</summary>
    Ok,
    /// <summary>The group has no tokens.</summary>
    Empty,
    /// <summary>The tail fit failed (too few types, all equal, boundary); the message says why.</summary>
    FitFailed,
    /// <summary>Most size-matched replicates could not be fitted: the smallest group is too small for a matched comparison.</summary>
    TooSmallWhenMatched,
    /// <summary>Size matching was switched off.</summary>
    NotRun,
}

/// <summary>Figures of one group after thinning to the common size, over the thinning replicates.</summary>
/// <param name="TargetTokens">Common size: the smallest fitted group's token count.</param>
/// <param name="KeepProbability">p = target / tokens of this group.</param>
/// <param name="Reps">Thinning replicates.</param>
/// <param name="FailedFits">Replicates whose tail fit failed.</param>
/// <param name="Figures">Mean and spread of each figure (names as in <see cref="ContrastFigures.All"/>).</param>
/// <param name="AlphaLo">2.5th percentile of α over bootstrap-then-thin replicates (sampling and thinning noise).</param>
/// <param name="AlphaHi">97.5th percentile of the same.</param>
/// <param name="Status">Whether the matched figures can be used.</param>
/// <param name="Message">Why not, when they cannot.</param>
public sealed record MatchedFigures(long TargetTokens, double KeepProbability, int Reps, int FailedFits,
    IReadOnlyDictionary<string, FigureSpread> Figures, double AlphaLo, double AlphaHi, ContrastStatus Status, string Message);

/// <summary>Everything measured for one group.</summary>
/// <param name="Group">Label.</param>
/// <param name="Documents">Documents behind it.</param>
/// <param name="Raw">Lexical figures at the group's own size.</param>
/// <param name="Fit">Tail fit at the group's own size (no alternatives, no internal interval), or null when empty.</param>
/// <param name="AlphaLo">2.5th percentile of bootstrap α.</param>
/// <param name="AlphaHi">97.5th percentile of bootstrap α.</param>
/// <param name="AlphaSd">Bootstrap standard deviation of α.</param>
/// <param name="BootReps">Bootstrap replicates whose fit succeeded.</param>
/// <param name="Matched">Size-matched figures (null when the group was not fitted).</param>
/// <param name="Status">Whether the group takes part in the pair tests.</param>
/// <param name="Message">Why not, when it does not.</param>
public sealed record GroupContrast(string Group, long Documents, VocabularyFigureSet Raw, TailFitResult? Fit, double AlphaLo, double AlphaHi,
    double AlphaSd, int BootReps, MatchedFigures? Matched, ContrastStatus Status, string Message)
{
    /// <summary>The raw α (NaN when not fitted).</summary>
    public double Alpha => Fit is { PowerLaw.Status: FitStatus.Ok } f ? f.PowerLaw.Alpha : double.NaN;
}

/// <summary>A test of α_a − α_b.</summary>
/// <param name="Diff">α_a − α_b (at matched size: difference of the thinning means).</param>
/// <param name="Lo">2.5th percentile of the bootstrap differences.</param>
/// <param name="Hi">97.5th percentile of the bootstrap differences.</param>
/// <param name="Se">√(sd_a² + sd_b²) from the two bootstrap distributions.</param>
/// <param name="P">Two-sided p-value, unadjusted (see <see cref="GroupComparison"/> for the test).</param>
/// <param name="PHolm">Holm-adjusted over all pairs of the same basis.</param>
/// <param name="Significant">PHolm ≤ the level.</param>
/// <param name="DetectableDiff">Smallest |difference| this pair detects with 80% power at the unadjusted level: 2.80·Se.</param>
public sealed record AlphaDifference(double Diff, double Lo, double Hi, double Se, double P, double PHolm, bool Significant, double DetectableDiff);

/// <summary>One pair of groups.</summary>
/// <param name="A">First group.</param>
/// <param name="B">Second group.</param>
/// <param name="Raw">Difference at the groups' own sizes.</param>
/// <param name="Matched">Difference at matched size (null when matching is off or failed for either group).</param>
public sealed record PairContrast(string A, string B, AlphaDifference Raw, AlphaDifference? Matched)
{
    /// <summary>The headline test: matched when available, else raw.</summary>
    public AlphaDifference Headline => Matched ?? Raw;
    /// <summary>"matched" or "raw".</summary>
    public string Basis => Matched is null ? "raw" : "matched";
}

/// <summary>The outcome of a contrast.</summary>
/// <param name="Groups">Every group, in label order, including those too small to fit (with the reason).</param>
/// <param name="Pairs">Every pair of fitted groups.</param>
/// <param name="TargetTokens">Common size of the matched comparison (0 when not run).</param>
/// <param name="Findings">Plain-language lines: which pairs differ after adjustment.</param>
/// <param name="Cautions">What could be misread (power, size dependence, p-value meaning).</param>
/// <param name="Options">Settings used.</param>
/// <param name="SecondsFitting">Wall time of the raw fits and bootstraps.</param>
/// <param name="SecondsMatching">Wall time of the thinning and refitting.</param>
public sealed record ContrastResult(IReadOnlyList<GroupContrast> Groups, IReadOnlyList<PairContrast> Pairs, long TargetTokens,
    IReadOnlyList<string> Findings, IReadOnlyList<string> Cautions, ContrastOptions Options, double SecondsFitting, double SecondsMatching);

/// <summary>Progress of a contrast: stage, group, replicates done.</summary>
public readonly record struct ContrastProgress(string Stage, string Group, int Done, int Total);

/// <summary>The figures a contrast reports, with their size sensitivity.</summary>
public static class ContrastFigures
{
    /// <summary>Names, descriptions and size sensitivity, in report order.</summary>
    public static IReadOnlyList<FigureInfo> All { get; } =
    [
        new("alpha", "tail exponent α (discrete power-law MLE, xmin by KS); a consistent estimator when the tail is a power law, but xmin and the tail " +
            "length move with N", false),
        new("xmin", "lower cut-off of the tail", true),
        new("n_tail", "types in the tail", true),
        new("zipf_s", "Zipf rank exponent s = 1/(α − 1)", false),
        new("tokens", "tokens N", true),
        new("types", "types V", true),
        new("hapax_share", "share of types seen once, V₁/V", true),
        new("good_turing_unseen", "Good–Turing unseen mass N₁/N", true),
        new("entropy_bits", "Shannon entropy per token, Miller–Madow corrected", true),
        new("renyi_efficiency", "Rényi entropy over log V (Zouhar et al. 2023)", true),
        new("heaps_beta", "Heaps β of the expected random-order growth curve", true),
    ];

    /// <summary>The figures of one spectrum and its fit, by name.</summary>
    internal static Dictionary<string, double> Values(VocabularyFigureSet v, PowerLawFit? f)
    {
        bool ok = f is { Status: FitStatus.Ok };
        return new()
        {
            ["alpha"] = ok ? f!.Alpha : double.NaN,
            ["xmin"] = ok ? f!.Xmin : double.NaN,
            ["n_tail"] = ok ? f!.NTail : double.NaN,
            ["zipf_s"] = ok ? 1 / (f!.Alpha - 1) : double.NaN,
            ["tokens"] = v.Tokens,
            ["types"] = v.Types,
            ["hapax_share"] = v.HapaxShare,
            ["good_turing_unseen"] = v.GoodTuringUnseen,
            ["entropy_bits"] = v.EntropyBits,
            ["renyi_efficiency"] = v.RenyiEfficiency,
            ["heaps_beta"] = v.HeapsBeta,
        };
    }
}
