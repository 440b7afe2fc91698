using ScottPlot;
using RankFreq.Lexical;

namespace RankFreq.Reporting;

/// <summary>The forecast plot: expected vocabulary growth in and beyond the sample, with its interval band.</summary>
public static class ForecastPlot
{
    /// <summary>Types against tokens on log–log axes: the model curve with its 95% band, the exact in-sample
    /// expectation, the observed sample, and a line where the sample ends.</summary>
    public static RenderedPlot Growth(ForecastResult r)
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
        if (pts.Count > 1)
        {
            var m = p.Add.ScatterLine(pts.Select(x => L(x.Tokens)).ToArray(), pts.Select(x => L(x.Types)).ToArray(), Plots.Ember);
            m.LineWidth = 2f; m.LinePattern = LinePattern.Dashed;
            m.LegendText = $"{r.Chosen?.Family ?? "model"} forecast";
        }
        var obs = p.Add.ScatterPoints(new[] { L(r.Tokens) }, new[] { L(r.Types) }, Plots.Ink);
        obs.MarkerSize = 9; obs.LegendText = "observed sample";
        var v = p.Add.VerticalLine(L(r.Tokens), 1.5f, Plots.Moss);
        v.LinePattern = LinePattern.Dotted;
        p.ShowLegend(Alignment.UpperLeft);
        return Plots.Render(p, "forecast", "Vocabulary growth: in-sample expectation, forecast and its 95% interval");
    }
}
