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
    public static string Build(string title, CountSummary c, TailFitResult fit, LexicalSummary lex, GrowthAnalysis g,
        IReadOnlyList<RenderedPlot> plots, long redactBelow, ForecastResult? forecast = null)
    {
        var pl = fit.PowerLaw;
        bool fitted = pl.Status == FitStatus.Ok;
        var sb = new StringBuilder();
        sb.Append("<!DOCTYPE html><html lang=\"en\"><head><meta charset=\"utf-8\"><meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">");
        sb.Append($"<title>{H(title)} — RankFreq profile</title><style>{Css}</style></head><body>");
        sb.Append($"<header><div class=\"brand\">RankFreq profile</div><h1>{H(title)}</h1>");
        sb.Append($"<p class=\"sub\">{N(c.Tokens)} tokens · {N(c.Types)} types · "
            + $"tokenizer <code>{H(c.TokenizerSpec)}</code> · {c.Inputs.Count} input file(s) · "
            + $"made {DateTime.UtcNow:yyyy-MM-dd HH:mm} UTC</p></header><main>");

        sb.Append("<section class=\"cards\">");
        Card(sb, "tail exponent α", F(pl.Alpha), fitted ? $"95% bootstrap interval {F(fit.AlphaLo)} – {F(fit.AlphaHi)}" : pl.Message);
        Card(sb, "lower cut-off xmin", fitted ? N(pl.Xmin) : "–",
            fitted ? $"{N(pl.NTail)} types in the tail ({100.0 * pl.NTail / Math.Max(1, fit.NTypes):F1}%)" : "");
        Card(sb, "goodness of fit p", F(fit.GofP), GofNote(fit));
        Card(sb, "Zipf rank exponent s", F(fit.ZipfS), $"± {F(fit.ZipfSSe)}; log–log line slope {F(fit.LsqSlope)} (biased)");
        Card(sb, "Heaps β", F(g.HeapsBeta),
            double.IsFinite(g.HeapsBeta) ? $"V ≈ {F(g.HeapsK, "G3")} · N<sup>β</sup>, fitted from N = {N(g.HeapsFrom)} on" : "no fit",
            noteIsHtml: true);
        Card(sb, "unseen mass N₁/N", F(lex.GoodTuringUnseen, "F4"), $"{N(lex.Hapax)} hapax, {N(lex.Dis)} dis legomena");
        sb.Append("</section>");

        sb.Append("<section><h2>What the tail says</h2><p>");
        if (fitted)
        {
            sb.Append($"Above a frequency of {N(pl.Xmin)}, the {N(pl.NTail)} most frequent types "
                + "were fitted with a discrete power law by maximum likelihood: ");
            sb.Append($"α = {F(pl.Alpha)} (standard error {F(pl.AlphaSe)}; the 2009 closed-form approximation gives {F(pl.AlphaApprox)}). ");
            sb.Append($"In rank terms that is Zipf's s = 1/(α − 1) = {F(fit.ZipfS)}. ");
            if (fit.GofReps > 0 && double.IsFinite(fit.GofP))
                sb.Append($"The goodness-of-fit test gives p = {F(fit.GofP)} from {N(fit.GofReps)} synthetic sets: "
                    + $"<strong>{H(Verdicts.GoodnessOfFit(fit.GofP))}</strong> at the {Verdicts.Level} level. ");
            else sb.Append($"The goodness-of-fit test was {H(GofNote(fit))}. ");
            sb.Append(H(ComparisonSentence(fit.Alternatives)));
            if (fit.GofReps > 0 && !Verdicts.RuledOut(fit.GofP) && fit.Alternatives.Any(a => a.Favours == a.Name))
                sb.Append(" Both results stand together: see <a href=\"#reading\">Reading these results</a>.");
        }
        else sb.Append(H(pl.Message));
        sb.Append("</p>");
        Figures(sb, plots.Where(p => p.Name is not ("growth" or "forecast")));
        sb.Append("</section>");

        if (fit.Alternatives.Count > 0)
        {
            sb.Append("<section><h2>Against other heavy-tailed families</h2><div class=\"wide\">");
            Table(sb, TailFitFields.Alternative, fit.Alternatives);
            sb.Append("</div><p class=\"note\">A positive ratio favours the power law. p is Vuong's two-sided test for the "
                + "non-nested families and the boundary-corrected likelihood-ratio test for the power law with cut-off, which "
                + $"contains the power law. Above p = {Verdicts.Level} the data cannot tell the two apart.</p></section>");
        }

        sb.Append("<section><h2>Vocabulary</h2><table><tbody>");
        Row(sb, "tokens N", N(lex.Tokens)); Row(sb, "types V", N(lex.Types));
        foreach (var (label, value) in ResultFields.ForPeople(LexicalFields.Summary, lex).Concat(ResultFields.ForPeople(LexicalFields.Growth, g)))
            Row(sb, label, H(value));
        sb.Append($"</tbody></table><p class=\"note\">Heaps' law: {H(g.HeapsMethod)}.</p>");
        Figures(sb, plots.Where(p => p.Name == "growth"));
        sb.Append("</section>");
        if (forecast is not null) ForecastSection(sb, forecast, plots);

        sb.Append("<section class=\"caution\" id=\"reading\"><h2>Reading these results</h2><ul>");
        foreach (var caution in Cautions.For(redactBelow, g)) sb.Append($"<li>{H(caution)}</li>");
        sb.Append("</ul></section>");

        sb.Append("<section><h2>Settings and inputs</h2><table><tbody>");
        Row(sb, "seed", fit.Seed.ToString(CultureInfo.InvariantCulture));
        Row(sb, "goodness-of-fit replicates", N(fit.GofReps));
        Row(sb, "uncertainty replicates", N(fit.CiReps));
        Row(sb, "minimum tail size", N(fit.Options.MinTail));
        Row(sb, "xmin", fit.Options.Xmin > 0 ? $"fixed at {fit.Options.Xmin}" : "chosen by the KS criterion");
        Row(sb, "normalisation / case", $"{c.Normalization} / {c.CaseRule}");
        if (c.ReplacedBytes > 0) Row(sb, "invalid UTF-8 bytes replaced", N(c.ReplacedBytes));
        if (c.MalformedRecords > 0) Row(sb, "malformed records skipped", N(c.MalformedRecords));
        InputRows(sb, c);
        sb.Append("</tbody></table></section>");
        sb.Append("<footer>Method: discrete power-law maximum likelihood with the KS-chosen lower cut-off "
            + "and bootstrap goodness of fit (Clauset, Shalizi &amp; Newman 2009); Vuong's test (1989).</footer>"
            + "</main></body></html>");
        return sb.ToString();
    }

    /// <summary>Why the goodness-of-fit p is what it is, for the card under it.</summary>
    private static string GofNote(TailFitResult fit)
    {
        if (fit.PowerLaw.Status != FitStatus.Ok) return "not run: there is no power-law fit to test";
        if (fit.Options.Reps <= 0) return "not run (--reps 0)";
        if (!double.IsFinite(fit.GofP)) return "not run: no synthetic set could be fitted";
        return $"{N(fit.GofReps)} synthetic sets; KS distance {F(fit.PowerLaw.KsDistance, "F4")}";
    }

    /// <summary>The comparisons in one sentence, grouped by the verdict each one carries (see <see cref="Verdicts.Favours"/>).</summary>
    private static string ComparisonSentence(IReadOnlyList<AlternativeComparison> alts)
    {
        var ok = alts.Where(a => a.Status == FitStatus.Ok).ToList();
        if (ok.Count == 0) return "";
        var parts = new List<string>();
        foreach (var a in ok.Where(a => a.Favours == a.Name))
            parts.Add($"{Family(a.Name)} over the power law ({P(a.P)})");
        foreach (var a in ok.Where(a => a.Favours == "power_law"))
            parts.Add($"the power law over {Family(a.Name)} ({P(a.P)})");
        var open = ok.Where(a => a.Favours != a.Name && a.Favours != "power_law").Select(a => Family(a.Name)).ToList();
        string text = parts.Count > 0 ? "The likelihood-ratio comparisons favour " + Words(parts) : "";
        if (open.Count > 0)
            text += (text.Length > 0 ? "; against " : "Against ") + Words(open) + $" they give no verdict at the {Verdicts.Level} level";
        return text + ".";
    }

    private static string P(double p) => p < 0.001 ? "p < 0.001" : $"p = {F(p)}";

    private static string Words(List<string> xs) => xs.Count == 1 ? xs[0] : string.Join(", ", xs[..^1]) + " and " + xs[^1];

    private static string Family(string name) => name switch
    {
        "power_law_cutoff" => "the power law with exponential cut-off",
        // prose keeps the published family names; tables name the discrete forms fitted
        "stretched_exponential" or "discrete_weibull" => "the stretched exponential",
        "exponential" or "geometric" => "the exponential",
        "lognormal" or "discrete_lognormal" => "the lognormal",
        _ => "the " + name.Replace('_', ' '),
    };

    /// <summary>Inlines SVG plots; element ids get the plot's name as prefix, as every plot's SVG uses the same ids.</summary>
    private static void Figures(StringBuilder sb, IEnumerable<RenderedPlot> plots)
    {
        var list = plots.ToList();
        if (list.Count == 0) return;
        sb.Append("<div class=\"plots\">");
        foreach (var p in list)
        {
            string svg = p.Svg;
            int i = svg.IndexOf("<svg", StringComparison.Ordinal);
            svg = i >= 0 ? svg[i..] : svg;
            string prefix = p.Name + "-";
            svg = svg.Replace("id=\"", "id=\"" + prefix, StringComparison.Ordinal)
                .Replace("url(#", "url(#" + prefix, StringComparison.Ordinal)
                .Replace("href=\"#", "href=\"#" + prefix, StringComparison.Ordinal);
            sb.Append($"<figure>{svg}<figcaption>{H(p.Title)}</figcaption></figure>");
        }
        sb.Append("</div>");
    }

    private static void Card(StringBuilder sb, string label, string value, string note, bool noteIsHtml = false) =>
        sb.Append($"<div class=\"card\"><div class=\"label\">{H(label)}</div><div class=\"value\">{H(value)}</div>"
            + $"<div class=\"note\">{(noteIsHtml ? note : H(note))}</div></div>");

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
                sb.Append($"<td{(f.Kind == FieldKind.Real ? " class=\"n\"" : "")} data-label=\"{H(f.Label)}\">{H(f.Display(item))}</td>");
            sb.Append("</tr>");
        }
        sb.Append("</tbody></table>");
    }

    /// <summary>One settings row per input (the first 50).</summary>
    private static void InputRows(StringBuilder sb, CountSummary c)
    {
        foreach (var i in c.Inputs.Take(50)) Row(sb, "input", $"{H(i.Path == "-" ? "standard input" : i.Path)} ({N(i.Bytes)} bytes)");
        if (c.Inputs.Count > 50) Row(sb, "input", $"… and {c.Inputs.Count - 50} more");
    }

    private static void Row(StringBuilder sb, string k, string v) => sb.Append($"<tr><th>{H(k)}</th><td>{v}</td></tr>");

    private const string Css = """
        :root{--paper:#FBF8F1;--ink:#23395B;--ember:#D1495B;--moss:#5B8C5A;--rule:#E6DFD0;--text:#2B2B2B}
        *{box-sizing:border-box}
        body{margin:0;background:var(--paper);color:var(--text);font:16px/1.55 "Iowan Old Style","Palatino Linotype",Palatino,Georgia,serif}
        header{background:var(--ink);color:#F5F1E6;padding:28px 40px 22px}header h1{margin:4px 0 6px;font-size:30px;font-weight:600;overflow-wrap:anywhere}
        .brand{letter-spacing:.18em;text-transform:uppercase;font:600 12px/1 "DejaVu Sans",Verdana,sans-serif;color:#E9C46A}
        .sub{margin:0;font:14px/1.5 "DejaVu Sans",Verdana,sans-serif;color:#E8E2D4}
        header code{background:#344F78;color:#FFFFFF;border:1px solid #4F6B95;padding:0 5px;border-radius:3px;overflow-wrap:anywhere}
        main{max-width:1100px;margin:0 auto;padding:24px 40px 48px}
        h2{font-size:21px;color:var(--ink);border-bottom:2px solid var(--rule);padding-bottom:4px;margin-top:34px}
        a{color:#1F4E8C}
        .cards{display:grid;grid-template-columns:repeat(auto-fill,minmax(min(100%,200px),1fr));gap:14px;margin-top:8px}
        .card{background:#fff;border:1px solid var(--rule);border-left:5px solid var(--ember);padding:12px 14px;border-radius:3px}
        .card .label{font:600 13px/1.2 "DejaVu Sans",Verdana,sans-serif;letter-spacing:.02em;color:#5F5F5F}
        .card .value{font-size:28px;color:var(--ink);margin:4px 0}.card .note{font-size:13px;color:#555}
        .wide{overflow-x:auto}.wide td{overflow-wrap:normal}
        table{border-collapse:collapse;width:100%;background:#fff;font:14px/1.4 "DejaVu Sans",Verdana,sans-serif}
        th,td{padding:7px 10px;border-bottom:1px solid var(--rule);text-align:left;vertical-align:top;overflow-wrap:anywhere}
        tbody th{font-weight:500;color:#444;width:45%}
        thead th{background:#F1EBDD;color:var(--ink);overflow-wrap:normal}td.n{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}
        .note{font-size:14px;color:#555}.plots{display:grid;grid-template-columns:repeat(auto-fill,minmax(min(100%,480px),1fr));gap:18px;margin-top:22px}
        figure{margin:0;background:#fff;border:1px solid var(--rule);padding:8px;min-width:0}figure svg{width:100%;height:auto;display:block}
        figcaption{font:13px/1.4 "DejaVu Sans",Verdana,sans-serif;color:#555;padding:4px 2px}
        .caution{background:#FFF4E0;border:1px solid #EBCB8B;padding:4px 22px 10px;margin-top:34px}.caution h2{border:none}
        footer{margin-top:36px;font-size:13px;color:#5E5E5E}code{background:#F1EBDD;padding:0 4px;border-radius:3px}
        @media (max-width:600px){header{padding:20px 16px 16px}header h1{font-size:24px}main{padding:16px 14px 36px}
        .cards{grid-template-columns:1fr 1fr;gap:10px}.card{padding:10px 10px 10px 11px}
        .wide thead{display:none}.wide table,.wide tbody,.wide tr{display:block}.wide tr{border-bottom:2px solid var(--rule)}
        .wide td{display:flex;gap:10px;text-align:left;border:none;padding:4px 8px;overflow-wrap:anywhere}
        .wide td::before{content:attr(data-label);flex:0 0 42%;font-weight:600;color:#444}
        .caution{padding:2px 14px 8px}.caution ul{padding-left:20px}th,td{padding:6px 6px}.card .value{font-size:24px}}
        """;
}
