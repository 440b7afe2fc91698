using System.Text;
using RankFreq.Comparison;
using RankFreq.Counting;

namespace RankFreq.Reporting;

/// <summary>The tokenizer-shift report, in the profile report's look (same style sheet, cards, tables, cautions box).</summary>
public static partial class ReportHtml
{
    /// <summary>How a tokenizer shift can be misread, for the report's cautions box.</summary>
    public static readonly IReadOnlyList<string> ShiftCautions =
    [
        "Fertility, types, entropy and the tail exponent all depend on the text: compare tokenizers on the same text, "
            + "and on text like the text they will meet.",
        "With words as baseline, fertility is tokens per word under this tool's word rule; another word rule gives "
            + "another figure.",
        "The α difference interval treats the two bootstraps as independent; both come from one text, so it is if "
            + "anything too wide.",
        "A vocabulary entry never seen here may still be needed by other text; the unseen list is a place to start a "
            + "review of under-trained entries, not a verdict.",
        "Groups much smaller than the rest give less stable fertility figures.",
    ];

    /// <summary>Builds the tokshift report: cards, findings, both sides, differences, groups, plots, cautions, inputs.</summary>
    public static string BuildShift(string title, CountSummary c, ShiftResult r, IReadOnlyList<string> findings,
        IReadOnlyList<RenderedPlot> plots)
    {
        var (b, d) = (r.Baseline, r.Candidate);
        var sb = new StringBuilder();
        sb.Append("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\">"
            + "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">");
        sb.Append($"<title>{H(title)} — RankFreq tokshift</title><style>{Css}</style></head><body>");
        sb.Append($"<header><div class=\"brand\">RankFreq tokshift</div><h1>{H(title)}</h1>");
        sb.Append($"<p class=\"sub\">baseline <code>{H(b.Spec)}</code> · candidate <code>{H(d.Spec)}</code> · "
            + $"{N(b.TextBytes)} bytes of text · {c.Inputs.Count} input file(s) · made {DateTime.UtcNow:yyyy-MM-dd HH:mm} UTC</p>"
            + "</header><main>");

        sb.Append("<section class=\"cards\">");
        string unit = b.Spec == "words" ? "word" : "baseline token";
        Card(sb, "fertility", F(r.Fertility), $"candidate tokens per {unit}; {N(d.Tokens)} against {N(b.Tokens)}");
        Card(sb, "bytes per token", $"{F(b.BytesPerToken, "F2")} → {F(d.BytesPerToken, "F2")}", "baseline → candidate");
        Card(sb, "Rényi efficiency", $"{F(b.RenyiEfficiency)} → {F(d.RenyiEfficiency)}",
            $"order {F(d.RenyiOrder, "0.##")}; baseline → candidate");
        Card(sb, "α difference", F(r.AlphaDiff), double.IsFinite(r.AlphaDiffLo)
            ? $"candidate − baseline; 95% interval {F(r.AlphaDiffLo)} – {F(r.AlphaDiffHi)}" : "no bootstrap interval");
        if (d.Utilisation is { } u)
            Card(sb, "candidate vocabulary used", $"{u * 100:F1}%",
                $"{N(d.SeenEntries ?? 0)} of {N(d.VocabularySize)} entries seen");
        if (r.GroupKey is not null)
            Card(sb, "groups served worse", $"{r.Groups.Count(g => g.Service == GroupService.Worse)} of {r.Groups.Count}",
                $"fertility over {ShiftGroups.Margin:0%} above the whole text's, by {r.GroupKey}");
        sb.Append("</section>");

        sb.Append("<section><h2>What changed</h2><ul>");
        foreach (var f in findings) sb.Append($"<li>{H(f)}</li>");
        sb.Append("</ul></section>");

        sb.Append("<section><h2>Both tokenizers</h2><div class=\"wide\"><table><thead><tr><th>figure</th><th>baseline</th>"
            + "<th>candidate</th></tr></thead><tbody>");
        foreach (var f in ShiftFields.Side.Where(f => f.Shown))
            sb.Append($"<tr><th>{H(f.Label)}</th><td class=\"n\" data-label=\"baseline\">{H(f.Display(b))}</td>"
                + $"<td class=\"n\" data-label=\"candidate\">{H(f.Display(d))}</td></tr>");
        sb.Append("</tbody></table></div><p class=\"note\">Rényi efficiency is H<sub>α</sub> / log₂|V| (Zouhar et al. 2023), "
            + "with |V| the vocabulary size, or the types seen for a tokenizer without a vocabulary.</p></section>");

        sb.Append("<section><h2>Differences</h2><table><tbody>");
        foreach (var f in ShiftFields.Differences.Where(f => f.Shown)) Row(sb, f.Label, H(f.Display(r)));
        sb.Append("</tbody></table></section>");

        if (r.GroupKey is not null)
        {
            sb.Append($"<section><h2>Groups by <code>{H(r.GroupKey)}</code></h2><div class=\"wide\">");
            Table(sb, ShiftGroups.Fields, r.Groups);
            sb.Append($"</div><p class=\"note\">A group is served worse when it needs more than {ShiftGroups.Margin:0%} more "
                + $"candidate tokens per {unit} than the whole text; groups under {N(ShiftGroups.MinTokens)} baseline tokens "
                + "are not judged.</p></section>");
        }

        sb.Append("<section><h2>Plots</h2>");
        Figures(sb, plots);
        sb.Append("</section>");

        sb.Append("<section class=\"caution\" id=\"reading\"><h2>Reading these results</h2><ul>");
        foreach (var line in ShiftCautions) sb.Append($"<li>{H(line)}</li>");
        sb.Append("</ul></section>");

        sb.Append("<section><h2>Settings and inputs</h2><table><tbody>");
        Row(sb, "seed", b.Fit.Seed.ToString(System.Globalization.CultureInfo.InvariantCulture));
        Row(sb, "goodness-of-fit replicates", N(b.Fit.GofReps));
        Row(sb, "Rényi order", F(b.RenyiOrder, "0.##"));
        InputRows(sb, c);
        sb.Append("</tbody></table></section>");
        sb.Append("<footer>Method: both tokenizers over the same text in one pass; discrete power-law maximum likelihood with "
            + "the KS-chosen lower cut-off (Clauset, Shalizi &amp; Newman 2009); Rényi efficiency after Zouhar et al. (2023)."
            + "</footer></main></body></html>");
        return sb.ToString();
    }
}
