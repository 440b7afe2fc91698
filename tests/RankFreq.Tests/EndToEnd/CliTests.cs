using System.Text.Json;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

public class CliTests
{
    [Fact]
    public void CountWritesATableAndJsonSummary()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two three three three");
        var (code, o, e) = Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "--json");
        Assert.True(code == 0, e);
        using var j = JsonDocument.Parse(o);
        Assert.Equal(6, j.RootElement.GetProperty("tokens").GetInt64());
        Assert.Equal(3, j.RootElement.GetProperty("types").GetInt64());
        foreach (var k in new[] { "bytes", "replaced_bytes", "skipped_files", "seconds" }) Assert.True(j.RootElement.TryGetProperty(k, out _), k);
        Assert.True(File.Exists(d["t.parquet"]));
    }

    [Fact]
    public void UsageErrorsExitTwo()
    {
        Assert.Equal(2, Cli.Run("count").Code);
        Assert.Equal(2, Cli.Run("count", "x.txt").Code);              // -o missing
        Assert.Equal(2, Cli.Run("frobnicate").Code);
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "w");
        Assert.Equal(2, Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "--memory", "lots").Code);
        Assert.Equal(2, Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "--shard", "4/3").Code);
    }

    [Fact]
    public void BadInputIsOneLineExitOneAndNoOutput()
    {
        using var d = new TempDir();
        var (code, _, e) = Cli.Run("count", d["missing.txt"], "-o", d["t.parquet"]);
        Assert.Equal(1, code);
        Assert.Contains("missing.txt", e);
        Assert.Single(e.Trim().Split('\n'));
        Assert.False(File.Exists(d["t.parquet"]));

        File.WriteAllText(d["a.txt"], "words here");
        var bad = Cli.Run("count", d["a.txt"], "-o", d["t.parquet"], "-t", "bpe:nope.json,nope.txt");
        Assert.Equal(1, bad.Code);
        Assert.Contains("nope.json", bad.Err);
        var unwritable = Cli.Run("count", d["a.txt"], "-o", Path.Combine(d.Path, "no-such-dir", "t.parquet"));
        Assert.Equal(1, unwritable.Code);
        Assert.Contains("no-such-dir", unwritable.Err);
        Assert.Empty(Directory.GetFiles(d.Path, "*.tmp", SearchOption.AllDirectories));
    }

    [Theory]
    [InlineData("12\n-3\n", "negative")]
    [InlineData("12\n3.5\n", "not an integer")]
    [InlineData("12\nabc\n", "is not a count")]
    [InlineData("\n# nothing\n", "no counts")]
    // a value listed twice whose types add up past a 64-bit count (found by the fuzz campaign: the sum wrapped)
    [InlineData("1 9223372036854775807\n1 1\n2 1\n3 1\n", "more than a count can hold")]
    [InlineData("1 9223372036854775807\n1 9223372036854775807\n2 1\n", "more than a count can hold")]
    public void FitRejectsBadCountLists(string content, string message)
    {
        using var d = new TempDir();
        File.WriteAllText(d["c.txt"], content);
        var (code, _, e) = Cli.Run("fit", d["c.txt"], "--reps", "0");
        Assert.Equal(1, code);
        Assert.Contains(message, e);
        Assert.Contains("c.txt", e);
    }

    [Fact]
    public void FitReadsSpectrumLinesAndWritesTables()
    {
        using var d = new TempDir();
        var rng = new Random(2);
        var lines = Enumerable.Range(1, 400).Select(v => $"{v},{Math.Max(1, (int)(20000 * Math.Pow(v, -2.1)))}");
        File.WriteAllLines(d["s.txt"], lines);
        var (code, o, e) = Cli.Run("fit", d["s.txt"], "--reps", "50", "--ci-reps", "30", "--json", "-o", d["fit.parquet"]);
        Assert.True(code == 0, e);
        using var j = JsonDocument.Parse(o);
        foreach (var k in new[] { "alpha", "alpha_se", "alpha_lo", "alpha_hi", "xmin", "xmin_lo", "xmin_hi", "n_tail",
            "n_types", "ks_distance", "gof_p", "gof_reps", "zipf_s", "zipf_s_se", "lsq_slope", "seed", "alternatives" })
            Assert.True(j.RootElement.TryGetProperty(k, out _), k);
        Assert.InRange(j.RootElement.GetProperty("alpha").GetDouble(), 1.8, 2.4);
        Assert.True(File.Exists(d["fit.parquet"]) && File.Exists(d["fit.alternatives.parquet"]));
    }

    [Fact]
    public void TokenizersListsEverySpec()
    {
        var (code, o, _) = Cli.Run("tokenizers");
        Assert.Equal(0, code);
        foreach (var s in new[] { "words", "words:keep-case", "whitespace", "chars", "cl100k_base", "o200k_base",
            "r50k_base", "bpe:", "sentencepiece:", "wordpiece:" })
            Assert.Contains(s, o);
    }
}
