using RankFreq.Primitives;

namespace RankFreq.Fitting;

/// <summary>
/// The fields of a tail fit and of its comparisons with other families, listed once: the fit table, the alternatives
/// table, every JSON form and the console and report tables are generated from these lists.
/// </summary>
public static class TailFitFields
{
    private static bool Fitted(TailFitResult f) => f.PowerLaw.Status == FitStatus.Ok;

    /// <summary>One row per fit.</summary>
    public static readonly IReadOnlyList<ResultField<TailFitResult>> Fit =
    [
        new("alpha", FieldKind.Real, f => f.PowerLaw.Alpha, "tail exponent α", "F3"),
        new("alpha_se", FieldKind.Real, f => f.PowerLaw.AlphaSe, "standard error of α (Fisher information)", "F4"),
        new("alpha_approx", FieldKind.Real, f => f.PowerLaw.AlphaApprox, "α, closed-form approximation", "F3"),
        new("alpha_sd", FieldKind.Real, f => f.AlphaSd, "bootstrap standard deviation of α", "F4"),
        new("alpha_lo", FieldKind.Real, f => f.AlphaLo, "α, 95% bootstrap interval, low", "F3"),
        new("alpha_hi", FieldKind.Real, f => f.AlphaHi, "α, 95% bootstrap interval, high", "F3"),
        new("xmin", FieldKind.Integer, f => f.PowerLaw.Xmin > 0 ? f.PowerLaw.Xmin : null, "lower cut-off xmin"),
        new("xmin_lo", FieldKind.Integer, f => Floor(f.XminLo), "xmin, 95% bootstrap interval, low"),
        new("xmin_hi", FieldKind.Integer, f => Ceiling(f.XminHi), "xmin, 95% bootstrap interval, high"),
        new("n_tail", FieldKind.Integer, f => Fitted(f) ? f.PowerLaw.NTail : null, "types in the tail (x ≥ xmin)"),
        new("n_tail_sd", FieldKind.Real, f => f.NTailSd, "bootstrap standard deviation of the tail size", "F1"),
        new("n_types", FieldKind.Integer, f => f.NTypes, "types in all"),
        new("ks_distance", FieldKind.Real, f => f.PowerLaw.KsDistance, "Kolmogorov–Smirnov distance", "F4"),
        new("gof_p", FieldKind.Real, f => f.GofP, "goodness-of-fit p", "F3"),
        new("gof_reps", FieldKind.Integer, f => f.GofReps, "goodness-of-fit replicates"),
        new("ci_reps", FieldKind.Integer, f => f.CiReps, "uncertainty replicates"),
        new("zipf_s", FieldKind.Real, f => f.ZipfS, "Zipf rank exponent s = 1/(α − 1)", "F3"),
        new("zipf_s_se", FieldKind.Real, f => f.ZipfSSe, "standard error of s", "F4"),
        new("lsq_slope", FieldKind.Real, f => f.LsqSlope, "log–log least-squares slope (biased; comparison only)", "F3"),
        new("seed", FieldKind.Integer, f => f.Seed, "seed", "D"),
        new("min_tail", FieldKind.Integer, f => f.Options.MinTail, "fewest tail points allowed", Shown: false),
        new("xmin_fixed", FieldKind.Flag, f => f.Options.Xmin > 0, "xmin fixed by the user", Shown: false),
        new("status", FieldKind.Text, f => FitStatusNames.Of(f.PowerLaw.Status), "status"),
        new("message", FieldKind.Text, f => f.PowerLaw.Message, "message", Shown: false),
    ];

    /// <summary>One row per comparison with another family.</summary>
    public static readonly IReadOnlyList<ResultField<AlternativeComparison>> Alternative =
    [
        new("name", FieldKind.Text, a => a.Name, "alternative"),
        new("parameters", FieldKind.Nested, a => a.Parameters.ToDictionary(kv => kv.Key, kv => (object?)Finite(kv.Value)),
            "parameters"),
        new("log_likelihood", FieldKind.Real, a => a.LogLikelihood, "log-likelihood of the alternative", "F2", Shown: false),
        new("llr", FieldKind.Real, a => a.Llr, "log-likelihood ratio", "F2"),
        new("normalized_llr", FieldKind.Real, a => a.NormalizedLlr, "normalised ratio", "F2"),
        new("p", FieldKind.Real, a => a.P, "p", "F3"),
        new("favours", FieldKind.Text, a => a.Favours, "favours"),
        new("status", FieldKind.Text, a => FitStatusNames.Of(a.Status), "status", Shown: false),
        new("message", FieldKind.Text, a => a.Message, "message", Shown: false),
    ];

    /// <summary>The fit fields plus its alternatives nested, as in <c>--json</c> and summary.json.</summary>
    public static readonly IReadOnlyList<ResultField<TailFitResult>> FitWithAlternatives =
    [
        .. Fit,
        new("alternatives", FieldKind.Nested, f => ResultFields.ToMaps(Alternative, f.Alternatives), "alternatives",
            Shown: false),
    ];

    private static long? Floor(double x) => double.IsFinite(x) ? (long)Math.Floor(x) : null;
    private static long? Ceiling(double x) => double.IsFinite(x) ? (long)Math.Ceiling(x) : null;
    private static double? Finite(double x) => double.IsFinite(x) ? x : null;
}
