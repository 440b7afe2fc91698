using RankFreq.Fitting;
using RankFreq.Primitives;

namespace RankFreq.Comparison;

/// <summary>
/// The fields of a tokenizer shift, listed once: shift.parquet, the JSON document and the console tables are
/// generated from these lists.
/// </summary>
public static class ShiftFields
{
    private static readonly string[] FitNames =
        ["alpha", "alpha_lo", "alpha_hi", "xmin", "xmin_lo", "xmin_hi", "n_tail", "zipf_s", "zipf_s_se", "gof_p", "status"];

    /// <summary>The figures of one tokenizer.</summary>
    public static readonly IReadOnlyList<ResultField<TokenizerFigures>> Side =
    [
        new("tokenizer", FieldKind.Text, f => f.Spec, "tokenizer"),
        new("tokens", FieldKind.Integer, f => f.Tokens, "tokens"),
        new("types", FieldKind.Integer, f => f.Types, "types"),
        new("text_bytes", FieldKind.Integer, f => f.TextBytes, "text bytes", Shown: false),
        new("bytes_per_token", FieldKind.Real, f => f.BytesPerToken, "bytes per token", "F3"),
        new("vocabulary_size", FieldKind.Integer, f => f.VocabularySize > 0 ? f.VocabularySize : null, "vocabulary size"),
        new("vocabulary_seen", FieldKind.Integer, f => f.SeenEntries, "vocabulary entries seen"),
        new("utilisation", FieldKind.Real, f => f.Utilisation, "utilisation (share of vocabulary seen)", "P2"),
        new("top10_share", FieldKind.Real, f => f.Top10Share, "share of tokens in the top 10 types", "P1"),
        new("top100_share", FieldKind.Real, f => f.Top100Share, "share in the top 100", "P1"),
        new("top1000_share", FieldKind.Real, f => f.Top1000Share, "share in the top 1,000", "P1"),
        new("entropy_bits", FieldKind.Real, f => f.EntropyBits, "Shannon entropy, bits per token", "F3"),
        new("renyi_order", FieldKind.Real, f => f.RenyiOrder, "Rényi order", "G3", Shown: false),
        new("renyi_efficiency", FieldKind.Real, f => f.RenyiEfficiency, "Rényi efficiency H_α / log|V|", "F4"),
        new("renyi_base", FieldKind.Text, f => f.RenyiBase, "|V| in the Rényi efficiency", Shown: false),
        .. TailFitFields.Fit.Where(f => FitNames.Contains(f.Name)).Select(f => f.From<TokenizerFigures>(t => t.Fit)),
    ];

    /// <summary>The differences between the two sides.</summary>
    public static readonly IReadOnlyList<ResultField<ShiftResult>> Differences =
    [
        new("fertility", FieldKind.Real, r => r.Fertility, "fertility (candidate tokens per baseline token)", "F4"),
        new("token_change", FieldKind.Real, r => r.TokenChange, "change in token count", "P1"),
        new("types_change", FieldKind.Integer, r => r.Candidate.Types - r.Baseline.Types, "change in types"),
        new("bytes_per_token_change", FieldKind.Real, r => r.Candidate.BytesPerToken - r.Baseline.BytesPerToken,
            "change in bytes per token", "F3"),
        new("entropy_bits_change", FieldKind.Real, r => r.Candidate.EntropyBits - r.Baseline.EntropyBits,
            "change in entropy, bits per token", "F3"),
        new("renyi_efficiency_change", FieldKind.Real, r => r.Candidate.RenyiEfficiency - r.Baseline.RenyiEfficiency,
            "change in Rényi efficiency", "F4"),
        new("alpha_diff", FieldKind.Real, r => r.AlphaDiff, "α(candidate) − α(baseline)", "F3"),
        new("alpha_diff_lo", FieldKind.Real, r => r.AlphaDiffLo, "difference in α, 95% bootstrap interval, low", "F3"),
        new("alpha_diff_hi", FieldKind.Real, r => r.AlphaDiffHi, "difference in α, 95% bootstrap interval, high", "F3"),
        new("candidate_unseen", FieldKind.Integer, r => r.Candidate.VocabularySize > 0 ? r.Unseen.Count : null,
            "candidate vocabulary entries never seen"),
    ];

    /// <summary>One flat row: the differences, then every baseline and candidate field with its prefix (shift.parquet).</summary>
    public static readonly IReadOnlyList<ResultField<ShiftResult>> Flat =
    [
        .. Differences,
        .. Side.Select(f => Prefixed(f, "baseline_", r => r.Baseline)),
        .. Side.Select(f => Prefixed(f, "candidate_", r => r.Candidate)),
    ];

    /// <summary>The JSON document: the differences with <c>baseline</c> and <c>candidate</c> objects.</summary>
    public static readonly IReadOnlyList<ResultField<ShiftResult>> Json =
    [
        .. Differences,
        new("baseline", FieldKind.Nested, r => ResultFields.ToMap(Side, r.Baseline), "baseline", Shown: false),
        new("candidate", FieldKind.Nested, r => ResultFields.ToMap(Side, r.Candidate), "candidate", Shown: false),
        new("group_key", FieldKind.Text, r => r.GroupKey, "group key", Shown: false),
        new("groups", FieldKind.Nested, r => r.GroupKey is null ? null : ResultFields.ToMaps(ShiftGroups.Fields, r.Groups),
            "groups", Shown: false),
    ];

    /// <summary>The review list of vocabulary entries never seen.</summary>
    public static readonly IReadOnlyList<ResultField<UnseenEntry>> Unseen =
    [
        new("id", FieldKind.Integer, u => u.Id, "id"),
        new("token", FieldKind.Text, u => u.Token, "token"),
    ];

    private static ResultField<ShiftResult> Prefixed(ResultField<TokenizerFigures> f, string prefix,
        Func<ShiftResult, TokenizerFigures> side)
    {
        var g = f.From(side);
        return g with { Name = prefix + f.Name };
    }
}
