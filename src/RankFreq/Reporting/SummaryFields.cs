using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;

namespace RankFreq.Reporting;

/// <summary>Stable snake_case field sets for JSON output (fit results use the names of the fit table).</summary>
public static class SummaryFields
{
    /// <summary>A finite number rounded for display in JSON, or null.</summary>
    public static double? J(double x) => double.IsFinite(x) ? Math.Round(x, 10) : null;

    /// <summary>The fit-result fields.</summary>
    public static Dictionary<string, object?> Fit(TailFitResult f) => new()
    {
        ["alpha"] = J(f.PowerLaw.Alpha),
        ["alpha_se"] = J(f.PowerLaw.AlphaSe),
        ["alpha_approx"] = J(f.PowerLaw.AlphaApprox),
        ["alpha_sd"] = J(f.AlphaSd),
        ["alpha_lo"] = J(f.AlphaLo),
        ["alpha_hi"] = J(f.AlphaHi),
        ["xmin"] = f.PowerLaw.Xmin,
        ["xmin_lo"] = J(f.XminLo),
        ["xmin_hi"] = J(f.XminHi),
        ["n_tail"] = f.PowerLaw.NTail,
        ["n_tail_sd"] = J(f.NTailSd),
        ["n_types"] = f.NTypes,
        ["ks_distance"] = J(f.PowerLaw.KsDistance),
        ["gof_p"] = J(f.GofP),
        ["gof_reps"] = f.GofReps,
        ["ci_reps"] = f.CiReps,
        ["zipf_s"] = J(f.ZipfS),
        ["zipf_s_se"] = J(f.ZipfSSe),
        ["lsq_slope"] = J(f.LsqSlope),
        ["seed"] = f.Seed,
        ["min_tail"] = f.Options.MinTail,
        ["xmin_fixed"] = f.Options.Xmin > 0,
        ["status"] = f.PowerLaw.Status == FitStatus.Ok ? "ok" : f.PowerLaw.Status.ToString(),
        ["message"] = f.PowerLaw.Message,
        ["alternatives"] = f.Alternatives.Select(a => new Dictionary<string, object?>
        {
            ["name"] = a.Name,
            ["parameters"] = a.Parameters.ToDictionary(kv => kv.Key, kv => J(kv.Value)),
            ["llr"] = J(a.Llr),
            ["normalized_llr"] = J(a.NormalizedLlr),
            ["p"] = J(a.P),
            ["favours"] = a.Favours,
            ["status"] = a.Status == FitStatus.Ok ? "ok" : a.Status.ToString(),
        }).ToList(),
    };

    /// <summary>Lexical figures.</summary>
    public static Dictionary<string, object?> Lexical(LexicalSummary l, GrowthAnalysis g) => new()
    {
        ["type_token_ratio"] = J(l.TypeTokenRatio),
        ["hapax"] = l.Hapax,
        ["dis"] = l.Dis,
        ["hapax_share"] = J(l.HapaxShare),
        ["dis_share"] = J(l.DisShare),
        ["good_turing_unseen"] = J(l.GoodTuringUnseen),
        ["chao1"] = J(l.Chao1),
        ["yule_k"] = J(l.YuleK),
        ["entropy_bits"] = J(l.EntropyMillerMadowBits),
        ["entropy_plugin_bits"] = J(l.EntropyBits),
        ["renyi_efficiency"] = J(l.RenyiEfficiency),
        ["heaps_k"] = J(g.HeapsK),
        ["heaps_beta"] = J(g.HeapsBeta),
        ["heaps_method"] = g.HeapsMethod,
    };

    /// <summary>Counting figures.</summary>
    public static Dictionary<string, object?> Count(CountSummary s) => new()
    {
        ["tokenizer"] = s.TokenizerSpec,
        ["tokens"] = s.Tokens,
        ["types"] = s.Types,
        ["bytes"] = s.StoredBytes,
        ["text_bytes"] = s.TextBytes,
        ["replaced_bytes"] = s.ReplacedBytes,
        ["records"] = s.Records,
        ["malformed_records"] = s.MalformedRecords,
        ["missing_field"] = s.MissingField,
        ["skipped_files"] = s.SkippedFiles.Select(f => new Dictionary<string, string> { ["path"] = f.Path, ["reason"] = f.Reason }).ToList(),
        ["files"] = s.Inputs.Count,
        ["threads"] = s.Threads,
        ["spilled_runs"] = s.SpilledRuns,
        ["seconds"] = Math.Round(s.Seconds, 3),
    };
}
