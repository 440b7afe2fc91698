using ScottPlot;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;

namespace RankFreq.Reporting;

/// <summary>
/// The profile plots, in RankFreq's own look (ink-blue points, ember fit lines, pale paper background).
/// Log–log axes are drawn as log10 values with decade labels. PNG needs a font file: one is looked up in the
/// fontconfig folders at start; without one, only SVG is written (its labels are text elements).
/// </summary>
public static partial class Plots
{
    private static readonly Color Paper = Color.FromHex("#FBF8F1");
    private static readonly Color Ink = Color.FromHex("#23395B");
    private static readonly Color Ember = Color.FromHex("#D1495B");
    private static readonly Color Moss = Color.FromHex("#5B8C5A");
    private static readonly Color Grid = Color.FromHex("#E6DFD0");
    private const string FontName = "sans-serif";
    private static readonly Lazy<string?> FontFile = new(FindFont);

    /// <summary>The font file used for PNG text, or null when none was found.</summary>
    public static string? Font => FontFile.Value;

    private static string? FindFont()
    {
        var dirs = new[] { "/usr/share/fonts", "/usr/local/share/fonts", Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), ".fonts"),
            Path.Combine(Environment.GetFolderPath(Environment.SpecialFolder.UserProfile), ".local/share/fonts"), "/Library/Fonts", @"C:\Windows\Fonts" };
        var files = dirs.Where(Directory.Exists)
            .SelectMany(d => { try { return Directory.EnumerateFiles(d, "*.ttf", SearchOption.AllDirectories); } catch (IOException) { return []; } catch (UnauthorizedAccessException) { return []; } })
            .ToList();
        string? Pick(Func<string, bool> ok) => files.Where(f => ok(Path.GetFileNameWithoutExtension(f))).Order(StringComparer.Ordinal).FirstOrDefault();
        var font = Pick(n => n.Equals("DejaVuSans", StringComparison.OrdinalIgnoreCase))
            ?? Pick(n => n.Contains("Sans", StringComparison.OrdinalIgnoreCase) && !n.Contains("Mono") && !n.Contains("Bold") && !n.Contains("Oblique") && !n.Contains("Italic"))
            ?? files.Order(StringComparer.Ordinal).FirstOrDefault();
        if (font is not null) Fonts.AddFontFile(FontName, font);
        return font;
    }

    private static Plot NewPlot(string title, string x, string y)
    {
        _ = FontFile.Value;
        var p = new Plot();
        if (Font is not null) p.Font.Set(FontName);
        p.FigureBackground.Color = Paper;
        p.DataBackground.Color = Colors.White;
        p.Grid.MajorLineColor = Grid;
        p.Axes.Color(Color.FromHex("#3B3B3B"));
        p.Title(title, 15);
        p.XLabel(x, 13);
        p.YLabel(y, 13);
        return p;
    }

    private static void LogAxes(Plot p)
    {
        static string Decade(double v) => Math.Abs(v - Math.Round(v)) < 1e-9 ? (Math.Round(v) is var k && k >= 0 && k <= 6 ? Math.Pow(10, k).ToString("N0") : $"1e{k}") : "";
        foreach (var axis in new ScottPlot.IAxis[] { p.Axes.Bottom, p.Axes.Left })
            axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
            {
                MinorTickGenerator = new ScottPlot.TickGenerators.LogMinorTickGenerator(),
                IntegerTicksOnly = true,
                LabelFormatter = Decade,
            };
    }

    private static RenderedPlot Render(Plot p, string name, string title) =>
        new(name, title, p.GetSvgXml(760, 480), Font is null ? null : p.GetImageBytes(760, 480, ImageFormat.Png));

    /// <summary>Rank–frequency on log–log axes with the fitted tail.</summary>
    public static RenderedPlot RankFrequency(FrequencySpectrum s, TailFitResult fit)
    {
        var p = NewPlot("Rank and frequency", "rank (log scale)", "frequency (log scale)");
        LogAxes(p);
        // each distinct frequency occupies a block of ranks: plot both ends of every block
        var (xs, ys) = RankPoints(s);
        var obs = p.Add.ScatterPoints(xs, ys, Ink);
        obs.MarkerSize = 4;
        obs.LegendText = "observed types";
        if (fit.PowerLaw.Status == FitStatus.Ok)
        {
            var pl = fit.PowerLaw;
            var (rk, fq) = TailModelCurves.Rank(pl, s.Values[^1]);
            var fx = rk.Select(Math.Log10).ToList();
            var fy = fq.Select(Math.Log10).ToList();
            var line = p.Add.ScatterLine(fx.ToArray(), fy.ToArray(), Ember);
            line.LineWidth = 2.5f;
            line.LegendText = $"power-law tail, α = {pl.Alpha:F3}, xmin = {pl.Xmin}";
        }
        p.ShowLegend(Alignment.UpperRight);
        return Render(p, "rank-frequency", "Rank–frequency (log–log) with the fitted tail");
    }

    /// <summary>Complementary CDF of type frequencies, with the fit and xmin marked.</summary>
    public static RenderedPlot Ccdf(FrequencySpectrum s, TailFitResult fit)
    {
        var p = NewPlot("Share of types at least this frequent", "frequency x (log scale)", "P(X ≥ x) (log scale)");
        LogAxes(p);
        double n = s.TypeCount;
        var (xs, ys) = CcdfPoints(s);
        var obs = p.Add.ScatterPoints(xs, ys, Ink);
        obs.MarkerSize = 4;
        obs.LegendText = "observed";
        if (fit.PowerLaw.Status == FitStatus.Ok)
        {
            var pl = fit.PowerLaw;
            var (cx, cy) = TailModelCurves.Ccdf(pl, pl.NTail / n, s.Values[^1]);
            var fx = cx.Select(Math.Log10).ToList();
            var fy = cy.Select(Math.Log10).ToList();
            var line = p.Add.ScatterLine(fx.ToArray(), fy.ToArray(), Ember);
            line.LineWidth = 2.5f;
            line.LegendText = $"fitted power law, α = {pl.Alpha:F3}";
            var v = p.Add.VerticalLine(Math.Log10(pl.Xmin), 1.5f, Moss);
            v.LinePattern = LinePattern.Dashed;
            v.LegendText = $"xmin = {pl.Xmin}";
        }
        p.ShowLegend(Alignment.LowerLeft);
        return Render(p, "ccdf", "Complementary CDF of frequencies, fit and xmin");
    }

    /// <summary>The frequency spectrum: how many types occur exactly f times.</summary>
    public static RenderedPlot Spectrum(FrequencySpectrum s)
    {
        var p = NewPlot("Frequency spectrum", "frequency f (log scale)", "types with frequency f (log scale)");
        LogAxes(p);
        var pts = p.Add.ScatterPoints(s.Values.Select(v => Math.Log10(v)).ToArray(), s.Types.Select(v => Math.Log10(v)).ToArray(), Ink);
        pts.MarkerSize = 5;
        pts.LegendText = "V_f";
        p.ShowLegend(Alignment.UpperRight);
        return Render(p, "spectrum", "Frequency spectrum");
    }

    /// <summary>Vocabulary growth: observed, expected under random order, Heaps fit.</summary>
    public static RenderedPlot Growth(GrowthAnalysis g)
    {
        var p = NewPlot("Vocabulary growth", "tokens N (log scale)", "types V(N) (log scale)");
        LogAxes(p);
        var lx = g.Tokens.Select(t => Math.Log10(t)).ToArray();
        var o = p.Add.ScatterLine(lx, g.Observed.Select(v => Math.Log10(Math.Max(1, v))).ToArray(), Ink);
        o.LineWidth = 2.5f; o.LegendText = "observed (corpus order)";
        var e = p.Add.ScatterLine(lx, g.Expected.Select(v => Math.Log10(Math.Max(1, v))).ToArray(), Moss);
        e.LineWidth = 2f; e.LinePattern = LinePattern.Dashed; e.LegendText = "expected (random order)";
        if (double.IsFinite(g.HeapsBeta))
        {
            var h = p.Add.ScatterLine(lx, g.Tokens.Select(t => Math.Log10(g.HeapsAt(t))).ToArray(), Ember);
            h.LineWidth = 1.5f; h.LinePattern = LinePattern.Dotted; h.LegendText = $"Heaps: V = {g.HeapsK:G3}·N^{g.HeapsBeta:F3}";
        }
        p.ShowLegend(Alignment.UpperLeft);
        return Render(p, "growth", "Vocabulary growth with Heaps' law");
    }
}
