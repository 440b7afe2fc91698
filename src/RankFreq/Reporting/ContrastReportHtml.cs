using System.Text;
using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Primitives;

namespace RankFreq.Reporting;

/// <summary>The contrast report, in the profile report's look (same style sheet, cards, tables and cautions box).</summary>
public static partial class ReportHtml
{
    /// <summary>Builds the contrast report: findings, groups at own and matched size, pairs, plots, cautions, settings.</summary>
    public static string BuildContrast(string title, string groupKey, CountSummary c, ContrastResult r, IReadOnlyList<string> cautions,
        IReadOnlyList<RenderedPlot> plots)
    {
        var sb = new StringBuilder();
        sb.Append("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">");
        sb.Append($"<title>{H(title)} — RankFreq contrast</title><style>{Css}</style></head><body>");
        sb.Append($"<header><div class=\"brand\">RankFreq contrast</div><h1>{H(title)}</h1>");
        sb.Append($"<p class=\"sub\">{r.Groups.Count} groups by <code>{H(groupKey)}</code> · {N(c.Tokens)} tokens · tokenizer " +
            $"<code>{H(c.TokenizerSpec)}</code> · ");
        sb.Append($"{c.Inputs.Count} input file(s) · made {DateTime.UtcNow:yyyy-MM-dd HH:mm} UTC</p></header><main>");

        int fitted = r.Groups.Count(g => g.Status == ContrastStatus.Ok);
        int differ = r.Pairs.Count(p => p.Headline.Significant);
        sb.Append("<section class=\"cards\">");
        Card(sb, "groups compared", $"{fitted} of {r.Groups.Count}", fitted < r.Groups.Count ? "the others are listed below with the reason"
            : "every group could be fitted");
        Card(sb, "pairs that differ in α", $"{differ} of {r.Pairs.Count}", $"after Holm's adjustment at the {F(r.Options.Level, "0.###")} level");
        Card(sb, "matched size", r.TargetTokens > 0 ? N(r.TargetTokens) : "off", r.TargetTokens > 0
            ? $"tokens per group, {r.Options.ThinReps} thinning replicates" : "figures at the groups' own sizes");
        var alphas = r.Groups.Where(g => g.Status == ContrastStatus.Ok).Select(g => g.Alpha).ToList();
        Card(sb, "α range", alphas.Count > 0 ? $"{F(alphas.Min())} – {F(alphas.Max())}" : "–", "raw exponents of the fitted groups");
        sb.Append("</section>");

        sb.Append("<section><h2>What differs</h2><ul>");
        foreach (var f in r.Findings) sb.Append($"<li>{H(f)}</li>");
        sb.Append("</ul></section>");

        sb.Append("<section><h2>Groups at their own size</h2>");
        FieldTable(sb, ContrastFields.Group, r.Groups, ["group", "status", "documents", "tokens", "types", "alpha", "alpha_lo", "alpha_hi", "xmin",
            "n_tail", "gof_p", "hapax_share", "good_turing_unseen", "entropy_bits", "renyi_efficiency", "heaps_beta"]);
        sb.Append("<p class=\"note\">α's interval is the 2.5–97.5% range of a bootstrap over types with the full xmin search in each replicate. ");
        sb.Append("Groups marked other than ok take no part in the tests; the message says why:</p><ul>");
        foreach (var g in r.Groups.Where(g => g.Status != ContrastStatus.Ok)) sb.Append($"<li><strong>{H(g.Group)}</strong>: {H(g.Message)}</li>");
        sb.Append("</ul></section>");

        if (r.TargetTokens > 0)
        {
            sb.Append($"<section><h2>Groups at a matched size of {N(r.TargetTokens)} tokens</h2><table><thead><tr><th>group</th>");
            foreach (var fi in ContrastFigures.All) sb.Append($"<th " +
                $"title=\"{H(fi.Description)}\">{H(fi.Name.Replace('_', ' '))}{(fi.SizeSensitive ? " *" : "")}</th>");
            sb.Append("</tr></thead><tbody>");
            foreach (var g in r.Groups.Where(g => g.Matched is not null))
            {
                sb.Append($"<tr><td>{H(g.Group)}</td>");
                foreach (var fi in ContrastFigures.All)
                {
                    var s = g.Matched!.Figures[fi.Name];
                    string fmt = fi.Name is "tokens" or "types" or "xmin" or "n_tail" ? "N0" : "F3";
                    sb.Append($"<td class=\"n\">{F(s.Mean, fmt)}<br><small>± {F(s.Sd, fmt)}</small></td>");
                }
                sb.Append("</tr>");
            }
            sb.Append("</tbody></table><p class=\"note\">Each group was thinned to the smallest fitted group's size (every token kept with probability ");
            sb.Append("target / own size), repeatedly; cells give the mean ± standard deviation over the replicates. * marks figures that move with " +
                "sample size, ");
            sb.Append("whose raw values must not be compared across groups of different sizes.</p></section>");
        }

        if (r.Pairs.Count > 0)
        {
            sb.Append("<section><h2>Pairs</h2><table><thead><tr><th>a</th><th>b</th><th>basis</th><th>α_a − α_b</th><th>95% " +
                "interval</th><th>p</th><th>Holm p</th><th>differ</th><th>raw difference</th><th>raw Holm p</th></tr></thead><tbody>");
            foreach (var p in r.Pairs)
            {
                var h = p.Headline;
                sb.Append($"<tr><td>{H(p.A)}</td><td>{H(p.B)}</td><td>{p.Basis}</td><td class=\"n\">{F(h.Diff)}</td><td class=\"n\">{F(h.Lo)} – " +
                    $"{F(h.Hi)}</td>");
                sb.Append($"<td class=\"n\">{F(h.P, "G3")}</td><td class=\"n\">{F(h.PHolm, "G3")}</td>");
                sb.Append($"<td><span class=\"tag {(h.Significant ? "alt" : "neutral")}\">{(h.Significant ? "yes" : "no")}</span></td>");
                sb.Append($"<td class=\"n\">{F(p.Raw.Diff)}</td><td class=\"n\">{F(p.Raw.PHolm, "G3")}</td></tr>");
            }
            sb.Append("</tbody></table><p class=\"note\">The interval is the range of paired bootstrap differences; p is the two-sided normal test of the ");
            sb.Append("difference over its bootstrap standard error, adjusted by Holm's step-down method over all pairs.</p></section>");
        }

        sb.Append("<section><h2>Plots</h2>");
        Figures(sb, plots);
        sb.Append("</section>");

        sb.Append("<section class=\"caution\"><h2>Reading these results</h2><ul>");
        foreach (var line in cautions) sb.Append($"<li>{H(line)}</li>");
        sb.Append("</ul></section>");

        var o = r.Options;
        sb.Append("<section><h2>Settings and inputs</h2><table><tbody>");
        Row(sb, "seed", o.Seed.ToString(System.Globalization.CultureInfo.InvariantCulture));
        Row(sb, "goodness-of-fit replicates per group", N(o.Reps)); Row(sb, "bootstrap replicates per group", N(o.BootReps));
        Row(sb, "thinning replicates per group", N(o.ThinReps)); Row(sb, "minimum tail size", N(o.MinTail));
        Row(sb, "Rényi order", F(o.RenyiOrder, "0.##")); Row(sb, "normalisation / case", $"{H(c.Normalization)} / {H(c.CaseRule)}");
        foreach (var i in c.Inputs.Take(50)) Row(sb, "input", $"{H(i.Path)} ({N(i.Bytes)} bytes)");
        if (c.Inputs.Count > 50) Row(sb, "input", $"… and {c.Inputs.Count - 50} more");
        sb.Append("</tbody></table></section>");
        sb.Append("<footer>Method: discrete power-law maximum likelihood with the KS-chosen lower cut-off (Clauset, Shalizi &amp; Newman 2009); ");
        sb.Append("binomial thinning to a common size; Holm (1979) step-down adjustment.</footer></main></body></html>");
        return sb.ToString();
    }

    private static void FieldTable<T>(StringBuilder sb, IReadOnlyList<ResultField<T>> fields, IEnumerable<T> rows, string[] names)
    {
        var chosen = names.Select(n => fields.First(f => f.Name == n)).ToList();
        sb.Append("<table><thead><tr>");
        foreach (var f in chosen) sb.Append($"<th>{H(f.Name.Replace('_', ' '))}</th>");
        sb.Append("</tr></thead><tbody>");
        foreach (var row in rows)
        {
            sb.Append("<tr>");
            foreach (var f in chosen)
            {
                string text = H(f.Display(row));
                sb.Append(f.Kind is FieldKind.Text ? $"<td>{text}</td>" : $"<td class=\"n\">{text}</td>");
            }
            sb.Append("</tr>");
        }
        sb.Append("</tbody></table>");
    }
}
