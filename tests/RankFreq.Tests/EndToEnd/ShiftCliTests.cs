using System.Text.Json;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

public class ShiftCliTests
{
    [CorpusFact]
    public async Task TokshiftAgreesWithCountAndWritesItsTables()
    {
        string kjv = Corpora.File("kjv-bible.txt");
        using var d = new TempDir();
        var (code, o, e) = Cli.Run("tokshift", kjv, "--baseline", "words", "--candidate", "o200k_base", "--reps", "0",
            "--ci-reps", "10", "--alternatives", "none", "--json", "-o", d["out"]);
        Assert.True(code == 0, e);
        using var j = JsonDocument.Parse(o);
        var root = j.RootElement;
        var (c2, o2, e2) = Cli.Run("count", kjv, "-t", "o200k_base", "-o", d["t.parquet"], "--json");
        Assert.True(c2 == 0, e2);
        using var count = JsonDocument.Parse(o2);
        // the candidate's total is what 'count -t o200k_base' reports for the same text
        Assert.Equal(count.RootElement.GetProperty("tokens").GetInt64(), root.GetProperty("candidate").GetProperty("tokens").GetInt64());
        Assert.Equal(count.RootElement.GetProperty("types").GetInt64(), root.GetProperty("candidate").GetProperty("types").GetInt64());
        foreach (var side in new[] { "baseline", "candidate" })
            foreach (var k in new[] { "tokens", "types", "alpha", "alpha_lo", "alpha_hi", "utilisation" })
                Assert.True(root.GetProperty(side).TryGetProperty(k, out _), $"{side}.{k}");
        Assert.Equal(JsonValueKind.Null, root.GetProperty("baseline").GetProperty("utilisation").ValueKind);
        Assert.Equal(JsonValueKind.Number, root.GetProperty("candidate").GetProperty("utilisation").ValueKind);
        double fertility = root.GetProperty("fertility").GetDouble();
        Assert.Equal(root.GetProperty("candidate").GetProperty("tokens").GetInt64()
            / (double)root.GetProperty("baseline").GetProperty("tokens").GetInt64(), fertility, 12);
        Assert.True(root.TryGetProperty("alpha_diff", out _));

        foreach (var f in new[] { "shift.parquet", "shift-rank-frequency.svg", "shift-ccdf.svg" })
            Assert.True(File.Exists(Path.Combine(d["out"], f)), f);
        Assert.Contains("o200k_base", File.ReadAllText(Path.Combine(d["out"], "shift-ccdf.svg")));
        await using var r = await Parquet.ParquetReader.CreateAsync(Path.Combine(d["out"], "unseen.parquet"));
        long rows = 0;
        for (int g = 0; g < r.RowGroupCount; g++) { using var rg = r.OpenRowGroupReader(g); rows += rg.RowCount; }
        Assert.Equal(root.GetProperty("candidate_unseen").GetInt64(), rows);
        Assert.Equal(root.GetProperty("candidate").GetProperty("vocabulary_size").GetInt64()
            - root.GetProperty("candidate").GetProperty("vocabulary_seen").GetInt64(), rows);
    }

    [Fact]
    public void TokshiftNeedsBothTokenizersAndRejectsAnUnknownOne()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two three three three");
        Assert.Equal(2, Cli.Run("tokshift", d["a.txt"], "--baseline", "words").Code);
        Assert.Equal(2, Cli.Run("tokshift", d["a.txt"], "--baseline", "words", "--candidate", "chars", "--renyi-order", "-1").Code);
        var (code, _, e) = Cli.Run("tokshift", d["a.txt"], "--baseline", "words", "--candidate", "no_such_tokenizer");
        Assert.NotEqual(0, code);
        Assert.Contains("no_such_tokenizer", e);
    }
}
