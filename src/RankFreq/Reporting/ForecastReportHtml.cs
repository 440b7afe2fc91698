using System.Text;
using RankFreq.Lexical;

namespace RankFreq.Reporting;

/// <summary>The profile report's forecast section.</summary>
public static partial class ReportHtml
{
    /// <summary>"Vocabulary ahead": the chosen model and why, a table at the forecast's target sizes, the plot of
    /// observed and expected growth with the extrapolation and its band, and the forecast's cautions in words. A
    /// spectrum no model can describe gives its status and message instead of numbers.</summary>
    private static void ForecastSection(StringBuilder sb, ForecastResult r, IReadOnlyList<RenderedPlot> plots)
    {
        sb.Append("<section id=\"forecast\"><h2>Vocabulary ahead</h2>");
        if (r.Chosen is not { } chosen)
        {
            sb.Append($"<p>No forecast: <code>{H(r.Status)}</code>. {H(r.Message)}</p></section>");
            return;
        }
        sb.Append($"<p>If more text of the same kind were collected, a {H(ModelName(chosen.Family))} model fitted to this "
            + $"sample's frequency spectrum expects the figures below. Why this model: {H(r.Reason)}.</p>");
        sb.Append("<div class=\"wide\"><table><thead><tr><th>size</th><th>tokens</th><th>types expected</th><th>95% interval</th>"
            + "<th>all models</th><th>hapaxes</th><th>hapaxes, all models</th>"
            + $"<th>vocabulary for {F(100 * r.Options.Coverage, "0.#")}% of tokens</th></tr></thead><tbody>");
        var rows = new List<(string Size, ForecastPoint Point)>();
        if (r.Points.FirstOrDefault(p => p.Region == "sample") is { } here) rows.Add(("this sample", here));
        rows.AddRange(r.AtTargets().Select(x => (x.Target.Relative ? F(x.Target.Value, "G4") + "×" : "target", x.Point)));
        foreach (var (size, p) in rows)
        {
            sb.Append($"<tr><td data-label=\"size\">{H(size)}</td><td class=\"n\" data-label=\"tokens\">{F(p.Tokens, "N0")}</td>");
            sb.Append($"<td class=\"n\" data-label=\"types expected\">{F(p.Types, "N0")}</td>");
            sb.Append($"<td class=\"n\" data-label=\"95% interval\">{Range(p.TypesLo, p.TypesHi)}</td>");
            sb.Append($"<td class=\"n\" data-label=\"all models\">{Range(p.TypesModelsMin, p.TypesModelsMax)}</td>");
            sb.Append($"<td class=\"n\" data-label=\"hapaxes\">{F(p.Hapax, "N0")}</td>");
            sb.Append($"<td class=\"n\" data-label=\"hapaxes, all models\">{Range(p.HapaxModelsMin, p.HapaxModelsMax)}</td>");
            sb.Append($"<td class=\"n\" data-label=\"coverage vocabulary\">{F(p.CoverageTypes, "N0")}</td></tr>");
        }
        sb.Append("</tbody></table></div>");
        sb.Append($"<p class=\"note\">The interval is a parametric bootstrap over the fitted model ({r.RepsUsed} refits): it "
            + "covers the model's parameters only. \"All models\" is the range of every model that could be fitted; on "
            + "held-out real text the truth lay inside it while the chosen model was low. In this sample's own row the "
            + "model reproduces the observed types exactly (it is fitted to do so). Hapax forecasts are the least reliable: the chosen "
            + "model tends to be low, and the range over all models says more about their uncertainty.</p>");
        if (r.SelfCheck is { } check) sb.Append($"<p class=\"note\">{H(check.Describe())}</p>");
        Figures(sb, plots.Where(p => p.Name == "forecast"));
        sb.Append("<div class=\"caution\"><h3>Reading the forecast</h3><ul>");
        foreach (var c in r.Cautions) sb.Append($"<li>{H(c)}</li>");
        sb.Append("</ul></div></section>");
    }

    private static string Range(double lo, double hi) =>
        double.IsFinite(lo) && double.IsFinite(hi) ? $"{F(lo, "N0")} – {F(hi, "N0")}" : "–";

    private static string ModelName(string family) => family switch
    {
        "zm" => "Zipf–Mandelbrot",
        "fzm" => "finite Zipf–Mandelbrot",
        "gigp" => "generalized inverse Gauss–Poisson",
        _ => family,
    };
}
