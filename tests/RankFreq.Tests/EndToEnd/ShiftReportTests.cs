using System.Diagnostics;
using System.Text.Json;
using RankFreq.Tests.Reporting;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

public class ShiftReportTests
{
    /// <summary>Two folders of generated text: plain/ as generated, joined/ the same words run together three at a
    /// time (longer, rarer words, so a subword vocabulary needs more tokens per word there).</summary>
    private static void WriteGroups(TempDir d)
    {
        Directory.CreateDirectory(d["in/plain"]);
        Directory.CreateDirectory(d["in/joined"]);
        ReportBrowserTests.WriteGeneratedText(d["in/plain/a.txt"]);
        var words = File.ReadAllText(d["in/plain/a.txt"]).Split(' ', '\n');
        File.WriteAllText(d["in/joined/b.txt"], string.Join("\n", words.Chunk(3).Select(c => string.Concat(c))));
    }

    private static (int Code, string Out, string Err) Process(params string[] args)
    {
        // the built executable in its own process: native code printing to the process's stdout shows up here, where
        // the in-process runner (which captures only the TextWriters) would miss it
        var psi = new ProcessStartInfo(Path.Combine(AppContext.BaseDirectory, "rankfreq"))
        { RedirectStandardOutput = true, RedirectStandardError = true };
        foreach (var a in args) psi.ArgumentList.Add(a);
        using var p = System.Diagnostics.Process.Start(psi)!;
        var e = p.StandardError.ReadToEndAsync();
        string o = p.StandardOutput.ReadToEnd();
        p.WaitForExit();
        return (p.ExitCode, o, e.Result);
    }

    [Fact]
    public async Task JsonOnStdoutStaysCleanWithAnOutputFolderAndGroupsAreReported()
    {
        using var d = new TempDir();
        WriteGroups(d);
        var (code, o, e) = Process("tokshift", d["in"], "--baseline", "words", "--candidate", "o200k_base", "--by", "folder",
            "--reps", "0", "--ci-reps", "10", "--alternatives", "none", "--json", "-q", "-o", d["out"]);
        Assert.True(code == 0, e);
        // the CCDF plot draws a dashed xmin line per side: the SVG canvas must not print anything while drawing it
        Assert.DoesNotContain("Unsupported", o + e);
        using var j = JsonDocument.Parse(o);        // stdout is one JSON document and nothing else
        var root = j.RootElement;
        Assert.Equal("folder", root.GetProperty("group_key").GetString());
        var groups = root.GetProperty("groups").EnumerateArray().ToList();
        Assert.Equal(2, groups.Count);
        // group totals add up to the whole text's, and fertility is tokens over tokens within each group
        foreach (var side in new[] { "baseline", "candidate" })
            Assert.Equal(root.GetProperty(side).GetProperty("tokens").GetInt64(), groups.Sum(g => g.GetProperty($"{side}_tokens").GetInt64()));
        Assert.Equal(root.GetProperty("baseline").GetProperty("text_bytes").GetInt64(), groups.Sum(g => g.GetProperty("text_bytes").GetInt64()));
        foreach (var g in groups)
            Assert.Equal(g.GetProperty("candidate_tokens").GetInt64() / (double)g.GetProperty("baseline_tokens").GetInt64(),
                g.GetProperty("fertility").GetDouble(), 12);
        // the run-together words need more subword tokens per word: that group is the one served worse
        var joined = groups.Single(g => g.GetProperty("group").GetString()!.EndsWith("joined"));
        var plain = groups.Single(g => g.GetProperty("group").GetString()!.EndsWith("plain"));
        Assert.Equal("worse", joined.GetProperty("candidate_serves").GetString());
        Assert.Equal("better", plain.GetProperty("candidate_serves").GetString());

        foreach (var f in new[] { "shift.parquet", "shift-groups.parquet", "shift-groups.svg", "report.html" })
            Assert.True(File.Exists(Path.Combine(d["out"], f)), f);
        await using var r = await Parquet.ParquetReader.CreateAsync(Path.Combine(d["out"], "shift-groups.parquet"));
        using var rg = r.OpenRowGroupReader(0);
        Assert.Equal(2, rg.RowCount);
        Assert.Empty(Directory.GetFiles(d["out"], "*.tmp*"));

        // the console names the worse group in plain words
        var (c2, text, e2) = Cli.Run("tokshift", d["in"], "--baseline", "words", "--candidate", "o200k_base", "--by", "folder",
            "--reps", "0", "--ci-reps", "10", "--alternatives", "none");
        Assert.True(c2 == 0, e2);
        Assert.Matches("o200k_base serves this group worse than the whole text .*joined", text);
    }

    [Fact]
    public void ByNeedsAKeyTheInputHas()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two three three three");
        Assert.Equal(2, Cli.Run("tokshift", d["a.txt"], "--baseline", "words", "--candidate", "chars", "--by", "nonsense:x").Code);
        var (code, _, e) = Cli.Run("tokshift", d["a.txt"], "--baseline", "words", "--candidate", "chars", "--by", "field:lang");
        Assert.Equal(1, code);
        Assert.Contains("JSON Lines", e);
    }

    [BrowserFact]
    public void ReportReadsWellAtDesktopAndPhoneWidths()
    {
        Assert.True(BrowserTools.Missing() is null, "browser check cannot run: " + BrowserTools.Missing());
        using var d = new TempDir();
        WriteGroups(d);
        var (code, _, e) = Cli.Run("tokshift", d["in"], "--baseline", "words", "--candidate", "o200k_base", "--by", "folder",
            "--reps", "0", "--ci-reps", "20", "-q", "-o", d["out"]);
        Assert.True(code == 0, e);
        string html = File.ReadAllText(Path.Combine(d["out"], "report.html"));
        Assert.Contains("RankFreq tokshift", html);
        Assert.DoesNotContain("<script", html);     // self-contained: styles and plots inline, nothing to fetch
        using var j = ReportBrowserTests.Check(Path.Combine(d["out"], "report.html"));
        foreach (var w in new[] { "1280", "390" })
        {
            var r = j.RootElement.GetProperty("widths").GetProperty(w);
            Assert.Equal(3, r.GetProperty("figures").GetInt32()); // rank–frequency overlay, CCDF overlay, fertility by group
            Assert.True(r.GetProperty("checked").GetInt32() > 100, "few text elements checked");
        }
    }
}
