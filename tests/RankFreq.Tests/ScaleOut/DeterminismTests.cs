using System.Text.Json;
using System.Text.Json.Nodes;
using Xunit;
using static RankFreq.Tests.ScaleOut.DuckDbRecipeTests;

namespace RankFreq.Tests.ScaleOut;

/// <summary>
/// Same input, same settings, same seed: the same result, whatever the thread count, the memory budget (spilling or
/// not) or the run. Count tables are compared byte for byte (with --reproducible, which leaves the creation time
/// out of the footer); the statistical verbs by their JSON output, leaving out only wall times (seconds*) and the thread count
/// the summary reports. Common practice for parallel Monte Carlo: one random stream per replicate, never per thread.
/// </summary>
public class DeterminismTests
{
    [CorpusFact]
    public void CountTablesAreByteIdenticalAcrossThreadsBudgetsAndRuns()
    {
        using var d = new TempDir();
        // a text of over 16 MB is cut into ranges counted in parallel; the folder mixes many small files
        using (var big = File.Create(d["kjv5.txt"]))
            for (int i = 0; i < 5; i++) using (var k = File.OpenRead(Corpora.File("kjv-bible.txt"))) k.CopyTo(big);
        string[] inputs = [d["kjv5.txt"], Corpora.File("sotu.jsonl"), Path.Combine(Path.GetDirectoryName(Corpora.File("kjv-bible.txt"))!, "udhr")];
        var runs = new (string Name, string[] Args)[]
        {
            ("t1", ["--threads", "1"]),
            ("t2", ["--threads", "2"]),
            ("t3", ["--threads", "3"]),
            ("t2-again", ["--threads", "2"]),
            ("t2-spill", ["--threads", "2", "--memory", "1M"]),
            ("t3-spill", ["--threads", "3", "--memory", "4M"]),
        };
        foreach (var (name, args) in runs)
            Ok(Cli.Run(["count", .. inputs, "-o", d[name + ".parquet"], "--reproducible", "-q", .. args]));
        var reference = File.ReadAllBytes(d["t1.parquet"]);
        foreach (var (name, _) in runs.Skip(1)) Assert.True(reference.AsSpan().SequenceEqual(File.ReadAllBytes(d[name + ".parquet"])), name);

        // without --reproducible only the creation time tells two runs apart; with it the key is absent
        Ok(Cli.Run(["count", .. inputs, "-o", d["stamped.parquet"], "-q", "--threads", "2"]));
        var stamped = Footer(d["stamped.parquet"]);
        var plain = Footer(d["t1.parquet"]);
        Assert.True(stamped.Remove("rankfreq.created_utc"));
        Assert.False(plain.ContainsKey("rankfreq.created_utc"));
        Assert.Equal(plain, stamped);

        // merge: the same bytes whether it spills or not; shards + merge holds the same rows as one run
        var shards = Enumerable.Range(1, 3).Select(k =>
        {
            Ok(Cli.Run(["count", .. inputs, "--shard", $"{k}/3", "-o", d[$"s{k}.parquet"], "-q", "--reproducible"]));
            return d[$"s{k}.parquet"];
        }).ToArray();
        Ok(Cli.Run(["merge", .. shards, "-o", d["m1.parquet"], "-q", "--reproducible"]));
        Ok(Cli.Run(["merge", .. shards, "-o", d["m2.parquet"], "-q", "--reproducible", "--memory", "1M"]));
        Assert.True(File.ReadAllBytes(d["m1.parquet"]).AsSpan().SequenceEqual(File.ReadAllBytes(d["m2.parquet"])));
        using var con = Open();
        string a = $"SELECT token, count, rank FROM read_parquet({Q(d["m1.parquet"])})",
            b = $"SELECT token, count, rank FROM read_parquet({Q(d["t1.parquet"])})";
        using var cmd = con.CreateCommand();
        cmd.CommandText = $"SELECT (SELECT COUNT(*) FROM ({a} EXCEPT {b})) + (SELECT COUNT(*) FROM ({b} EXCEPT {a})), (SELECT COUNT(*) FROM ({a}))";
        using var r = cmd.ExecuteReader();
        Assert.True(r.Read());
        Assert.Equal(0L, r.GetInt64(0));
        Assert.True(r.GetInt64(1) > 10_000);
    }

    [Fact]
    public void FitIsIdenticalForASeedWhateverTheThreadCount()
    {
        using var d = new TempDir();
        // a Zipf-like list of counts (⌊40000 / r^1.1⌋) with bootstraps for p and for the intervals
        File.WriteAllLines(d["c.txt"], Enumerable.Range(1, 20_000).Select(r => ((long)(40_000 / Math.Pow(r, 1.1)) + 1).ToString()));
        string[] common = ["fit", d["c.txt"], "--reps", "120", "--ci-reps", "60", "--seed", "23", "--json"];
        string one = Canonical(Ok(Cli.Run([.. common, "--threads", "1"])));
        Assert.Contains("gof_p", one);
        foreach (var t in new[] { "2", "3", "5" }) Assert.Equal(one, Canonical(Ok(Cli.Run([.. common, "--threads", t]))));
        // another seed gives another p or interval: the comparison above can fail
        Assert.NotEqual(one, Canonical(Ok(Cli.Run([.. common[..^2], "24", "--json", "--threads", "1"]))));
    }

    [CorpusFact]
    public void ProfileIsIdenticalForASeedWhateverTheThreadCount()
    {
        using var d = new TempDir();
        string[] Args(string t) => ["profile", Corpora.File("kjv-bible.txt"), "-o", d["p" + t], "--reps", "60", "--ci-reps", "40",
            "--seed", "5", "--json", "--threads", t];
        string one = Canonical(Ok(Cli.Run(Args("1"))));
        Assert.Equal(one, Canonical(Ok(Cli.Run(Args("2")))));
        Assert.Equal(one, Canonical(Ok(Cli.Run(Args("3")))));
        // the result tables too, byte for byte (the count table aside: its footer records when it was made)
        var tables = Directory.GetFiles(d["p1"], "*.parquet").Select(Path.GetFileName).Where(n => n != "counts.parquet").ToList();
        Assert.NotEmpty(tables);
        foreach (var t in tables)
            Assert.True(File.ReadAllBytes(Path.Combine(d["p1"], t!)).AsSpan().SequenceEqual(File.ReadAllBytes(Path.Combine(d["p3"], t!))), t);
    }

    [CorpusFact]
    public void ContrastIsIdenticalForASeedWhateverTheThreadCount()
    {
        string[] Args(string t) => ["contrast", Corpora.File("sotu.jsonl"), "--by", "field:year/100", "--reps", "40", "--boot-reps", "40",
            "--thin-reps", "8", "--seed", "9", "--json", "--threads", t];
        string one = Canonical(Ok(Cli.Run(Args("1"))));
        Assert.Contains("p_holm", one);
        Assert.Equal(one, Canonical(Ok(Cli.Run(Args("2")))));
        Assert.Equal(one, Canonical(Ok(Cli.Run(Args("4")))));
    }

    [CorpusFact]
    public void TokshiftIsIdenticalForASeedWhateverTheThreadCount()
    {
        string[] Args(string t) => ["tokshift", Corpora.File("kjv-bible.txt"), "--baseline", "words", "--candidate", "cl100k_base",
            "--reps", "40", "--seed", "3", "--json", "--threads", t];
        string one = Canonical(Ok(Cli.Run(Args("1"))));
        Assert.Contains("fertility", one);
        Assert.Equal(one, Canonical(Ok(Cli.Run(Args("2")))));
        Assert.Equal(one, Canonical(Ok(Cli.Run(Args("3")))));
    }

    /// <summary>The JSON without the fields that measure the run rather than the data: wall time and thread count.</summary>
    private static string Canonical(string json)
    {
        var node = JsonNode.Parse(json)!;
        Strip(node);
        return node.ToJsonString(new JsonSerializerOptions { WriteIndented = true });
    }

    private static void Strip(JsonNode? node)
    {
        if (node is JsonObject o)
        {
            foreach (var k in o.Select(p => p.Key).Where(k => k.StartsWith("seconds", StringComparison.Ordinal) || k == "threads").ToList()) o.Remove(k);
            foreach (var p in o) Strip(p.Value);
        }
        else if (node is JsonArray a)
            foreach (var e in a) Strip(e);
    }

    private static Dictionary<string, string> Footer(string path)
    {
        using var f = new ParquetSharp.ParquetFileReader(path);
        return new Dictionary<string, string>(f.FileMetaData.KeyValueMetadata);
    }
}
