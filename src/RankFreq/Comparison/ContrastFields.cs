using RankFreq.Fitting;

namespace RankFreq.Comparison;

/// <summary>The kind of a result field, which fixes its Parquet type and JSON form.</summary>
public enum FieldKind
{
    /// <summary>Text.</summary>
    Text,
    /// <summary>64-bit integer.</summary>
    Integer,
    /// <summary>Double; NaN is written as null.</summary>
    Real,
    /// <summary>Boolean.</summary>
    Flag,
}

/// <summary>A named field of a result: its snake_case name, kind and getter.</summary>
/// <typeparam name="T">The result type.</typeparam>
/// <param name="Name">snake_case name used in Parquet, JSON, the console and HTML.</param>
/// <param name="Kind">Kind.</param>
/// <param name="Get">Getter (string, long, double or bool).</param>
public sealed record ResultField<T>(string Name, FieldKind Kind, Func<T, object?> Get);

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
        new("group", FieldKind.Text, g => g.Group),
        new("status", FieldKind.Text, g => Status(g.Status)),
        new("message", FieldKind.Text, g => g.Message),
        new("documents", FieldKind.Integer, g => g.Documents),
        new("tokens", FieldKind.Integer, g => g.Raw.Tokens),
        new("types", FieldKind.Integer, g => g.Raw.Types),
        new("alpha", FieldKind.Real, g => g.Alpha),
        new("alpha_lo", FieldKind.Real, g => g.AlphaLo),
        new("alpha_hi", FieldKind.Real, g => g.AlphaHi),
        new("alpha_sd", FieldKind.Real, g => g.AlphaSd),
        new("boot_reps", FieldKind.Integer, g => (long)g.BootReps),
        new("xmin", FieldKind.Real, g => g.Status == ContrastStatus.Ok ? g.Fit!.PowerLaw.Xmin : double.NaN),
        new("n_tail", FieldKind.Real, g => g.Status == ContrastStatus.Ok ? g.Fit!.PowerLaw.NTail : double.NaN),
        new("ks_distance", FieldKind.Real, g => Fit(g, f => f.PowerLaw.KsDistance)),
        new("gof_p", FieldKind.Real, g => Fit(g, f => f.GofP)),
        new("gof_reps", FieldKind.Integer, g => (long)(g.Fit?.GofReps ?? 0)),
        new("zipf_s", FieldKind.Real, g => Fit(g, f => f.ZipfS)),
        new("hapax_share", FieldKind.Real, g => g.Raw.HapaxShare),
        new("good_turing_unseen", FieldKind.Real, g => g.Raw.GoodTuringUnseen),
        new("entropy_bits", FieldKind.Real, g => g.Raw.EntropyBits),
        new("renyi_efficiency", FieldKind.Real, g => g.Raw.RenyiEfficiency),
        new("heaps_beta", FieldKind.Real, g => g.Raw.HeapsBeta),
    ];

    /// <summary>Matched-size fields: settings of the matching, then each figure's mean and spread.</summary>
    public static IReadOnlyList<ResultField<MatchedFigures>> Matched { get; } =
    [
        new("status", FieldKind.Text, m => Status(m.Status)),
        new("message", FieldKind.Text, m => m.Message),
        new("target_tokens", FieldKind.Integer, m => m.TargetTokens),
        new("keep_probability", FieldKind.Real, m => m.KeepProbability),
        new("thin_reps", FieldKind.Integer, m => (long)m.Reps),
        new("failed_fits", FieldKind.Integer, m => (long)m.FailedFits),
        new("alpha_lo", FieldKind.Real, m => m.AlphaLo),
        new("alpha_hi", FieldKind.Real, m => m.AlphaHi),
        .. ContrastFigures.All.SelectMany(fi => new ResultField<MatchedFigures>[]
        {
            new(fi.Name, FieldKind.Real, m => m.Figures[fi.Name].Mean),
            new(fi.Name + "_sd", FieldKind.Real, m => m.Figures[fi.Name].Sd),
        }),
    ];

    /// <summary>Fields of one α difference.</summary>
    public static IReadOnlyList<ResultField<AlphaDifference>> Difference { get; } =
    [
        new("alpha_diff", FieldKind.Real, d => d.Diff),
        new("diff_lo", FieldKind.Real, d => d.Lo),
        new("diff_hi", FieldKind.Real, d => d.Hi),
        new("se", FieldKind.Real, d => d.Se),
        new("p", FieldKind.Real, d => d.P),
        new("p_holm", FieldKind.Real, d => d.PHolm),
        new("significant", FieldKind.Flag, d => d.Significant),
        new("detectable_diff", FieldKind.Real, d => d.DetectableDiff),
    ];

    /// <summary>Flat fields of a pair for tables: a, b, basis, the headline difference, then raw_ and matched_ copies.</summary>
    public static IReadOnlyList<ResultField<PairContrast>> PairFlat { get; } =
    [
        new("a", FieldKind.Text, p => p.A),
        new("b", FieldKind.Text, p => p.B),
        new("basis", FieldKind.Text, p => p.Basis),
        .. Difference.Select(d => new ResultField<PairContrast>(d.Name, d.Kind, p => d.Get(p.Headline))),
        .. Difference.Select(d => new ResultField<PairContrast>("raw_" + d.Name, d.Kind, p => d.Get(p.Raw))),
        .. Difference.Select(d => new ResultField<PairContrast>("matched_" + d.Name, d.Kind,
            p => p.Matched is { } m ? d.Get(m) : d.Kind == FieldKind.Flag ? null : double.NaN)),
    ];

    /// <summary>Flat fields of a group for tables: raw fields, then matched_ copies (NaN/null when not matched).</summary>
    public static IReadOnlyList<ResultField<GroupContrast>> GroupFlat { get; } =
    [
        .. Group,
        .. Matched.Select(m => new ResultField<GroupContrast>("matched_" + m.Name, m.Kind,
            g => g.Matched is { } x ? m.Get(x) : m.Kind == FieldKind.Real ? double.NaN : null)),
    ];
}
