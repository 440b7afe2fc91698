using ScottPlot;
using RankFreq.Lexical;

namespace RankFreq.Reporting;

/// <summary>The forecast plot: expected vocabulary growth in and beyond the sample, with its interval band.</summary>
public static class ForecastPlot
{
    /// <summary>Types against tokens on log–log axes: the model curve with its 95% band (thin inside the sample, thick
    /// beyond it), the exact in-sample expectation, the observed growth in corpus order when given, the observed
    /// sample, and a line where the sample ends. Every line is solid: the SVG canvas writes a line to standard
    /// output for each dash pattern it draws, which would corrupt <c>--json</c> output.</summary>
    /// <param name="r">The forecast.</param>
    /// <param name="observed">The sample's own growth in corpus order (the profile has it; a spectrum does not).</param>
    public static RenderedPlot Growth(ForecastResult r, GrowthAnalysis? observed = null)
    {
        var p = Plots.NewPlot("Vocabulary ahead", "tokens N (log scale)", "types V(N) (log scale)");
        Plots.LogAxes(p);
        var pts = r.Points;
        double L(double v) => Math.Log10(Math.Max(1, v));
        var band = pts.Where(x => double.IsFinite(x.TypesLo) && double.IsFinite(x.TypesHi)).ToList();
        if (band.Count > 1)
        {
            var fill = p.Add.FillY(band.Select(x => L(x.Tokens)).ToArray(), band.Select(x => L(x.TypesLo)).ToArray(),
                band.Select(x => L(x.TypesHi)).ToArray());
            fill.FillColor = Plots.Ember.WithAlpha(0.22);
            fill.LineWidth = 0;
            fill.LegendText = "95% interval (model parameters)";
        }
        var inside = pts.Where(x => double.IsFinite(x.TypesExact)).ToList();
        if (inside.Count > 1)
        {
            var ex = p.Add.ScatterLine(inside.Select(x => L(x.Tokens)).ToArray(), inside.Select(x => L(x.TypesExact)).ToArray(), Plots.Ink);
            ex.LineWidth = 3f; ex.LegendText = "expected in the sample (exact, random order)";
        }
        // the observed curve over the range the forecast draws (from N/1000), so the two share one scale
        int[] seen = observed is null || pts.Count == 0 ? [] : Enumerable.Range(0, observed.Tokens.Length)
            .Where(i => observed.Tokens[i] >= pts[0].Tokens).ToArray();
        if (seen.Length > 1)
        {
            var ob = p.Add.ScatterLine(seen.Select(i => L(observed!.Tokens[i])).ToArray(), seen.Select(i => L(observed!.Observed[i])).ToArray(),
                Plots.Moss);
            ob.LineWidth = 2f; ob.LegendText = "observed (corpus order)";
        }
        string family = r.Chosen?.Family ?? "model";
        // the model inside the sample thin, its extrapolation thick; the two share the sample's point
        var within = pts.Where(x => x.Tokens <= r.Tokens).ToList();
        var beyond = pts.Where(x => x.Tokens >= r.Tokens).ToList();
        if (within.Count > 1)
        {
            var m = p.Add.ScatterLine(within.Select(x => L(x.Tokens)).ToArray(), within.Select(x => L(x.Types)).ToArray(), Plots.Ember);
            m.LineWidth = 1.5f; m.LegendText = $"{family} model in the sample";
        }
        if (beyond.Count > 1)
        {
            var m = p.Add.ScatterLine(beyond.Select(x => L(x.Tokens)).ToArray(), beyond.Select(x => L(x.Types)).ToArray(), Plots.Ember);
            m.LineWidth = 3.5f; m.LegendText = $"{family} forecast beyond the sample";
        }
        var v = p.Add.VerticalLine(L(r.Tokens), 1f, Colors.Gray);
        var obs = p.Add.ScatterPoints(new[] { L(r.Tokens) }, new[] { L(r.Types) }, Plots.Ink);
        obs.MarkerSize = 9; obs.LegendText = "observed sample";
        p.ShowLegend(Alignment.LowerRight);
        return Plots.Render(p, "forecast", "Vocabulary growth: in-sample expectation, forecast and its 95% interval");
    }
}
