using System.Globalization;
using System.Text.RegularExpressions;
using System.Xml.Linq;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Reporting;
using Xunit;

namespace RankFreq.Tests.Reporting;

/// <summary>The plots, read through their rendered SVG text: axis titles, decade labels, legends, and where they sit.</summary>
public class PlotLabelTests
{
    private const double Width = 760, Height = 480;

    /// <summary>A spectrum shaped like word counts: V_f ≈ 6000·f^−2 at low f, then single types far out.</summary>
    internal static FrequencySpectrum ZipfLikeSpectrum()
    {
        var pairs = new List<(long, long)>();
        for (long f = 1; f <= 60; f++) pairs.Add((f, (long)Math.Round(6000.0 / (f * f))));
        foreach (long f in new long[] { 75, 90, 120, 150, 210, 300, 420, 700, 1100, 2300, 5200, 14000, 61000 }) pairs.Add((f, 1));
        return FrequencySpectrum.FromPairs(pairs);
    }

    internal static TailFitResult SmallFit(FrequencySpectrum s) =>
        TailFitter.Fit(s, new FitOptions(MinTail: 10, Reps: 40, CiReps: 60, Seed: 7, Threads: 2));

    private static GrowthAnalysis SmallGrowth(FrequencySpectrum s)
    {
        var tokens = GrowthCurve.Checkpoints(s.TokenCount, 60);
        // a growth curve V = 3·N^0.6, capped at the vocabulary size
        var types = tokens.Select(t => Math.Min(s.TypeCount, (long)Math.Round(3 * Math.Pow(t, 0.6)))).ToArray();
        types[^1] = s.TypeCount;
        return Lexicon.Growth(s, new GrowthCurve(tokens, types));
    }

    private static List<RenderedPlot> AllPlots()
    {
        var s = ZipfLikeSpectrum();
        var fit = SmallFit(s);
        Assert.Equal(FitStatus.Ok, fit.PowerLaw.Status);
        var alpha = Plots.AlphaBootstrap(fit);
        Assert.NotNull(alpha);
        return [Plots.RankFrequency(s, fit), Plots.Ccdf(s, fit), Plots.Spectrum(s, fit), alpha!, Plots.Growth(SmallGrowth(s))];
    }

    private static List<XElement> Texts(string svg) =>
        XDocument.Parse(svg).Descendants().Where(x => x.Name.LocalName == "text" && x.Value.Trim().Length > 0).ToList();

    private static readonly Regex Numeric = new(@"^[0-9.,eE+\-−⁰¹²³⁴⁵⁶⁷⁸⁹⁻]+$");
    private static readonly Regex Decade = new(@"^10⁻?[⁰¹²³⁴⁵⁶⁷⁸⁹]+$");

    [Fact]
    public void LogAxesCarryTheirTitlesAndOneStyleOfDecadeLabel()
    {
        var expected = new Dictionary<string, string[]>
        {
            ["rank-frequency"] = ["rank (log scale)", "frequency (log scale)"],
            ["ccdf"] = ["frequency x (log scale)", "P(X ≥ x) (log scale)"],
            ["spectrum"] = ["frequency f (log scale)", "types seen exactly f times (log scale)"],
            ["growth"] = ["tokens N (log scale)", "types V(N) (log scale)"],
        };
        foreach (var p in AllPlots().Where(p => expected.ContainsKey(p.Name)))
        {
            var texts = Texts(p.Svg).Select(t => t.Value.Trim()).ToList();
            foreach (var title in expected[p.Name]) Assert.Contains(title, texts);
            // every numeric tick label is a decade written as 10 with a superscript exponent: no "1e-1", no "10,000"
            var ticks = texts.Where(t => Numeric.IsMatch(t)).ToList();
            Assert.True(ticks.Count >= 3, $"{p.Name}: only {ticks.Count} tick labels");
            Assert.All(ticks, t => Assert.Matches(Decade, t));
            Assert.DoesNotContain(texts, t => t.Contains("V_f"));
            Assert.DoesNotContain(ticks, t => t.Contains("1e") || t.Contains(','));
        }
    }

    [Fact]
    public void DecadeLabelsAreSuperscriptPowersOfTen()
    {
        Assert.Equal("10⁰", Plots.DecadeLabel(0));
        Assert.Equal("10⁵", Plots.DecadeLabel(5));
        Assert.Equal("10⁻¹", Plots.DecadeLabel(-1));
        Assert.Equal("10¹²", Plots.DecadeLabel(12));
        Assert.Equal("", Plots.DecadeLabel(0.30103)); // between decades: minor tick, no label
    }

    [Fact]
    public void SpectrumShowsTheModelAndTheBootstrapPlotItsReplicates()
    {
        var plots = AllPlots();
        var spectrum = Texts(plots.Single(p => p.Name == "spectrum").Svg).Select(t => t.Value.Trim()).ToList();
        Assert.Contains(spectrum, t => t.StartsWith("expected by the fit, f ≥ xmin", StringComparison.Ordinal));
        Assert.Contains("observed, averaged over log bins (f ≥ xmin)", spectrum);
        var alpha = Texts(plots.Single(p => p.Name == "alpha-bootstrap").Svg).Select(t => t.Value.Trim()).ToList();
        Assert.Contains("α of a resampled data set", alpha);
        Assert.Contains("60 replicates", alpha);
        Assert.Contains(alpha, t => t.StartsWith("95% interval", StringComparison.Ordinal));
    }

    [Fact]
    public void EverySvgHasAViewBoxAndEveryLabelLiesInsideTheFrame()
    {
        foreach (var p in AllPlots())
        {
            var root = XDocument.Parse(p.Svg).Root!;
            Assert.Equal("0 0 760 480", root.Attribute("viewBox")?.Value);
            foreach (var t in Texts(p.Svg))
            {
                var (left, right, top, bottom) = Extent(t);
                string what = $"{p.Name}: \"{t.Value.Trim()}\" spans x {left:F0}–{right:F0}, y {top:F0}–{bottom:F0}";
                Assert.True(left >= 0 && right <= Width && top >= 0 && bottom <= Height, what);
            }
        }
    }

    /// <summary>
    /// The box a text element covers, from its transform (translate or the rotation matrix the renderer writes for
    /// vertical labels), its per-glyph x positions and font size; the last glyph is taken 0.8 em wide (generous for
    /// digits and Latin letters in a sans-serif face, whose advances are 0.3–0.75 em), ascenders 0.9 em above the
    /// baseline and descenders 0.25 em below (DejaVu Sans: about 0.76 and 0.24 em, from memory).
    /// </summary>
    private static (double Left, double Right, double Top, double Bottom) Extent(XElement t)
    {
        double size = double.Parse(t.Attribute("font-size")!.Value, CultureInfo.InvariantCulture);
        var xs = t.Attribute("x")!.Value.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries)
            .Select(v => double.Parse(v, CultureInfo.InvariantCulture)).ToArray();
        double y = double.Parse(t.Attribute("y")!.Value.Split(',')[0], CultureInfo.InvariantCulture);
        double a = xs.Min(), b = xs.Max() + 0.8 * size;
        var tr = t.Attribute("transform")!.Value;
        var nums = Regex.Matches(tr, @"-?[0-9.]+(?:e-?[0-9]+)?").Select(m => double.Parse(m.Value, CultureInfo.InvariantCulture)).ToArray();
        if (tr.StartsWith("translate", StringComparison.Ordinal))
            return (nums[0] + a, nums[0] + b, nums[1] + y - 0.9 * size, nums[1] + y + 0.25 * size);
        // matrix(0 -1 1 0 e f): (x, y) ↦ (y + e, −x + f)
        Assert.StartsWith("matrix(0 -1 1 0", tr);
        return (nums[4] + y - 0.9 * size, nums[4] + y + 0.25 * size, nums[5] - b, nums[5] - a);
    }
}
