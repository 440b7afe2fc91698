using RankFreq.Fitting;
using RankFreq.Primitives;

namespace RankFreq.Comparison;

/// <summary>
/// The fields of a contrast, listed once: the group table, the matched figures and the α differences. Parquet
/// columns, JSON and the report tables are generated from these lists.
/// </summary>
public static class ContrastFields
{
    /// <summary>snake_case form of a status.</summary>
    public static string Status(ContrastStatus s) => s switch
    {
        ContrastStatus.Ok => "ok",
        ContrastStatus.Empty => "empty",
        ContrastStatus.FitFailed => "fit_failed",
        ContrastStatus.TooSmallWhenMatched => "too_small_when_matched",
        _ => "not_run",
    };

    private static double Fit(GroupContrast g, Func<TailFitResult, double> f) => g.Fit is { } x ? f(x) : double.NaN;

    /// <summary>Raw (own-size) fields of a group.</summary>
    public static IReadOnlyList<ResultField<GroupContrast>> Group { get; } =
    [
        new("group", FieldKind.Text, g => g.Group, "group"),
        new("status", FieldKind.Text, g => Status(g.Status), "status"),
        new("message", FieldKind.Text, g => g.Message, "message"),
        new("documents", FieldKind.Integer, g => g.Documents, "documents", "N0"),
        new("tokens", FieldKind.Integer, g => g.Raw.Tokens, "tokens", "N0"),
        new("types", FieldKind.Integer, g => g.Raw.Types, "types", "N0"),
        new("alpha", FieldKind.Real, g => g.Alpha, "α", "F3"),
        new("alpha_lo", FieldKind.Real, g => g.AlphaLo, "α 2.5%", "F3"),
        new("alpha_hi", FieldKind.Real, g => g.AlphaHi, "α 97.5%", "F3"),
        new("alpha_sd", FieldKind.Real, g => g.AlphaSd, "α bootstrap sd", "F3"),
        new("boot_reps", FieldKind.Integer, g => (long)g.BootReps, "bootstrap replicates", "N0"),
        new("xmin", FieldKind.Real, g => g.Status == ContrastStatus.Ok ? g.Fit!.PowerLaw.Xmin : double.NaN, "xmin", "N0"),
        new("n_tail", FieldKind.Real, g => g.Status == ContrastStatus.Ok ? g.Fit!.PowerLaw.NTail : double.NaN, "tail types", "N0"),
        new("ks_distance", FieldKind.Real, g => Fit(g, f => f.PowerLaw.KsDistance), "KS distance", "F4"),
        new("gof_p", FieldKind.Real, g => Fit(g, f => f.GofP), "goodness-of-fit p", "F3"),
        new("gof_reps", FieldKind.Integer, g => (long)(g.Fit?.GofReps ?? 0), "goodness-of-fit replicates", "N0"),
        new("zipf_s", FieldKind.Real, g => Fit(g, f => f.ZipfS), "Zipf s", "F3"),
        new("hapax_share", FieldKind.Real, g => g.Raw.HapaxShare, "hapax share", "F3"),
        new("good_turing_unseen", FieldKind.Real, g => g.Raw.GoodTuringUnseen, "unseen mass N₁/N", "F4"),
        new("entropy_bits", FieldKind.Real, g => g.Raw.EntropyBits, "entropy, bits", "F3"),
        new("renyi_efficiency", FieldKind.Real, g => g.Raw.RenyiEfficiency, "Rényi efficiency", "F3"),
        new("heaps_beta", FieldKind.Real, g => g.Raw.HeapsBeta, "Heaps β", "F3"),
    ];

    /// <summary>Matched-size fields: settings of the matching, then each figure's mean and spread.</summary>
    public static IReadOnlyList<ResultField<MatchedFigures>> Matched { get; } =
    [
        new("status", FieldKind.Text, m => Status(m.Status), "status"),
        new("message", FieldKind.Text, m => m.Message, "message"),
        new("target_tokens", FieldKind.Integer, m => m.TargetTokens, "matched size", "N0"),
        new("keep_probability", FieldKind.Real, m => m.KeepProbability, "keep probability", "F4"),
        new("thin_reps", FieldKind.Integer, m => (long)m.Reps, "thinning replicates", "N0"),
        new("failed_fits", FieldKind.Integer, m => (long)m.FailedFits, "failed fits", "N0"),
        new("alpha_lo", FieldKind.Real, m => m.AlphaLo, "α 2.5%", "F3"),
        new("alpha_hi", FieldKind.Real, m => m.AlphaHi, "α 97.5%", "F3"),
        .. ContrastFigures.All.SelectMany(fi => new ResultField<MatchedFigures>[]
        {
            new(fi.Name, FieldKind.Real, m => m.Figures[fi.Name].Mean, fi.Name.Replace('_', ' '), "G4"),
            new(fi.Name + "_sd", FieldKind.Real, m => m.Figures[fi.Name].Sd, fi.Name.Replace('_', ' ') + " sd", "G3", Shown: false),
        }),
    ];

    /// <summary>Fields of one α difference.</summary>
    public static IReadOnlyList<ResultField<AlphaDifference>> Difference { get; } =
    [
        new("alpha_diff", FieldKind.Real, d => d.Diff, "α_a − α_b", "F3"),
        new("diff_lo", FieldKind.Real, d => d.Lo, "difference 2.5%", "F3"),
        new("diff_hi", FieldKind.Real, d => d.Hi, "difference 97.5%", "F3"),
        new("se", FieldKind.Real, d => d.Se, "standard error", "F3"),
        new("p", FieldKind.Real, d => d.P, "p", "G3"),
        new("p_holm", FieldKind.Real, d => d.PHolm, "Holm p", "G3"),
        new("significant", FieldKind.Flag, d => d.Significant, "differ"),
        new("detectable_diff", FieldKind.Real, d => d.DetectableDiff, "detectable difference", "F3"),
    ];

    /// <summary>Flat fields of a pair for tables: a, b, basis, the headline difference, then raw_ and matched_ copies.</summary>
    public static IReadOnlyList<ResultField<PairContrast>> PairFlat { get; } =
    [
        new("a", FieldKind.Text, p => p.A, "a"),
        new("b", FieldKind.Text, p => p.B, "b"),
        new("basis", FieldKind.Text, p => p.Basis, "basis"),
        .. Difference.Select(d => d.From<PairContrast>(p => p.Headline)),
        .. Difference.Select(d => new ResultField<PairContrast>("raw_" + d.Name, d.Kind, p => d.Get(p.Raw), "raw " + d.Label, d.Format)),
        .. Difference.Select(d => new ResultField<PairContrast>("matched_" + d.Name, d.Kind,
            p => p.Matched is { } m ? d.Get(m) : null, "matched " + d.Label, d.Format)),
    ];

    /// <summary>Flat fields of a group for tables: raw fields, then matched_ copies (NaN/null when not matched).</summary>
    public static IReadOnlyList<ResultField<GroupContrast>> GroupFlat { get; } =
    [
        .. Group,
        .. Matched.Select(m => new ResultField<GroupContrast>("matched_" + m.Name, m.Kind,
            g => g.Matched is { } x ? m.Get(x) : null, "matched " + m.Label, m.Format)),
    ];
}
