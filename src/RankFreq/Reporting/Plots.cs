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

    private static PlotFile Save(Plot p, string dir, string name, string title)
    {
        string svg = Path.Combine(dir, name + ".svg");
        string? png = Font is null ? null : Path.Combine(dir, name + ".png");
        Storage.AtomicFile.WriteTextAsync(svg, p.GetSvgXml(760, 480)).GetAwaiter().GetResult();
        if (png is not null) Storage.AtomicFile.WriteBytesAsync(png, p.GetImageBytes(760, 480, ImageFormat.Png)).GetAwaiter().GetResult();
        return new PlotFile(name, title, svg, png);
    }

    /// <summary>Rank–frequency on log–log axes with the fitted tail.</summary>
    public static PlotFile RankFrequency(FrequencySpectrum s, TailFitResult fit, string dir)
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
            // the fitted tail: the type at frequency x has rank n_tail · ζ(α, x)/ζ(α, xmin)
            var pl = fit.PowerLaw;
            double z0 = HurwitzZeta.Value(pl.Alpha, pl.Xmin);
            var fx = new List<double>(); var fy = new List<double>();
            double top = s.Values[^1];
            for (double lx = Math.Log10(pl.Xmin); lx <= Math.Log10(top) + 1e-9; lx += 0.02)
            {
                double x = Math.Round(Math.Pow(10, lx));
                double r = pl.NTail * HurwitzZeta.Value(pl.Alpha, x) / z0;
                if (r < 1) break;
                fx.Add(Math.Log10(r)); fy.Add(Math.Log10(x));
            }
            var line = p.Add.ScatterLine(fx.ToArray(), fy.ToArray(), Ember);
            line.LineWidth = 2.5f;
            line.LegendText = $"power-law tail, α = {pl.Alpha:F3}, xmin = {pl.Xmin}";
        }
        p.ShowLegend(Alignment.UpperRight);
        return Save(p, dir, "rank-frequency", "Rank–frequency (log–log) with the fitted tail");
    }

    /// <summary>Complementary CDF of type frequencies, with the fit and xmin marked.</summary>
    public static PlotFile Ccdf(FrequencySpectrum s, TailFitResult fit, string dir)
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
            double z0 = HurwitzZeta.Value(pl.Alpha, pl.Xmin), share = pl.NTail / n;
            var fx = new List<double>(); var fy = new List<double>();
            for (double lx = Math.Log10(pl.Xmin); lx <= Math.Log10(s.Values[^1]) + 1e-9; lx += 0.02)
            {
                double x = Math.Round(Math.Pow(10, lx));
                fx.Add(Math.Log10(x)); fy.Add(Math.Log10(share * HurwitzZeta.Value(pl.Alpha, x) / z0));
            }
            var line = p.Add.ScatterLine(fx.ToArray(), fy.ToArray(), Ember);
            line.LineWidth = 2.5f;
            line.LegendText = $"fitted power law, α = {pl.Alpha:F3}";
            var v = p.Add.VerticalLine(Math.Log10(pl.Xmin), 1.5f, Moss);
            v.LinePattern = LinePattern.Dashed;
            v.LegendText = $"xmin = {pl.Xmin}";
        }
        p.ShowLegend(Alignment.LowerLeft);
        return Save(p, dir, "ccdf", "Complementary CDF of frequencies, fit and xmin");
    }

    /// <summary>The frequency spectrum: how many types occur exactly f times.</summary>
    public static PlotFile Spectrum(FrequencySpectrum s, string dir)
    {
        var p = NewPlot("Frequency spectrum", "frequency f (log scale)", "types with frequency f (log scale)");
        LogAxes(p);
        var pts = p.Add.ScatterPoints(s.Values.Select(v => Math.Log10(v)).ToArray(), s.Types.Select(v => Math.Log10(v)).ToArray(), Ink);
        pts.MarkerSize = 5;
        pts.LegendText = "V_f";
        p.ShowLegend(Alignment.UpperRight);
        return Save(p, dir, "spectrum", "Frequency spectrum");
    }

    /// <summary>Vocabulary growth: observed, expected under random order, Heaps fit.</summary>
    public static PlotFile Growth(GrowthAnalysis g, string dir)
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
            var h = p.Add.ScatterLine(lx, g.Tokens.Select(t => Math.Log10(g.HeapsK * Math.Pow(t, g.HeapsBeta))).ToArray(), Ember);
            h.LineWidth = 1.5f; h.LinePattern = LinePattern.Dotted; h.LegendText = $"Heaps: V = {g.HeapsK:G3}·N^{g.HeapsBeta:F3}";
        }
        p.ShowLegend(Alignment.UpperLeft);
        return Save(p, dir, "growth", "Vocabulary growth with Heaps' law");
    }
}
