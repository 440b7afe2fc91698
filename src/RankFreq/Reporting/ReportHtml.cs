using System.Globalization;
using System.Net;
using System.Text;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Primitives;

namespace RankFreq.Reporting;

/// <summary>The self-contained HTML report: figures in plain words, tables, alternatives, cautions; plots inlined as SVG; no scripts, no network.</summary>
public static partial class ReportHtml
{
    private static string F(double x, string fmt = "F3") => double.IsFinite(x) ? x.ToString(fmt, CultureInfo.InvariantCulture) : "–";
    private static string N(long x) => x.ToString("N0", CultureInfo.InvariantCulture);
    private static string H(string s) => WebUtility.HtmlEncode(s);

    /// <summary>Builds the report.</summary>
    public static string Build(string title, CountSummary c, TailFitResult fit, LexicalSummary lex, GrowthAnalysis g, IReadOnlyList<RenderedPlot> plots, long redactBelow)
    {
        var pl = fit.PowerLaw;
        var sb = new StringBuilder();
        sb.Append("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">");
        sb.Append($"<title>{H(title)} — RankFreq profile</title><style>{Css}</style></head><body>");
        sb.Append($"<header><div class=\"brand\">RankFreq profile</div><h1>{H(title)}</h1>");
        sb.Append($"<p class=\"sub\">{N(c.Tokens)} tokens · {N(c.Types)} types · tokenizer <code>{H(c.TokenizerSpec)}</code> · {c.Inputs.Count} input file(s) · made {DateTime.UtcNow:yyyy-MM-dd HH:mm} UTC</p></header><main>");

        sb.Append("<section class=\"cards\">");
        Card(sb, "tail exponent α", F(pl.Alpha), pl.Status == FitStatus.Ok ? $"95% bootstrap interval {F(fit.AlphaLo)} – {F(fit.AlphaHi)}" : pl.Message);
        Card(sb, "lower cut-off xmin", pl.Status == FitStatus.Ok ? N(pl.Xmin) : "–", pl.Status == FitStatus.Ok ? $"{N(pl.NTail)} types in the tail ({100.0 * pl.NTail / Math.Max(1, fit.NTypes):F1}%)" : "");
        Card(sb, "goodness of fit p", F(fit.GofP), fit.GofReps > 0 ? $"{N(fit.GofReps)} synthetic sets; KS distance {F(pl.KsDistance, "F4")}" : "not run");
        Card(sb, "Zipf rank exponent s", F(fit.ZipfS), $"± {F(fit.ZipfSSe)}; log–log line slope {F(fit.LsqSlope)} (biased)");
        Card(sb, "Heaps β", F(g.HeapsBeta), $"V ≈ {F(g.HeapsK, "G3")}·N^β");
        Card(sb, "unseen mass N₁/N", F(lex.GoodTuringUnseen, "F4"), $"{N(lex.Hapax)} hapax, {N(lex.Dis)} dis legomena");
        sb.Append("</section>");

        sb.Append("<section><h2>What the tail says</h2><p>");
        if (pl.Status == FitStatus.Ok)
        {
            sb.Append($"Above a frequency of {N(pl.Xmin)}, the {N(pl.NTail)} most frequent types were fitted with a discrete power law by maximum likelihood: ");
            sb.Append($"α = {F(pl.Alpha)} (standard error {F(pl.AlphaSe)}; the 2009 closed-form approximation gives {F(pl.AlphaApprox)}). ");
            sb.Append($"In rank terms that is Zipf's s = 1/(α − 1) = {F(fit.ZipfS)}. ");
            if (fit.GofReps > 0)
                sb.Append(Verdicts.RuledOut(fit.GofP)
                    ? $"The goodness-of-fit test gives p = {F(fit.GofP)}: synthetic power-law data rarely fit as badly as these, so <strong>a power law is ruled out</strong> for this tail at the usual {Verdicts.Level} threshold. "
                    : $"The goodness-of-fit test gives p = {F(fit.GofP)}: <strong>a power law is not ruled out</strong> at this sample size — which is not proof that the data follow one. ");
        }
        else sb.Append(H(pl.Message));
        sb.Append("</p></section>");

        if (fit.Alternatives.Count > 0)
        {
            sb.Append("<section><h2>Against other heavy-tailed families</h2>");
            Table(sb, TailFitFields.Alternative, fit.Alternatives);
            sb.Append("<p class=\"note\">A positive ratio favours the power law. p is Vuong's two-sided test for the non-nested families and the boundary-corrected likelihood-ratio test for the power law with cut-off, which contains the power law. Above p = 0.1 the data cannot tell the two apart.</p></section>");
        }

        sb.Append("<section><h2>Vocabulary</h2><table><tbody>");
        Row(sb, "tokens N", N(lex.Tokens)); Row(sb, "types V", N(lex.Types));
        foreach (var (label, value) in ResultFields.ForPeople(LexicalFields.Summary, lex).Concat(ResultFields.ForPeople(LexicalFields.Growth, g)))
            Row(sb, label, H(value));
        sb.Append($"</tbody></table><p class=\"note\">Heaps' law: {H(g.HeapsMethod)}.</p></section>");

        Figures(sb, plots);

        sb.Append("<section class=\"caution\"><h2>Reading these results</h2><ul>");
        foreach (var caution in Cautions.For(redactBelow)) sb.Append($"<li>{H(caution)}</li>");
        sb.Append("</ul></section>");

        sb.Append("<section><h2>Settings and inputs</h2><table><tbody>");
        Row(sb, "seed", fit.Seed.ToString(CultureInfo.InvariantCulture)); Row(sb, "goodness-of-fit replicates", N(fit.GofReps)); Row(sb, "uncertainty replicates", N(fit.CiReps));
        Row(sb, "minimum tail size", N(fit.Options.MinTail)); Row(sb, "xmin", fit.Options.Xmin > 0 ? $"fixed at {fit.Options.Xmin}" : "chosen by the KS criterion");
        Row(sb, "normalisation / case", $"{c.Normalization} / {c.CaseRule}");
        if (c.ReplacedBytes > 0) Row(sb, "invalid UTF-8 bytes replaced", N(c.ReplacedBytes));
        if (c.MalformedRecords > 0) Row(sb, "malformed records skipped", N(c.MalformedRecords));
        foreach (var i in c.Inputs.Take(50)) Row(sb, "input", $"{H(i.Path == "-" ? "standard input" : i.Path)} ({N(i.Bytes)} bytes)");
        if (c.Inputs.Count > 50) Row(sb, "input", $"… and {c.Inputs.Count - 50} more");
        sb.Append("</tbody></table></section>");
        sb.Append("<footer>Method: discrete power-law maximum likelihood with the KS-chosen lower cut-off and bootstrap goodness of fit (Clauset, Shalizi &amp; Newman 2009); Vuong's test (1989).</footer></main></body></html>");
        return sb.ToString();
    }

    private static void Card(StringBuilder sb, string label, string value, string note) =>
        sb.Append($"<div class=\"card\"><div class=\"label\">{H(label)}</div><div class=\"value\">{H(value)}</div><div class=\"note\">{H(note)}</div></div>");

    private static void Table<T>(StringBuilder sb, IReadOnlyList<ResultField<T>> fields, IReadOnlyList<T> items)
    {
        var shown = fields.Where(f => f.Shown).ToList();
        sb.Append("<table><thead><tr>");
        foreach (var f in shown) sb.Append($"<th>{H(f.Label)}</th>");
        sb.Append("</tr></thead><tbody>");
        foreach (var item in items)
        {
            sb.Append("<tr>");
            foreach (var f in shown)
                sb.Append(f.Kind == FieldKind.Real ? $"<td class=\"n\">{H(f.Display(item))}</td>" : $"<td>{H(f.Display(item))}</td>");
            sb.Append("</tr>");
        }
        sb.Append("</tbody></table>");
    }

    private static void Row(StringBuilder sb, string k, string v) => sb.Append($"<tr><th>{H(k)}</th><td>{v}</td></tr>");

    private const string Css = """
        :root{--paper:#FBF8F1;--ink:#23395B;--ember:#D1495B;--moss:#5B8C5A;--rule:#E6DFD0;--text:#2B2B2B}
        *{box-sizing:border-box}body{margin:0;background:var(--paper);color:var(--text);font:16px/1.55 "Iowan Old Style","Palatino Linotype",Palatino,Georgia,serif}
        header{background:var(--ink);color:#F5F1E6;padding:28px 40px 22px}header h1{margin:4px 0 6px;font-size:30px;font-weight:600}
        .brand{letter-spacing:.18em;text-transform:uppercase;font:600 12px/1 "DejaVu Sans",Verdana,sans-serif;color:#E9C46A}
        .sub{margin:0;font:14px/1.4 "DejaVu Sans",Verdana,sans-serif;opacity:.9}main{max-width:1100px;margin:0 auto;padding:24px 40px 48px}
        h2{font-size:21px;color:var(--ink);border-bottom:2px solid var(--rule);padding-bottom:4px;margin-top:34px}
        .cards{display:grid;grid-template-columns:repeat(auto-fill,minmax(200px,1fr));gap:14px;margin-top:8px}
        .card{background:#fff;border:1px solid var(--rule);border-left:5px solid var(--ember);padding:12px 14px;border-radius:3px}
        .card .label{font:600 12px/1.2 "DejaVu Sans",Verdana,sans-serif;text-transform:uppercase;letter-spacing:.06em;color:#6B6B6B}
        .card .value{font-size:28px;color:var(--ink);margin:4px 0}.card .note{font-size:13px;color:#555}
        table{border-collapse:collapse;width:100%;background:#fff;font:14px/1.4 "DejaVu Sans",Verdana,sans-serif}
        th,td{padding:7px 10px;border-bottom:1px solid var(--rule);text-align:left;vertical-align:top}tbody th{font-weight:500;color:#444;width:45%}
        thead th{background:#F1EBDD;color:var(--ink)}td.n{text-align:right;font-variant-numeric:tabular-nums}
        .tag{padding:1px 8px;border-radius:10px;font-size:12px}.tag.pl{background:#DCEBDD;color:#2F5D2E}.tag.alt{background:#F7D9DD;color:#8A2533}.tag.neutral{background:#ECE7DC;color:#555}
        .note{font-size:14px;color:#555}.plots{display:grid;grid-template-columns:repeat(auto-fill,minmax(480px,1fr));gap:18px;margin-top:30px}
        figure{margin:0;background:#fff;border:1px solid var(--rule);padding:8px}figure svg{width:100%;height:auto;display:block}
        figcaption{font:13px "DejaVu Sans",Verdana,sans-serif;color:#555;padding:4px 2px}
        .caution{background:#FFF4E0;border:1px solid #EBCB8B;padding:4px 22px 10px;margin-top:34px}.caution h2{border:none}
        footer{margin-top:36px;font-size:13px;color:#777}code{background:#F1EBDD;padding:0 4px;border-radius:3px}
        """;
}
