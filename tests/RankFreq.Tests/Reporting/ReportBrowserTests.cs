using System.Diagnostics;
using System.Text;
using System.Text.Json;
using Xunit;

namespace RankFreq.Tests.Reporting;

/// <summary>
/// Where the browser check finds its tools: <c>node</c> on PATH, the browser (RANKFREQ_CHROMIUM, else Debian's
/// /usr/bin/chromium) and the puppeteer-core package (RANKFREQ_NODE_MODULES, which <c>.ci/run</c> sets, else
/// .ci/node/node_modules in the repository, where <c>.ci/run</c> installs it).
/// </summary>
public static class BrowserTools
{
    public static string? Node => (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator)
        .Where(d => d.Length > 0).Select(d => Path.Combine(d, "node")).FirstOrDefault(File.Exists);

    public static string Chromium => Environment.GetEnvironmentVariable("RANKFREQ_CHROMIUM") is { Length: > 0 } c ? c : "/usr/bin/chromium";

    public static string NodeModules => Environment.GetEnvironmentVariable("RANKFREQ_NODE_MODULES") is { Length: > 0 } m
        ? Path.GetFullPath(m)
        : Path.Combine(Repo.Root, ".ci", "node", "node_modules");

    /// <summary>Why the browser check cannot run here, or null when it can.</summary>
    public static string? Missing()
    {
        if (Node is null) return "node is not on PATH";
        if (!File.Exists(Chromium)) return $"no browser at {Chromium} (Debian package chromium; or set RANKFREQ_CHROMIUM)";
        if (!File.Exists(Path.Combine(NodeModules, "puppeteer-core", "package.json")))
            return $"puppeteer-core is not installed in {NodeModules} (.ci/run installs it; or set RANKFREQ_NODE_MODULES)";
        return null;
    }
}

/// <summary>Skipped with the reason when node, the browser or puppeteer-core is missing; under CI=true it runs and fails.</summary>
public sealed class BrowserFactAttribute : FactAttribute
{
    public BrowserFactAttribute()
    {
        if (!Corpora.InCi && BrowserTools.Missing() is { } why) Skip = "browser check cannot run: " + why;
    }
}

public class ReportBrowserTests
{
    /// <summary>
    /// A generated text: 60,000 words drawn from a Zipf-like law over an invented vocabulary of 4,000 syllable words,
    /// with a fixed seed, so the report has a tail, a growth curve and every plot.
    /// </summary>
    internal static void WriteGeneratedText(string path)
    {
        string[] syl = ["ka", "lo", "mi", "ru", "te", "sa", "vo", "ne", "di", "pu", "fa", "zo", "ghi", "tra", "nel", "bor"];
        var words = Enumerable.Range(0, 4000).Select(i => syl[i % 16] + syl[(i / 16) % 16] + (i >= 256 ? syl[(i / 256) % 16] : "")).ToArray();
        var cum = new double[words.Length];
        double sum = 0;
        for (int i = 0; i < words.Length; i++) cum[i] = sum += Math.Pow(i + 1, -1.1);
        var rng = new Random(20261202);
        var sb = new StringBuilder();
        for (int t = 1; t <= 60_000; t++)
        {
            int k = Array.BinarySearch(cum, rng.NextDouble() * sum);
            sb.Append(words[Math.Min(words.Length - 1, k < 0 ? ~k : k)]).Append(t % 14 == 0 ? ".\n" : " ");
        }
        File.WriteAllText(path, sb.ToString());
    }

    [BrowserFact]
    public void ReportReadsWellAtDesktopAndPhoneWidths()
    {
        Assert.True(BrowserTools.Missing() is null, "browser check cannot run: " + BrowserTools.Missing());
        using var d = new TempDir();
        WriteGeneratedText(d["generated.txt"]);
        var (code, _, e) = Cli.Run("profile", d["generated.txt"], "-o", d["out"], "--reps", "100", "--ci-reps", "100", "-q");
        Assert.True(code == 0, e);
        string report = Path.Combine(d["out"], "report.html");
        // the forecast section is there, with its plot inlined, so the browser checks it with the rest
        string html = File.ReadAllText(report);
        Assert.Contains("<section id=\"forecast\"><h2>Vocabulary ahead</h2>", html);
        Assert.Contains("<figcaption>Vocabulary growth: in-sample expectation, forecast and its 95% interval</figcaption>", html);
        using var j = Check(report);
        foreach (var w in new[] { "1280", "390" })
        {
            var r = j.RootElement.GetProperty("widths").GetProperty(w);
            // rank–frequency, CCDF, spectrum, bootstrap α, growth, forecast
            Assert.Equal(6, r.GetProperty("figures").GetInt32());
            Assert.True(r.GetProperty("checked").GetInt32() > 100, "few text elements checked");
            Assert.True(r.GetProperty("scrollWidth").GetInt32() <= r.GetProperty("viewport").GetInt32());
        }
    }

    /// <summary>Runs tests/js/report-check.mjs on <paramref name="report"/> at 1280 and 390 px and asserts that it found
    /// nothing; returns its JSON result.</summary>
    internal static JsonDocument Check(string report)
    {
        var psi = new ProcessStartInfo(BrowserTools.Node!, [Path.Combine(Repo.Root, "tests", "js", "report-check.mjs"), report, "--widths", "1280,390"])
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
        };
        psi.Environment["RANKFREQ_NODE_MODULES"] = BrowserTools.NodeModules;
        psi.Environment["RANKFREQ_CHROMIUM"] = BrowserTools.Chromium;
        using var p = Process.Start(psi)!;
        var err = p.StandardError.ReadToEndAsync();
        var output = p.StandardOutput.ReadToEnd();
        Assert.True(p.WaitForExit(180_000), "the browser check timed out");
        string log = output + err.Result;
        Assert.True(output.TrimStart().StartsWith('{'), "the browser check printed no result: " + log);
        var j = JsonDocument.Parse(output);
        var failures = j.RootElement.GetProperty("failures").EnumerateArray().Select(f => f.GetString()).ToList();
        Assert.True(failures.Count == 0, string.Join("\n", failures));
        Assert.Equal(0, p.ExitCode);
        return j;
    }
}
