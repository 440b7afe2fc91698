using System.Text.Json;
using Parquet;
using RankFreq.Tests.Comparison;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

public class ContrastCliTests
{
    private static readonly string[] Quick = ["--reps", "0", "--boot-reps", "40", "--thin-reps", "8", "--threads", "2"];

    private static JsonElement Json(string o) => JsonDocument.Parse(o).RootElement;

    [CorpusFact]
    public void SotuByHalfCentury()
    {
        var sotu = Corpora.File("sotu.jsonl");
        var (code, o, e) = Cli.Run(["contrast", sotu, "--by", "field:year/50", "--json", .. Quick]);
        Assert.True(code == 0, e);
        var j = Json(o);
        var groups = j.GetProperty("groups").EnumerateArray().ToList();
        // 1790–2021 in bins of 50 years: 1750–1799 … 2000–2049, in time order
        Assert.Equal(["1750–1799", "1800–1849", "1850–1899", "1900–1949", "1950–1999", "2000–2049"],
            groups.Select(g => g.GetProperty("group").GetString()!).ToArray());
        Assert.Equal(j.GetProperty("tokens").GetInt64(), groups.Sum(g => g.GetProperty("tokens").GetInt64()));
        long smallest = groups.Min(g => g.GetProperty("tokens").GetInt64());
        Assert.Equal(smallest, j.GetProperty("target_tokens").GetInt64());
        foreach (var g in groups)
        {
            foreach (var k in new[] { "types", "alpha", "alpha_lo", "alpha_hi", "xmin", "n_tail", "gof_p", "zipf_s", "heaps_beta", "hapax_share",
                "good_turing_unseen", "entropy_bits", "renyi_efficiency" })
                Assert.True(g.TryGetProperty(k, out _), k);
            double a = g.GetProperty("alpha").GetDouble();
            Assert.InRange(a, 1.5, 3.0);
            Assert.True(g.GetProperty("alpha_lo").GetDouble() <= a && a <= g.GetProperty("alpha_hi").GetDouble());
            var m = g.GetProperty("matched");
            Assert.Equal(smallest, m.GetProperty("target_tokens").GetInt64());
            // thinned to the common size: the mean token count is within 2% of it
            Assert.InRange(m.GetProperty("tokens").GetDouble(), 0.98 * smallest, 1.02 * smallest);
            // at equal size the type counts are comparable: fewer types than the group has on its own
            Assert.True(m.GetProperty("types").GetDouble() <= g.GetProperty("types").GetInt64());
        }
        var pairs = j.GetProperty("pairs").EnumerateArray().ToList();
        Assert.Equal(15, pairs.Count);
        foreach (var p in pairs)
        {
            foreach (var k in new[] { "a", "b", "alpha_diff", "diff_lo", "diff_hi", "p", "p_holm", "significant" }) Assert.True(p.TryGetProperty(k, out _), k);
            Assert.True(p.GetProperty("p_holm").GetDouble() >= p.GetProperty("p").GetDouble());
            Assert.Equal("matched", p.GetProperty("basis").GetString());
        }
        Assert.NotEmpty(j.GetProperty("findings").EnumerateArray());
    }

    [CorpusFact]
    public async Task SotuByPartyWritesTheFolder()
    {
        var sotu = Corpora.File("sotu.jsonl");
        using var d = new TempDir();
        string dir = d["out"];
        var (code, o, e) = Cli.Run(["contrast", sotu, "--by", "field:party", "-o", dir, .. Quick]);
        Assert.True(code == 0, e);
        Assert.Contains("Democratic", o);
        Assert.Contains("findings", o);
        foreach (var f in new[] { "groups.parquet", "pairs.parquet", "counts.parquet", "summary.json", "report.html", "exponents.svg",
            "rank-frequency-groups.svg", "ccdf-groups.svg" })
            Assert.True(File.Exists(Path.Combine(dir, f)), f);
        Assert.Empty(Directory.GetDirectories(d.Path, ".*.rankfreq-tmp.*"));
        var j = Json(File.ReadAllText(Path.Combine(dir, "summary.json")));
        int n = j.GetProperty("groups").GetArrayLength();
        Assert.Equal(n * (n - 1) / 2, j.GetProperty("pairs").GetArrayLength());
        // the grouped count table: one row per (group, type), its counts add up to the tokens
        await using var r = await ParquetReader.CreateAsync(Path.Combine(dir, "counts.parquet"));
        var fields = r.Schema.GetDataFields();
        Assert.Equal("group", fields[0].Name);
        long total = 0;
        for (int g = 0; g < r.RowGroupCount; g++)
        {
            using var rg = r.OpenRowGroupReader(g);
            var counts = new long[rg.RowCount];
            await rg.ReadAsync<long>(fields.First(f => f.Name == "count"), counts.AsMemory());
            total += counts.Sum();
        }
        Assert.Equal(j.GetProperty("tokens").GetInt64(), total);
        string html = File.ReadAllText(Path.Combine(dir, "report.html"));
        Assert.Contains("Reading these results", html);
        Assert.Contains("matched size", html);
    }

    private static string Demo(TempDir d, params string[] extra)
    {
        var lines = ContrastDemo.Lines(7, ("harbour", 1901, 300, 1.0), ("night", 1930, 300, 1.1));
        File.WriteAllLines(d["log.jsonl"], lines.Concat(extra));
        return d["log.jsonl"];
    }

    [Fact]
    public void MissingKeysFormAGroupAndTooSmallGroupsAreListed()
    {
        using var d = new TempDir();
        var path = Demo(d, "{\"year\": 1950, \"log\": {\"text\": \"kalo mir ven\"}}");
        var (code, o, e) = Cli.Run(["contrast", path, "--by", "field:crew", "--text-field", "log.text", "--json", .. Quick]);
        Assert.True(code == 0, e);
        var groups = Json(o).GetProperty("groups").EnumerateArray().ToList();
        var missing = groups.Single(g => g.GetProperty("group").GetString() == "(missing)");
        Assert.Equal(3, missing.GetProperty("tokens").GetInt64());
        Assert.Equal("fit_failed", missing.GetProperty("status").GetString());
        Assert.Contains(Json(o).GetProperty("cautions").EnumerateArray(), c => c.GetString()!.Contains("\"(missing)\""));
        Assert.Single(Json(o).GetProperty("pairs").EnumerateArray());
    }

    [Fact]
    public void BadKeysAndBadValues()
    {
        using var d = new TempDir();
        var path = Demo(d);
        // unknown key kind, or none: usage, exit 2
        Assert.Equal(2, Cli.Run("contrast", path, "--by", "colour").Code);
        Assert.Equal(2, Cli.Run("contrast", path, "--by", "field:").Code);
        Assert.Equal(2, Cli.Run("contrast", path).Code);
        Assert.Equal(2, Cli.Run("contrast", path, "--by", "file", "--groups", d["g.csv"]).Code);
        // a groups file that is missing, or has a line of one column: exit 1 naming it
        var noGroups = Cli.Run("contrast", path, "--groups", d["g.csv"]);
        Assert.Equal(1, noGroups.Code);
        Assert.Contains("g.csv", noGroups.Err);
        File.WriteAllText(d["g.csv"], $"{path},all\nlonely-line\n");
        var oneColumn = Cli.Run("contrast", path, "--groups", d["g.csv"]);
        Assert.Equal(1, oneColumn.Code);
        Assert.Contains("g.csv:2:", oneColumn.Err);
        // a field no record has: one line naming the file, exit 1, no output folder
        var unknown = Cli.Run(["contrast", path, "--by", "field:shift", "--text-field", "log.text", "-o", d["out"], .. Quick]);
        Assert.Equal(1, unknown.Code);
        Assert.Single(unknown.Err.Trim().Split('\n'));
        Assert.Contains("log.jsonl", unknown.Err);
        Assert.Contains("'shift'", unknown.Err);
        Assert.Contains("crew", unknown.Err);
        Assert.False(Directory.Exists(d["out"]));
        // a text field missing everywhere: no tokens, exit 1
        Assert.Equal(1, Cli.Run(["contrast", path, "--by", "field:crew", .. Quick]).Code);
        // a value that cannot be binned: the file and line in one line, exit 1; counted with --skip-bad
        var badPath = Demo(d, "{\"crew\": \"pilot\", \"year\": \"unknown\", \"log\": {\"text\": \"ka lo\"}}");
        var bad = Cli.Run(["contrast", badPath, "--by", "field:year/10", "--text-field", "log.text", .. Quick]);
        Assert.Equal(1, bad.Code);
        Assert.Single(bad.Err.Trim().Split('\n'));
        Assert.Contains("log.jsonl:601:", bad.Err);
        var skipped = Cli.Run(["contrast", badPath, "--by", "field:year/10", "--text-field", "log.text", "--skip-bad", "--json", .. Quick]);
        Assert.True(skipped.Code == 0, skipped.Err);
        Assert.Equal(1, Json(skipped.Out).GetProperty("bad_group_values").GetInt64());
        Assert.Contains("could not be binned", skipped.Err);
        // a field key on plain text input
        File.WriteAllText(d["plain.txt"], "ka lo mir");
        var plain = Cli.Run(["contrast", d["plain.txt"], "--by", "field:year", .. Quick]);
        Assert.Equal(1, plain.Code);
        Assert.Contains("needs JSON Lines", plain.Err);
    }
}
