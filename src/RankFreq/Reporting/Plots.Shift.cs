using ScottPlot;
using RankFreq.Comparison;
using RankFreq.Counting;

namespace RankFreq.Reporting;

/// <summary>The tokenizer-shift plots: both tokenizers' distributions on one set of axes.</summary>
public static partial class Plots
{
    /// <summary>Rank–frequency of the baseline (ink) and the candidate (ember) on log–log axes; null without spectra.</summary>
    public static RenderedPlot? ShiftRankFrequency(ShiftResult r)
    {
        if (r.Baseline.Spectrum is not { } b || r.Candidate.Spectrum is not { } c) return null;
        var p = NewPlot("Rank and frequency, two tokenizers", "rank (log scale)", "frequency (log scale)");
        LogAxes(p);
        foreach (var (s, spec, color) in new[] { (b, r.Baseline.Spec, Ink), (c, r.Candidate.Spec, Ember) })
        {
            var (xs, ys) = RankPoints(s);
            var line = p.Add.ScatterLine(xs, ys, color);
            line.LineWidth = 2f;
            line.LegendText = $"{spec}: {s.TokenCount:N0} tokens, {s.TypeCount:N0} types";
        }
        p.ShowLegend(Alignment.UpperRight);
        return Render(p, "shift-rank-frequency", "Rank–frequency (log–log) of both tokenizers");
    }

    /// <summary>Complementary CDFs of type frequencies of both tokenizers, xmin of each marked; null without spectra.</summary>
    public static RenderedPlot? ShiftCcdf(ShiftResult r)
    {
        if (r.Baseline.Spectrum is null || r.Candidate.Spectrum is null) return null;
        var p = NewPlot("Share of types at least this frequent, two tokenizers", "frequency x (log scale)", "P(X ≥ x) (log scale)");
        LogAxes(p);
        foreach (var (f, color) in new[] { (r.Baseline, Ink), (r.Candidate, Ember) })
        {
            var (xs, ys) = CcdfPoints(f.Spectrum!);
            var obs = p.Add.ScatterPoints(xs, ys, color);
            obs.MarkerSize = 4;
            var pl = f.Fit.PowerLaw;
            obs.LegendText = pl.Status == Fitting.FitStatus.Ok ? $"{f.Spec}, α = {pl.Alpha:F3}" : f.Spec;
            if (pl.Status == Fitting.FitStatus.Ok)
            {
                var v = p.Add.VerticalLine(Math.Log10(pl.Xmin), 1.5f, color);
                v.LegendText = $"{f.Spec} xmin = {pl.Xmin:N0}";
            }
        }
        p.ShowLegend(Alignment.LowerLeft);
        return Render(p, "shift-ccdf", "Complementary CDFs of both tokenizers, xmin of each");
    }
}
