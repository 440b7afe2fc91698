using System.Diagnostics;
using System.Globalization;
using System.Net;
using System.Text.Json;
using System.Text.RegularExpressions;
using RankFreq.Counting;
using RankFreq.Lexical;
using RankFreq.Reporting;
using Xunit;

namespace RankFreq.Tests.Reporting;

/// <summary>The profile report's forecast section and the forecast plot.</summary>
public class ForecastReportTests
{
    private static ForecastResult Forecast(FrequencySpectrum s) =>
        Forecaster.Run(s, new ForecastOptions([new ForecastTarget(2, true), new ForecastTarget(10, true)], Points: 30, Reps: 40, Threads: 2));

    private static string Report(FrequencySpectrum s, ForecastResult forecast, IReadOnlyList<RenderedPlot> plots)
    {
        var c = new CountSummary("words", "NFC", "folded", s.TokenCount, s.TypeCount, 0, 0, 0, 0, 0, 0, [], [new InputInfo("x.txt", 10)], 1, 0, 0);
        var tokens = GrowthCurve.Checkpoints(s.TokenCount, 40);
        var types = tokens.Select(t => Math.Min(s.TypeCount, (long)Math.Ceiling(2 * Math.Sqrt(t)))).ToArray();
        types[^1] = s.TypeCount;
        var g = Lexicon.Growth(s, new GrowthCurve(tokens, types));
        return ReportHtml.Build("test", c, PlotLabelTests.SmallFit(s), Lexicon.Summarize(s), g, plots, 0, forecast);
    }

    [Fact]
    public void SectionStatesTheModelTheTableAndTheCautions()
    {
        var s = PlotLabelTests.ZipfLikeSpectrum();
        var r = Forecast(s);
        Assert.NotNull(r.Chosen);
        var plot = ForecastPlot.Growth(r);
        var html = Report(s, r, [Plots.Spectrum(s, PlotLabelTests.SmallFit(s)), plot]);
        string section = html[html.IndexOf("<section id=\"forecast\">", StringComparison.Ordinal)..html.IndexOf("id=\"reading\"", StringComparison.Ordinal)];
        // the chosen model and why, in the words of the forecast itself
        Assert.Contains(WebUtility.HtmlEncode(r.Reason), section);
        // one row per target, with the point's own figures (2× and 10× the sample)
        foreach (var (t, p) in r.AtTargets())
        {
            Assert.Contains($"<td data-label=\"size\">{WebUtility.HtmlEncode(t.Value.ToString("G4", CultureInfo.InvariantCulture) + "×")}</td>", section);
            Assert.Contains($">{p.Types.ToString("N0", CultureInfo.InvariantCulture)}</td>", section);
            string lo = p.TypesLo.ToString("N0", CultureInfo.InvariantCulture), hi = p.TypesHi.ToString("N0", CultureInfo.InvariantCulture);
            Assert.Contains($">{lo} – {hi}</td>", section);
        }
        Assert.Equal(2, r.AtTargets().Count);
        foreach (var c in r.Cautions) Assert.Contains(WebUtility.HtmlEncode(c), section);
        // the forecast plot sits in this section, and only here
        Assert.Contains(WebUtility.HtmlEncode(plot.Title), section);
        Assert.Single(Regex.Matches(html, Regex.Escape(WebUtility.HtmlEncode(plot.Title))));
    }

    [Fact]
    public void ASpectrumNoModelFitsGivesTheStatusAndNoNumbers()
    {
        var s = FrequencySpectrum.FromPairs([(1L, 400L)]); // every type once
        var r = Forecast(s);
        Assert.Equal("all_hapax", r.Status);
        var html = Report(s, r, []);
        string section = html[html.IndexOf("<section id=\"forecast\">", StringComparison.Ordinal)..html.IndexOf("id=\"reading\"", StringComparison.Ordinal)];
        Assert.Contains("<code>all_hapax</code>", section);
        Assert.Contains(WebUtility.HtmlEncode(r.Message), section);
        Assert.DoesNotContain("<table", section);
    }

    [Fact]
    public void PlotDrawsNoDashPatterns()
    {
        // the SVG canvas writes "Unsupported path effect in addPaint." to standard output for a dash pattern it
        // cannot express, which broke --json with -o for another verb's plots; the forecast plot draws solid lines
        var s = PlotLabelTests.ZipfLikeSpectrum();
        var svg = ForecastPlot.Growth(Forecast(s)).Svg;
        Assert.DoesNotContain("stroke-dasharray", svg);
        Assert.Contains("forecast beyond the sample", svg);
    }

    [Fact]
    public async Task ForecastJsonOnStandardOutputParsesWhenPlotsAreWritten()
    {
        // the real executable in its own process, so anything native code prints to standard output is seen too
        using var d = new TempDir();
        var lines = new List<string> { "# value types" };
        foreach (var (v, t) in PlotLabelTests.ZipfLikeSpectrum().Values.Zip(PlotLabelTests.ZipfLikeSpectrum().Types)) lines.Add($"{v} {t}");
        File.WriteAllLines(d["s.txt"], lines);
        var psi = new ProcessStartInfo(Path.Combine(AppContext.BaseDirectory, "rankfreq"))
        { RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var a in new[] { "forecast", d["s.txt"], "--to", "10x", "--reps", "20", "--json", "-o", d["out"] }) psi.ArgumentList.Add(a);
        using var p = Process.Start(psi)!;
        var err = p.StandardError.ReadToEndAsync();
        string o = await p.StandardOutput.ReadToEndAsync();
        await p.WaitForExitAsync();
        Assert.True(p.ExitCode == 0, await err);
        Assert.True(File.Exists(Path.Combine(d["out"], "forecast.svg")));
        using var j = JsonDocument.Parse(o); // throws on anything but one JSON document
        Assert.Equal("ok", j.RootElement.GetProperty("status").GetString());
    }
}
