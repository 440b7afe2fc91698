using ScottPlot;
using RankFreq.Comparison;
using RankFreq.Counting;

namespace RankFreq.Reporting;

/// <summary>The contrast plots, in the profile plots' look.</summary>
public static partial class Plots
{
    // one colour per group, cycled: the profile's ink, ember and moss first, then muted companions (hex here: static
    // fields of the other part of this class may not be initialised yet when this one is)
    private static readonly Color[] GroupColors =
        [Color.FromHex("#23395B"), Color.FromHex("#D1495B"), Color.FromHex("#5B8C5A"), Color.FromHex("#C08A1E"), Color.FromHex("#6C4F8C"),
            Color.FromHex("#2F8F9D"), Color.FromHex("#8C5A3C"),
         Color.FromHex("#4F6D7A"), Color.FromHex("#B5656F"), Color.FromHex("#7A8B3A")];

    private static Color GroupColor(int i) => GroupColors[i % GroupColors.Length];

    /// <summary>
    /// Each fitted group's α with its 95% interval: raw (bootstrap over types) and, when matched, at the common size
    /// (bootstrap then thinning), one row per group.
    /// </summary>
    public static RenderedPlot Exponents(ContrastResult r)
    {
        var p = NewPlot("Tail exponent by group", "α (95% interval)", "");
        var groups = r.Groups.Where(g => g.Status == ContrastStatus.Ok).ToList();
        var pos = new double[groups.Count];
        for (int i = 0; i < groups.Count; i++)
        {
            double y = groups.Count - i;
            pos[i] = y;
            var g = groups[i];
            Interval(p, y + 0.12, g.AlphaLo, g.AlphaHi, g.Alpha, GroupColors[0], i == 0 ? "own size" : null);
            if (g.Matched is { Status: ContrastStatus.Ok } m)
                Interval(p, y - 0.12, m.AlphaLo, m.AlphaHi, m.Figures["alpha"].Mean, GroupColors[1], i == 0
                    ? $"matched size ({m.TargetTokens:N0} tokens)" : null);
        }
        if (groups.Count > 0) p.Axes.Left.SetTicks(pos, groups.Select(g => g.Group).ToArray());
        // an empty band below the last group holds the legend
        p.Axes.SetLimitsY(-0.6, groups.Count + 0.6);
        p.ShowLegend(Alignment.LowerRight);
        return Render(p, "exponents", "Tail exponent α of each group with its 95% interval, own size and matched size");
    }

    private static void Interval(Plot p, double y, double lo, double hi, double mid, Color c, string? legend)
    {
        if (double.IsFinite(lo) && double.IsFinite(hi))
        {
            var bar = p.Add.ScatterLine(new[] { lo, hi }, new[] { y, y }, c);
            bar.LineWidth = 2.5f;
        }
        if (!double.IsFinite(mid)) return;
        var dot = p.Add.ScatterPoints(new[] { mid }, new[] { y }, c);
        dot.MarkerSize = 8;
        if (legend is not null) dot.LegendText = legend;
    }

    /// <summary>log10 rank and log10 frequency at both ends of each block of ranks sharing a frequency.</summary>
    private static (double[] X, double[] Y) RankPoints(FrequencySpectrum s)
    {
        var xs = new List<double>(); var ys = new List<double>();
        long rank = 1;
        for (int i = s.Values.Length - 1; i >= 0; i--)
        {
            double y = Math.Log10(s.Values[i]);
            xs.Add(Math.Log10(rank)); ys.Add(y);
            long last = rank + s.Types[i] - 1;
            if (last > rank) { xs.Add(Math.Log10(last)); ys.Add(y); }
            rank = last + 1;
        }
        return (xs.ToArray(), ys.ToArray());
    }

    /// <summary>log10 x and log10 P(X ≥ x) at each observed frequency x.</summary>
    private static (double[] X, double[] Y) CcdfPoints(FrequencySpectrum s)
    {
        double n = s.TypeCount, above = n;
        var xs = new double[s.Values.Length]; var ys = new double[s.Values.Length];
        for (int i = 0; i < s.Values.Length; i++)
        {
            xs[i] = Math.Log10(s.Values[i]);
            ys[i] = Math.Log10(above / n);
            above -= s.Types[i];
        }
        return (xs, ys);
    }

    /// <summary>Rank–frequency curves of the groups on shared log–log axes (both ends of each rank block).</summary>
    public static RenderedPlot RankFrequencyByGroup(IReadOnlyList<GroupSpectrum> groups)
    {
        var p = NewPlot("Rank and frequency by group", "rank (log scale)", "frequency (log scale)");
        LogAxes(p);
        for (int gi = 0; gi < groups.Count; gi++)
        {
            if (groups[gi].Spectrum.Values.Length == 0) continue;
            var (xs, ys) = RankPoints(groups[gi].Spectrum);
            var line = p.Add.ScatterLine(xs, ys, GroupColor(gi));
            line.LineWidth = 1.8f;
            line.LegendText = groups[gi].Group;
        }
        p.ShowLegend(Alignment.UpperRight);
        return Render(p, "rank-frequency-groups", "Rank–frequency (log–log) of each group");
    }

    /// <summary>Complementary CDFs of type frequencies of the groups on shared log–log axes.</summary>
    public static RenderedPlot CcdfByGroup(IReadOnlyList<GroupSpectrum> groups)
    {
        var p = NewPlot("Share of types at least this frequent, by group", "frequency x (log scale)", "P(X ≥ x) (log scale)");
        LogAxes(p);
        for (int gi = 0; gi < groups.Count; gi++)
        {
            if (groups[gi].Spectrum.Values.Length == 0) continue;
            var (xs, ys) = CcdfPoints(groups[gi].Spectrum);
            var line = p.Add.ScatterLine(xs, ys, GroupColor(gi));
            line.LineWidth = 1.8f;
            line.LegendText = groups[gi].Group;
        }
        p.ShowLegend(Alignment.LowerLeft);
        return Render(p, "ccdf-groups", "Complementary CDF of frequencies of each group");
    }
}
