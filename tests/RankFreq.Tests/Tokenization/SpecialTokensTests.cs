using System.Text;
using System.Text.Json;
using RankFreq.Counting;
using RankFreq.Jobs;
using Xunit;

namespace RankFreq.Tests.Tokenization;

public class SpecialTokensTests
{
    /// <summary>The contents of a file's special added tokens, in file order.</summary>
    private static List<(int Id, string Content)> Specials(string tokenizer)
    {
        using var j = JsonDocument.Parse(File.ReadAllBytes(tokenizer));
        return j.RootElement.GetProperty("added_tokens").EnumerateArray()
            .Where(a => a.GetProperty("special").GetBoolean())
            .Select(a => (a.GetProperty("id").GetInt32(), a.GetProperty("content").GetString()!)).ToList();
    }

    private static SortedDictionary<int, long> Ids(CountResult r)
    {
        var rows = (InMemoryRows)r.Rows;
        return new SortedDictionary<int, long>(rows.TokenIds!.Zip(rows.Counts).ToDictionary(p => p.First, p => p.Second));
    }

    public static TheoryData<string> Files => new() { "qwen3", "llama3", "gemma3", "llama2" };

    [TokenizerJsonTheory]
    [MemberData(nameof(Files))]
    public void SpecialTokenTextCountsAsTheSpecialTokenWithSpecials(string name)
    {
        // reference: the Rust tokenizers library (npm @anush008/tokenizers 0.6.0) encoding each record without added
        // special tokens; with special-token parsing (count-specials) special-token text encodes as the special id,
        // without it (count) as ordinary text. Records hold the file's first special tokens at a start, inside a
        // word, beside spaces and newlines, twice in a row and cut short.
        string tok = TokenizerFiles.Path_(name);
        var specials = Specials(tok).Take(4).ToList();
        Assert.NotEmpty(specials);
        using var d = new TempDir();
        var records = new List<string>();
        foreach (var (_, s) in specials)
            records.AddRange([$"{s}In the beginning", $"God{s}created the heaven", $"and the earth. {s}\n{s}{s}", $"void {s[..^1]} form"]);
        records.Add("no special token here at all");
        using (var w = new StreamWriter(d["s.jsonl"], false, new UTF8Encoding(false)))
            foreach (var r in records) w.WriteLine(JsonSerializer.Serialize(new Dictionary<string, string> { ["text"] = r }));

        var withRef = TokenizerFiles.ReferenceCountsOf("count-specials", tok, "jsonl", d["s.jsonl"]);
        var asTextRef = TokenizerFiles.ReferenceCounts(tok, "jsonl", d["s.jsonl"]);
        using var with = CountJob.Count([d["s.jsonl"]], new CountSettings("hf-specials:" + tok, Threads: 2));
        using var asText = CountJob.Count([d["s.jsonl"]], new CountSettings("hf:" + tok, Threads: 2));
        Assert.Equal(withRef.Counts, Ids(with));
        Assert.Equal(withRef.Total, with.Summary.Tokens);
        Assert.Equal(asTextRef.Counts, Ids(asText));
        // the check can fail: each special token is written five times in full, and counts so only with --specials
        foreach (var (id, _) in specials)
        {
            Assert.Equal(5, Ids(with).GetValueOrDefault(id));
            Assert.Equal(0, Ids(asText).GetValueOrDefault(id));
        }
        Assert.StartsWith("hf-specials:", with.Summary.TokenizerSpec);
    }

    [TokenizerJsonFact]
    public void SpecialsOptionTurnsOnParsingForTokenizerJsonSpecsOnly()
    {
        string tok = TokenizerFiles.Path_("qwen3");
        var special = Specials(tok)[0];
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], $"one{special.Content}two three");
        var (code, o, e) = Cli.Run("count", d["a.txt"], "-t", tok, "--specials", "-o", d["a.parquet"], "--json");
        Assert.True(code == 0, e);
        using var j = JsonDocument.Parse(o);
        Assert.Equal("hf-specials:" + tok, j.RootElement.GetProperty("tokenizer").GetString());
        // tokshift applies it to both sides; a spec that is no tokenizer.json is left as it is
        var (c2, o2, e2) = Cli.Run("tokshift", d["a.txt"], "--baseline", "words", "--candidate", tok, "--specials", "--reps", "0",
            "--ci-reps", "2", "--alternatives", "none", "--json");
        Assert.True(c2 == 0, e2);
        using var s = JsonDocument.Parse(o2);
        Assert.Equal("words", s.RootElement.GetProperty("baseline").GetProperty("tokenizer").GetString());
        Assert.Equal("hf-specials:" + tok, s.RootElement.GetProperty("candidate").GetProperty("tokenizer").GetString());
    }
}
