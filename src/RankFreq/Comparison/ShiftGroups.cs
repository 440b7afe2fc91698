using System.Globalization;
using RankFreq.Counting;
using RankFreq.Primitives;

namespace RankFreq.Comparison;

/// <summary>
/// Per-group fertility of a tokenizer shift: which parts of a corpus the candidate serves worse. A group is served
/// worse when it needs more candidate tokens per baseline token than the text as a whole (by more than
/// <see cref="Margin"/>); with <c>words</c> as baseline that is more tokens per word.
/// </summary>
public static class ShiftGroups
{
    /// <summary>Relative difference from the whole text's fertility that counts as worse or better (5%).</summary>
    public const double Margin = 0.05;

    /// <summary>Fewest baseline tokens a group needs to be judged.</summary>
    public const long MinTokens = 1000;

    /// <summary>The groups of a paired count, in <paramref name="order"/> (labels as the group key orders them).</summary>
    public static IReadOnlyList<ShiftGroup> From(IReadOnlyList<PairedGroup> groups, IReadOnlyList<string> order,
        double corpusFertility)
    {
        var byLabel = groups.ToDictionary(g => g.Group, StringComparer.Ordinal);
        return order.Select(l => byLabel[l]).Select(g => new ShiftGroup(g.Group, g.Documents, g.TextBytes, g.FirstTokens,
            g.SecondTokens, corpusFertility)).ToList();
    }

    /// <summary>The per-group fields: groups.parquet, the JSON <c>groups</c> array, the console and report tables.</summary>
    public static readonly IReadOnlyList<ResultField<ShiftGroup>> Fields =
    [
        new("group", FieldKind.Text, g => g.Group, "group"),
        new("documents", FieldKind.Integer, g => g.Documents, "documents"),
        new("text_bytes", FieldKind.Integer, g => g.TextBytes, "text bytes"),
        new("baseline_tokens", FieldKind.Integer, g => g.BaselineTokens, "baseline tokens"),
        new("candidate_tokens", FieldKind.Integer, g => g.CandidateTokens, "candidate tokens"),
        new("fertility", FieldKind.Real, g => g.Fertility, "fertility", "F3"),
        new("fertility_vs_all", FieldKind.Real, g => g.RelativeFertility, "fertility against the whole text", "+0.0%;-0.0%"),
        new("baseline_bytes_per_token", FieldKind.Real, g => g.BaselineBytesPerToken, "baseline bytes per token", "F2"),
        new("candidate_bytes_per_token", FieldKind.Real, g => g.CandidateBytesPerToken, "candidate bytes per token", "F2"),
        new("candidate_serves", FieldKind.Text, g => Name(g.Service), "candidate serves it"),
    ];

    /// <summary>snake_case name of a verdict.</summary>
    public static string Name(GroupService s) => s switch
    {
        GroupService.Worse => "worse",
        GroupService.Better => "better",
        GroupService.TooSmall => "too_small",
        _ => "similar",
    };

    /// <summary>Plain-language lines: which groups the candidate serves worse and better than the text as a whole.</summary>
    public static IReadOnlyList<string> Findings(ShiftResult r)
    {
        var ic = CultureInfo.InvariantCulture;
        var lines = new List<string>();
        if (r.Groups.Count == 0) return lines;
        string unit = r.Baseline.Spec == "words" ? "word" : $"{r.Baseline.Spec} token";
        string List(IEnumerable<ShiftGroup> gs) => string.Join("; ", gs.Select(g =>
            string.Create(ic, $"{g.Group} ({g.Fertility:F3} per {unit}, {g.RelativeFertility:+0.0%;-0.0%})")));
        var worse = r.Groups.Where(g => g.Service == GroupService.Worse).OrderByDescending(g => g.RelativeFertility).ToList();
        var better = r.Groups.Where(g => g.Service == GroupService.Better).OrderBy(g => g.RelativeFertility).ToList();
        string all = string.Create(ic, $"{r.Fertility:F3} {r.Candidate.Spec} tokens per {unit} over the whole text");
        lines.Add(worse.Count == 0
            ? $"No group needs more than {Margin:0%} more {r.Candidate.Spec} tokens per {unit} than the whole text ({all})."
            : $"{r.Candidate.Spec} serves {(worse.Count == 1 ? "this group" : $"these {worse.Count} groups")} worse than the "
                + $"whole text ({all}): {List(worse)}.");
        if (better.Count > 0)
            lines.Add($"It serves {(better.Count == 1 ? "this group" : $"these {better.Count} groups")} better: {List(better)}.");
        if (r.Baseline.Spec != "words")
        {
            var costlier = r.Groups.Where(g => g.Service != GroupService.TooSmall && g.Fertility > 1).Select(g => g.Group).ToList();
            if (costlier.Count > 0 && r.Fertility <= 1)
                lines.Add($"In {string.Join(", ", costlier)} the candidate needs more tokens than {r.Baseline.Spec}, although it "
                    + "needs fewer over the whole text.");
        }
        int small = r.Groups.Count(g => g.Service == GroupService.TooSmall);
        if (small > 0)
            lines.Add($"{small} group(s) have under {MinTokens:N0} baseline tokens and are not judged; a group's fertility "
                + "depends on its kind of text, not on its size, but a small group may not be typical of its kind.");
        return lines;
    }
}
