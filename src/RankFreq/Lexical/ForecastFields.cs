using RankFreq.Primitives;

namespace RankFreq.Lexical;

/// <summary>The fields of a vocabulary forecast, listed once: Parquet columns, JSON and console tables come from these.</summary>
public static class ForecastFields
{
    /// <summary>One row per model family tried.</summary>
    public static readonly IReadOnlyList<ResultField<LnreFit>> Fit =
    [
        new("model", FieldKind.Text, f => f.Family, "model"),
        new("status", FieldKind.Text, f => LnreStatusNames.Of(f.Status), "status"),
        new("parameters", FieldKind.Nested, f => f.Model?.Parameters.ToDictionary(kv => kv.Key,
            kv => double.IsFinite(kv.Value) ? (object?)kv.Value : null), "parameters"),
        new("spectrum_elements", FieldKind.Integer, f => f.SpectrumElements > 0 ? f.SpectrumElements : null, "k"),
        new("chi_squared", FieldKind.Real, f => f.ChiSquared, "χ²", "F1"),
        new("df", FieldKind.Integer, f => f.DegreesOfFreedom > 0 ? f.DegreesOfFreedom : null, "df"),
        new("p", FieldKind.Real, f => f.P, "p", "G3"),
        new("cost", FieldKind.Real, f => f.Cost, "fitted Σ(V_m − E)²/E", "F2", Shown: false),
        new("message", FieldKind.Text, f => f.Message, "message", Shown: false),
    ];

    /// <summary>One row per point of the curve.</summary>
    public static readonly IReadOnlyList<ResultField<ForecastPoint>> Point =
    [
        new("tokens", FieldKind.Integer, p => p.Tokens, "tokens"),
        new("region", FieldKind.Text, p => p.Region, "region"),
        new("types", FieldKind.Real, p => p.Types, "types", "N0"),
        new("types_lo", FieldKind.Real, p => p.TypesLo, "types 2.5%", "N0"),
        new("types_hi", FieldKind.Real, p => p.TypesHi, "types 97.5%", "N0"),
        new("types_sd", FieldKind.Real, p => p.TypesSd, "sampling sd", "N0", Shown: false),
        new("types_exact", FieldKind.Real, p => p.TypesExact, "types, exact in-sample", "N0"),
        new("types_models_min", FieldKind.Real, p => p.TypesModelsMin, "types, lowest model", "N0"),
        new("types_models_max", FieldKind.Real, p => p.TypesModelsMax, "types, highest model", "N0"),
        new("hapax", FieldKind.Real, p => p.Hapax, "hapax", "N0"),
        new("hapax_lo", FieldKind.Real, p => p.HapaxLo, "hapax 2.5%", "N0", Shown: false),
        new("hapax_hi", FieldKind.Real, p => p.HapaxHi, "hapax 97.5%", "N0", Shown: false),
        new("hapax_models_min", FieldKind.Real, p => p.HapaxModelsMin, "hapax, lowest model", "N0", Shown: false),
        new("hapax_models_max", FieldKind.Real, p => p.HapaxModelsMax, "hapax, highest model", "N0", Shown: false),
        new("dis", FieldKind.Real, p => p.Dis, "dis", "N0", Shown: false),
        new("coverage_types", FieldKind.Real, p => p.CoverageTypes, "vocabulary for coverage", "N0"),
        new("coverage_types_lo", FieldKind.Real, p => p.CoverageLo, "coverage 2.5%", "N0", Shown: false),
        new("coverage_types_hi", FieldKind.Real, p => p.CoverageHi, "coverage 97.5%", "N0", Shown: false),
    ];

    /// <summary>The whole forecast as one JSON-ready map.</summary>
    public static Dictionary<string, object?> ToMap(ForecastResult r) => new()
    {
        ["tokens"] = (long)r.Tokens,
        ["types"] = (long)r.Types,
        ["hapax"] = (long)r.Hapax,
        ["status"] = r.Status,
        ["message"] = r.Message,
        ["model"] = r.Chosen?.Family,
        ["reason"] = r.Reason,
        ["coverage"] = r.Options.Coverage,
        ["targets"] = r.Options.Targets.Select(t => t.ToString()).ToList(),
        ["reps"] = r.Options.Reps,
        ["reps_used"] = r.RepsUsed,
        ["seed"] = r.Options.Seed,
        ["interval"] = "95% parametric bootstrap over the fitted model (parameter uncertainty only)",
        ["fits"] = ResultFields.ToMaps(Fit, r.Fits),
        ["points"] = ResultFields.ToMaps(Point, r.Points),
        ["cautions"] = r.Cautions.ToList(),
        ["self_check"] = SelfCheckMap(r.SelfCheck),
    };

    /// <summary>The self-check as JSON: errors are relative (−0.3 = 30% too few); null when it was not run.</summary>
    public static Dictionary<string, object?>? SelfCheckMap(ForecastSelfCheck? c) => c is null ? null : new()
    {
        ["fraction"] = c.Fraction,
        ["sample_tokens"] = (long)c.SampleTokens,
        ["status"] = c.Status,
        ["model"] = c.Family,
        ["types"] = c.Types,
        ["types_observed"] = (long)c.ObservedTypes,
        ["types_error"] = c.TypesError,
        ["hapax"] = c.Hapax,
        ["hapax_observed"] = (long)c.ObservedHapax,
        ["hapax_error"] = c.HapaxError,
        ["hapax_models_min"] = c.HapaxModelsMin,
        ["hapax_models_max"] = c.HapaxModelsMax,
        ["summary"] = c.Describe(),
    };
}
