using System.Diagnostics;
using System.Text.Json;
using RankFreq.Reporting;
using Xunit;

namespace RankFreq.Tests.Reporting;

public class ProfileTests
{
    private static readonly string[] SummaryKeys = ["tokens", "types", "alpha", "alpha_lo", "alpha_hi", "xmin", "n_tail", "ks_distance", "gof_p", "zipf_s",
        "heaps_beta", "heaps_k", "hapax", "dis", "good_turing_unseen", "chao1", "entropy_bits", "alternatives", "settings", "seed", "inputs",
        "forecast"];

    [CorpusFact]
    public void ProfileOfTheAddressesEndToEnd()
    {
        using var d = new TempDir();
        var (code, o, e) = Cli.Run("profile", Corpora.File("sotu.jsonl"), "--text-field", "text", "-o", d["out"], "--reps", "200", "--ci-reps", "100");
        Assert.True(code == 0, e);
        Assert.Contains("report:", o);
        foreach (var f in new[] { "counts.parquet", "spectrum.parquet", "fit.parquet", "fit.alternatives.parquet",
            "growth.parquet", "summary.json", "report.html",
                     "rank-frequency.svg", "ccdf.svg", "spectrum.svg", "growth.svg", "forecast.svg", "forecast.parquet" })
            Assert.True(File.Exists(Path.Combine(d["out"], f)), f);
        using var j = JsonDocument.Parse(File.ReadAllText(Path.Combine(d["out"], "summary.json")));
        foreach (var k in SummaryKeys) Assert.True(j.RootElement.TryGetProperty(k, out _), k);
        Assert.InRange(j.RootElement.GetProperty("alpha").GetDouble(), 1.5, 2.5);
        Assert.Equal(233, j.RootElement.GetProperty("records").GetInt64());
    }

    [Fact]
    public void ProfileOfBadInputLeavesNoOutput()
    {
        using var d = new TempDir();
        File.WriteAllText(d["x.jsonl"], "{\"other\": \"no text field\"}\n");
        var (code, _, e) = Cli.Run("profile", d["x.jsonl"], "-o", d["out"]);
        Assert.Equal(1, code);
        Assert.Contains("1 record lacks a text field 'text' (fields seen: other)", e);
        Assert.False(Directory.Exists(d["out"]));
    }

    internal static string DemoProfile(TempDir d)
    {
        var demo = Path.Combine(Repo.Root, "corpora-demo", "corpus");
        var (code, _, e) = Cli.Run("profile", demo, "-o", d["demo"], "--reps", "100", "--ci-reps", "50", "-q");
        Assert.True(code == 0, e);
        return d["demo"];
    }

    [Fact]
    public void PlotsAreValidAndCarryTheirLabels()
    {
        using var d = new TempDir();
        var dir = DemoProfile(d);
        foreach (var (name, label) in new[] { ("rank-frequency", "rank (log scale)"), ("ccdf", "frequency x (log scale)"),
            ("spectrum", "frequency f (log scale)"), ("growth", "tokens N (log scale)") })
        {
            var svg = File.ReadAllText(Path.Combine(dir, name + ".svg"));
            var doc = System.Xml.Linq.XDocument.Parse(svg); // well-formed XML
            var texts = doc.Descendants().Where(x => x.Name.LocalName == "text").Select(x => x.Value.Trim()).ToList();
            Assert.Contains(label, texts);
            if (Plots.Font is null) continue; // PNG skipped with a warning when no font exists
            var png = File.ReadAllBytes(Path.Combine(dir, name + ".png"));
            Assert.Equal(new byte[] { 0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A }, png[..8]);
            // text drawn: the label band left of the axis must hold dark pixels (empty if labels were missing)
            using var bmp = SkiaSharp.SKBitmap.Decode(png);
            int dark = 0;
            for (int x = 0; x < 30; x++) for (int y = 100; y < 380; y++) if (bmp.GetPixel(x, y).Red < 120) dark++;
            Assert.True(dark > 20, $"{name}.png: no y-axis label drawn");
        }
    }

    [Fact]
    public void FontIsFoundWhereCiInstallsIt()
    {
        if (!Corpora.InCi) return; // on a developer machine a missing font is a warning, not a failure
        Assert.NotNull(Plots.Font);
    }

    [Fact]
    public async Task ReportOpensInHeadlessChromiumWithoutErrors()
    {
        var chromium = new[] { "/usr/bin/chromium", "/usr/bin/chromium-browser", "/usr/bin/google-chrome" }.FirstOrDefault(File.Exists);
        if (chromium is null)
        {
            Assert.False(Corpora.InCi, "chromium is not installed (CI installs Debian package chromium)");
            return; // reported in the output below as a skip reason
        }
        using var d = new TempDir();
        var dir = DemoProfile(d);
        string report = Path.Combine(dir, "report.html"), shot = d["shot.png"];
        var html = File.ReadAllText(report);
        Assert.DoesNotContain("<script", html);
        Assert.DoesNotContain("http://", html.Replace("http://www.w3.org", ""));
        var psi = new ProcessStartInfo(chromium, ["--headless", "--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking",
            "--disable-component-update", "--disable-sync", $"--user-data-dir={d["profile"]}", "--enable-logging=stderr", "--v=0",
            "--window-size=1200,1600", $"--screenshot={shot}", "file://" + report])
        { RedirectStandardError = true, RedirectStandardOutput = true };
        using var p = Process.Start(psi)!;
        var err = p.StandardError.ReadToEndAsync();
        _ = p.StandardOutput.ReadToEndAsync();
        Assert.True(p.WaitForExit(90_000), "chromium timed out");
        var log = await err;
        Assert.DoesNotContain(log.Split('\n'), l => l.Contains("CONSOLE") && (l.Contains("ERROR") || l.Contains("Uncaught")));
        Assert.True(File.Exists(shot), "no screenshot: " + log[..Math.Min(400, log.Length)]);
        using var bmp = SkiaSharp.SKBitmap.Decode(shot);
        var colours = new HashSet<uint>();
        for (int x = 0; x < bmp.Width; x += 7) for (int y = 0; y < bmp.Height; y += 7) colours.Add((uint)bmp.GetPixel(x, y));
        Assert.True(colours.Count > 50, $"screenshot looks blank ({colours.Count} colours)");
    }
}
