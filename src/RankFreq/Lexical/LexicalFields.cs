using RankFreq.Primitives;

namespace RankFreq.Lexical;

/// <summary>The vocabulary figures and the Heaps fit, listed once for every output.</summary>
public static class LexicalFields
{
    /// <summary>Figures of a spectrum.</summary>
    public static readonly IReadOnlyList<ResultField<LexicalSummary>> Summary =
    [
        new("type_token_ratio", FieldKind.Real, l => l.TypeTokenRatio, "type–token ratio V/N", "F5"),
        new("hapax", FieldKind.Integer, l => l.Hapax, "hapax legomena (types seen once)"),
        new("dis", FieldKind.Integer, l => l.Dis, "dis legomena (types seen twice)"),
        new("hapax_share", FieldKind.Real, l => l.HapaxShare, "hapax share of types", "P1"),
        new("dis_share", FieldKind.Real, l => l.DisShare, "dis legomena share of types", "P1"),
        new("good_turing_unseen", FieldKind.Real, l => l.GoodTuringUnseen, "Good–Turing unseen probability mass N₁/N", "F5"),
        new("chao1", FieldKind.Real, l => l.Chao1, "Chao1 lower bound on vocabulary size", "N0"),
        new("yule_k", FieldKind.Real, l => l.YuleK, "Yule's K", "F2"),
        new("entropy_bits", FieldKind.Real, l => l.EntropyMillerMadowBits, "Shannon entropy, bits per token (Miller–Madow)", "F3"),
        new("entropy_plugin_bits", FieldKind.Real, l => l.EntropyBits, "Shannon entropy, plug-in", "F3", Shown: false),
        new("renyi_efficiency", FieldKind.Real, l => l.RenyiEfficiency, "Rényi efficiency (order 2.5)", "F3"),
    ];

    /// <summary>Heaps' law fitted to the growth curve.</summary>
    public static readonly IReadOnlyList<ResultField<GrowthAnalysis>> Growth =
    [
        new("heaps_k", FieldKind.Real, g => g.HeapsK, "Heaps' K in V = K·N^β", "G4"),
        new("heaps_beta", FieldKind.Real, g => g.HeapsBeta, "Heaps' β in V = K·N^β", "F3"),
        new("heaps_from", FieldKind.Integer, g => g.HeapsFrom > 0 ? g.HeapsFrom : null, "Heaps' law fitted from N =",
            Shown: false),
        new("heaps_method", FieldKind.Text, g => g.HeapsMethod, "how Heaps' law was fitted", Shown: false),
    ];
}
