using System.Text.RegularExpressions;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Reporting;
using Xunit;

namespace RankFreq.Tests.Reporting;

/// <summary>What the report says, read from its HTML.</summary>
public class ReportContentTests
{
    private static string Report(TailFitResult fit, FrequencySpectrum s)
    {
        var c = new CountSummary("words", "NFC", "folded", s.TokenCount, s.TypeCount, 0, 0, 0, 0, 0, 0, [], [new InputInfo("x.txt", 10)], 1, 0, 0);
        var tokens = GrowthCurve.Checkpoints(s.TokenCount, 40);
        var types = tokens.Select(t => Math.Min(s.TypeCount, (long)Math.Ceiling(2 * Math.Sqrt(t)))).ToArray();
        types[^1] = s.TypeCount;
        var g = Lexicon.Growth(s, new GrowthCurve(tokens, types));
        var plots = new[] { Plots.Spectrum(s, fit), Plots.Growth(g) };
        return ReportHtml.Build("test", c, fit, Lexicon.Summarize(s), g, plots, 0);
    }

    private static AlternativeComparison Alt(string name, double llr, double p) =>
        new(name, new Dictionary<string, double>(), 0, llr, llr / 2, p, Verdicts.Favours(name, llr, p, nested: name == "power_law_cutoff"), FitStatus.Ok, "");

    [Fact]
    public void ANotRuledOutPowerLawAndAFavouredCutOffAreBothSaid()
    {
        var s = PlotLabelTests.ZipfLikeSpectrum();
        var fit = PlotLabelTests.SmallFit(s) with
        {
            GofP = 0.47,
            GofReps = 200,
            Alternatives = [Alt("lognormal", -1.2, 0.319), Alt("exponential", 12.7, 0.0002), Alt("power_law_cutoff", -1.66, 0.034)],
        };
        var html = Report(fit, s);
        Assert.Contains($"<strong>{Verdicts.GoodnessOfFit(0.47)}</strong>", html);
        Assert.Contains("the power law with exponential cut-off over the power law (p = 0.034)", html);
        Assert.Contains(System.Net.WebUtility.HtmlEncode("the power law over the exponential (p < 0.001)"), html);
        Assert.Contains("against the lognormal they give no verdict", html);
        Assert.Contains("href=\"#reading\"", html);
        // the caution the narrative points to is the shared one, not a restatement
        Assert.Contains(Cautions.For(0).Single(c => c.StartsWith("The goodness-of-fit test and the comparisons", StringComparison.Ordinal)), html);
    }

    [Fact]
    public void ARuledOutPowerLawIsSaidAsSuch()
    {
        var s = PlotLabelTests.ZipfLikeSpectrum();
        var fit = PlotLabelTests.SmallFit(s) with { GofP = 0.02, GofReps = 200, Alternatives = [] };
        var html = Report(fit, s);
        Assert.Contains($"<strong>{Verdicts.GoodnessOfFit(0.02)}</strong>", html);
        Assert.DoesNotContain("not ruled out</strong>", html);
    }

    [Fact]
    public void InlinedPlotsKeepTheirViewBoxAndDoNotShareIds()
    {
        var s = PlotLabelTests.ZipfLikeSpectrum();
        var html = Report(PlotLabelTests.SmallFit(s), s);
        Assert.Equal(2, Regex.Matches(html, "<svg[^>]*viewBox=\"0 0 760 480\"").Count);
        var ids = Regex.Matches(html, "id=\"([^\"]+)\"").Select(m => m.Groups[1].Value).ToList();
        Assert.NotEmpty(ids);
        Assert.Equal(ids.Count, ids.Distinct().Count());
        // every reference points at an id of its own plot
        foreach (Match m in Regex.Matches(html, @"url\(#([^)]+)\)")) Assert.Contains(m.Groups[1].Value, ids);
    }

    [Fact]
    public void ATinyInputGetsHonestNotes()
    {
        using var d = new TempDir();
        File.WriteAllText(d["tiny.txt"], "a b c a d e b f g a h i j\n"); // 13 tokens
        var (code, _, e) = Cli.Run("profile", d["tiny.txt"], "-o", d["out"], "-q");
        Assert.True(code == 0, e);
        var html = File.ReadAllText(Path.Combine(d["out"], "report.html"));
        Assert.DoesNotContain("N ≥ 100", html);
        Assert.Contains("to N = 13", html);
        Assert.Contains("not run: there is no power-law fit to test", html);
        Assert.DoesNotContain("<strong>power law", html); // no verdict without a fit
        Assert.Contains("No forecast: <code>too_few_types</code>", html); // a status and a message, no numbers
    }
}
