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
    internal static readonly Color Ink = Color.FromHex("#23395B");
    internal static readonly Color Ember = Color.FromHex("#D1495B");
    internal static readonly Color Moss = Color.FromHex("#5B8C5A");
    private static readonly Color Grid = Color.FromHex("#E6DFD0");
    private const string FontName = "sans-serif";
    private static readonly Lazy<string?> FontFile = new(FindFont);

    /// <summary>The font file used for PNG text, or null when none was found.</summary>
    public static string? Font => FontFile.Value;

    private static string? FindFont()
    {
        var home = Environment.GetFolderPath(Environment.SpecialFolder.UserProfile);
        var dirs = new[]
        {
            "/usr/share/fonts", "/usr/local/share/fonts",
            Path.Combine(home, ".fonts"), Path.Combine(home, ".local/share/fonts"), "/Library/Fonts", @"C:\Windows\Fonts",
        };
        var files = dirs.Where(Directory.Exists)
            .SelectMany(d =>
            {
                try { return Directory.EnumerateFiles(d, "*.ttf", SearchOption.AllDirectories); }
                catch (IOException) { return []; }
                catch (UnauthorizedAccessException) { return []; }
            })
            .ToList();
        string? Pick(Func<string, bool> ok) => files.Where(f => ok(Path.GetFileNameWithoutExtension(f))).Order(StringComparer.Ordinal).FirstOrDefault();
        var font = Pick(n => n.Equals("DejaVuSans", StringComparison.OrdinalIgnoreCase))
            ?? Pick(n => n.Contains("Sans", StringComparison.OrdinalIgnoreCase)
                && !n.Contains("Mono") && !n.Contains("Bold") && !n.Contains("Oblique") && !n.Contains("Italic"))
            ?? files.Order(StringComparer.Ordinal).FirstOrDefault();
        if (font is not null) Fonts.AddFontFile(FontName, font);
        return font;
    }

    internal static Plot NewPlot(string title, string x, string y)
    {
        _ = FontFile.Value;
        var p = new Plot();
        if (Font is not null) p.Font.Set(FontName);
        p.FigureBackground.Color = Paper;
        p.DataBackground.Color = Colors.White;
        p.Grid.MajorLineColor = Grid;
        p.Axes.Color(Color.FromHex("#3B3B3B"));
        p.Title(title, 19);
        p.XLabel(x, 17);
        p.YLabel(y, 17);
        // room right of the data area for half of the last x tick label, so no label runs into the frame edge
        p.Axes.Right.MinimumSize = 28;
        p.Axes.Top.MinimumSize = 36;
        p.Axes.Left.Label.OffsetX = 5; // keeps the rotated y-axis title's ascenders off the image edge
        p.Axes.Bottom.TickLabelStyle.FontSize = 15;
        p.Axes.Left.TickLabelStyle.FontSize = 15;
        p.Legend.FontSize = 14;
        return p;
    }

    private const string Superscripts = "⁰¹²³⁴⁵⁶⁷⁸⁹";

    /// <summary>
    /// The label of a log10 axis position: "10" with the exponent in superscript digits (10⁻¹, 10⁰, 10⁵) at whole
    /// decades, empty elsewhere — one style for every decade, small or large.
    /// </summary>
    public static string DecadeLabel(double log10)
    {
        double k = Math.Round(log10);
        if (Math.Abs(log10 - k) > 1e-9) return "";
        var digits = Math.Abs((long)k).ToString(System.Globalization.CultureInfo.InvariantCulture);
        return "10" + (k < 0 ? "⁻" : "") + string.Concat(digits.Select(c => Superscripts[c - '0']));
    }

    internal static void LogAxes(Plot p)
    {
        static string Decade(double v) => DecadeLabel(v);
        foreach (var axis in new ScottPlot.IAxis[] { p.Axes.Bottom, p.Axes.Left })
            axis.TickGenerator = new ScottPlot.TickGenerators.NumericAutomatic
            {
                MinorTickGenerator = new ScottPlot.TickGenerators.LogMinorTickGenerator(),
                IntegerTicksOnly = true,
                LabelFormatter = Decade,
            };
    }

    private const int Width = 760, Height = 480;

    internal static RenderedPlot Render(Plot p, string name, string title, bool logAxes = true)
    {
        if (logAxes) TwoDecadesAtLeast(p);
        return new(name, title, WithViewBox(p.GetSvgXml(Width, Height)), Font is null ? null : p.GetImageBytes(Width, Height, ImageFormat.Png));
    }

    /// <summary>Widens a log axis that would show fewer than two decade labels (tiny inputs), so every axis has a scale.</summary>
    private static void TwoDecadesAtLeast(Plot p)
    {
        p.Axes.AutoScale();
        var l = p.Axes.GetLimits();
        static (double, double) Widen(double lo, double hi)
        {
            if (Math.Floor(hi) - Math.Ceiling(lo) >= 1) return (lo, hi);
            double d = Math.Floor(lo);
            return (Math.Min(lo, d - 0.05), Math.Max(hi, d + 1.05));
        }
        var (x0, x1) = Widen(l.Left, l.Right);
        var (y0, y1) = Widen(l.Bottom, l.Top);
        p.Axes.SetLimits(x0, x1, y0, y1);
    }

    /// <summary>Gives the root element a viewBox, so the drawing scales to any box instead of being clipped.</summary>
    private static string WithViewBox(string svg)
    {
        string size = $"width=\"{Width}\" height=\"{Height}\"";
        int root = svg.IndexOf("<svg", StringComparison.Ordinal);
        int at = root < 0 ? -1 : svg.IndexOf(size, root, StringComparison.Ordinal);
        if (at < 0 || svg.IndexOf("viewBox", root, StringComparison.Ordinal) is var v && v >= 0 && v < svg.IndexOf('>', root)) return svg;
        return svg.Insert(at, $"viewBox=\"0 0 {Width} {Height}\" ");
    }

    /// <summary>Rank–frequency on log–log axes with the fitted tail.</summary>
    public static RenderedPlot RankFrequency(FrequencySpectrum s, TailFitResult fit)
    {
        var p = NewPlot("Rank and frequency", "rank (log scale)", "frequency (log scale)");
        LogAxes(p);
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
            line.LegendText = $"power-law tail, α = {pl.Alpha:F3}, xmin = {pl.Xmin:N0}";
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
            v.LegendText = $"xmin = {pl.Xmin:N0}";
        }
        p.ShowLegend(Alignment.LowerLeft);
        return Render(p, "ccdf", "Complementary CDF of frequencies, fit and xmin");
    }

    /// <summary>
    /// The frequency spectrum: how many types occur exactly f times, with the fitted model's expected counts for
    /// f ≥ xmin (from <see cref="TailModelCurves.Spectrum"/>).
    /// </summary>
    public static RenderedPlot Spectrum(FrequencySpectrum s, TailFitResult fit)
    {
        var p = NewPlot("Frequency spectrum", "frequency f (log scale)", "types seen exactly f times (log scale)");
        LogAxes(p);
        var pts = p.Add.ScatterPoints(s.Values.Select(v => Math.Log10(v)).ToArray(), s.Types.Select(v => Math.Log10(v)).ToArray(), Ink);
        pts.MarkerSize = 5;
        pts.LegendText = "observed: types seen f times";
        if (fit.PowerLaw.Status == FitStatus.Ok)
        {
            var pl = fit.PowerLaw;
            var (bx, by, _) = SpectrumBins.LogBinned(s, pl.Xmin);
            var bins = p.Add.ScatterPoints(bx.Select(Math.Log10).ToArray(), by.Select(Math.Log10).ToArray(), Moss);
            bins.MarkerShape = MarkerShape.FilledDiamond;
            bins.MarkerSize = 9;
            bins.LegendText = "observed, averaged over log bins (f ≥ xmin)";
            var (x, e) = TailModelCurves.Spectrum(pl, s.Values[^1]);
            if (x.Length > 1)
            {
                var line = p.Add.ScatterLine(x.Select(Math.Log10).ToArray(), e.Select(Math.Log10).ToArray(), Ember);
                line.LineWidth = 2.5f;
                line.LegendText = $"expected by the fit, f ≥ xmin = {pl.Xmin:N0}";
            }
        }
        p.ShowLegend(Alignment.UpperRight);
        return Render(p, "spectrum", fit.PowerLaw.Status != FitStatus.Ok ? "Frequency spectrum (no tail fit to compare)"
            : "Frequency spectrum with the fitted power law's expected counts. Above xmin most frequencies are held by one "
                + "type or none, so read the fit against the bin averages (diamonds)");
    }

    /// <summary>
    /// The bootstrap distribution of α (<see cref="TailFitResult.AlphaReplicates"/>) as a histogram, with the estimate
    /// and the 95% interval marked; null when the bootstrap was not run.
    /// </summary>
    public static RenderedPlot? AlphaBootstrap(TailFitResult fit)
    {
        var a = fit.AlphaReplicates;
        if (a.Count < 2 || fit.PowerLaw.Status != FitStatus.Ok) return null;
        var p = NewPlot("Bootstrap distribution of α", "α of a resampled data set", "replicates");
        double lo = a.Min(), hi = a.Max();
        int bins = Math.Clamp((int)Math.Sqrt(a.Count), 8, 40);
        double width = hi > lo ? (hi - lo) / bins : 0.01;
        var counts = new double[bins];
        foreach (double v in a) counts[Math.Min(bins - 1, (int)((v - lo) / width))]++;
        var centres = Enumerable.Range(0, bins).Select(i => lo + (i + 0.5) * width).ToArray();
        var bars = p.Add.Bars(centres, counts);
        foreach (var b in bars.Bars)
        {
            b.Size = width * 0.92;
            b.FillColor = Ink.WithAlpha(0.75);
            b.LineWidth = 0;
        }
        bars.LegendText = $"{a.Count:N0} replicates";
        var est = p.Add.VerticalLine(fit.PowerLaw.Alpha, 2.5f, Ember);
        est.LegendText = $"estimate α = {fit.PowerLaw.Alpha:F3}";
        if (double.IsFinite(fit.AlphaLo) && double.IsFinite(fit.AlphaHi))
        {
            foreach (double q in new[] { fit.AlphaLo, fit.AlphaHi })
            {
                var v = p.Add.VerticalLine(q, 1.5f, Moss);
                v.LinePattern = LinePattern.Dashed;
                v.LegendText = q == fit.AlphaLo ? $"95% interval {fit.AlphaLo:F3} – {fit.AlphaHi:F3}" : "";
            }
        }
        p.Axes.Margins(bottom: 0);
        p.ShowLegend(Alignment.UpperRight);
        return Render(p, "alpha-bootstrap", logAxes: false, title:
            "Bootstrap distribution of α with the 95% interval; xmin is chosen anew in each replicate, so a second peak means the choice of xmin is unstable");
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
            // drawn over the part of the curve it was fitted to
            var fitted = g.Tokens.Where(t => t >= g.HeapsFrom).ToArray();
            var h = p.Add.ScatterLine(fitted.Select(t => Math.Log10(t)).ToArray(), fitted.Select(t => Math.Log10(g.HeapsAt(t))).ToArray(), Ember);
            h.LineWidth = 2.5f; h.LinePattern = LinePattern.Dotted;
            h.LegendText = $"Heaps' law, β = {g.HeapsBeta:F3}, K = {g.HeapsK:G3} (fitted from N = {g.HeapsFrom:N0})";
        }
        p.ShowLegend(Alignment.UpperLeft);
        return Render(p, "growth", "Vocabulary growth with Heaps' law");
    }
}
