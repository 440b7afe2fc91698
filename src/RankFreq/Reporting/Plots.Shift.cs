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
        var sides = new[] { (r.Baseline, Ink), (r.Candidate, Ember) };
        foreach (var (f, color) in sides)
        {
            var (xs, ys) = CcdfPoints(f.Spectrum!);
            var obs = p.Add.ScatterPoints(xs, ys, color);
            obs.MarkerSize = 4;
            var pl = f.Fit.PowerLaw;
            obs.LegendText = pl.Status == Fitting.FitStatus.Ok ? $"{f.Spec}, α = {pl.Alpha:F3}" : f.Spec;
        }
        // the dashed lines come after every marker: the plot's shared paint keeps a dash pattern for the next plottable,
        // and the SVG canvas cannot draw markers with a dash path effect (it prints "Unsupported path effect in
        // addPaint." for each one, on the process's own output)
        foreach (var (f, color) in sides)
        {
            var pl = f.Fit.PowerLaw;
            if (pl.Status != Fitting.FitStatus.Ok) continue;
            var v = p.Add.VerticalLine(Math.Log10(pl.Xmin), 1.5f, color);
            v.LinePattern = LinePattern.Dashed;
            v.LegendText = $"{f.Spec} xmin = {pl.Xmin:N0}";
        }
        p.ShowLegend(Alignment.LowerLeft);
        return Render(p, "shift-ccdf", "Complementary CDFs of both tokenizers, xmin of each");
    }

    /// <summary>Fertility of each group (candidate tokens per baseline token), the whole text's as a vertical line;
    /// groups served worse in ember, better in moss; null without groups.</summary>
    public static RenderedPlot? ShiftByGroup(ShiftResult r)
    {
        if (r.Groups.Count == 0) return null;
        string unit = r.Baseline.Spec == "words" ? "word" : "baseline token";
        var p = NewPlot("Fertility by group", $"{r.Candidate.Spec} tokens per {unit}", "");
        var pos = new double[r.Groups.Count];
        for (int i = 0; i < r.Groups.Count; i++)
        {
            var g = r.Groups[i];
            pos[i] = r.Groups.Count - i;
            if (!double.IsFinite(g.Fertility)) continue;
            var c = g.Service switch { GroupService.Worse => Ember, GroupService.Better => Moss, _ => Ink };
            var dot = p.Add.ScatterPoints(new[] { g.Fertility }, new[] { pos[i] }, c);
            dot.MarkerSize = 9;
        }
        p.Axes.Left.SetTicks(pos, r.Groups.Select(g => g.Group.Length > 28 ? g.Group[..27] + "…" : g.Group).ToArray());
        p.Axes.SetLimitsY(0.4, r.Groups.Count + 0.6);
        if (double.IsFinite(r.Fertility))
        {
            var all = p.Add.VerticalLine(r.Fertility, 1.5f, Ink);
            all.LegendText = $"whole text {r.Fertility:F3}";
            p.ShowLegend(Alignment.LowerRight);
        }
        return Render(p, "shift-groups", "Fertility of each group against the whole text (ember: served worse, moss: better)",
            logAxes: false);
    }
}
