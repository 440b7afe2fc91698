using System.Text;
using System.Text.Json;
using System.Text.Json.Nodes;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Sources;
using RankFreq.Tests.Tokenization;
using RankFreq.Tokenization;
using Xunit;

namespace RankFreq.Tests.Counting;

/// <summary>
/// The range-cut question of <see cref="RangeCutTests"/> for byte-level BPE tokenizer.json files: r50k_base's rule ends
/// a whitespace run before a letter one character early but takes it whole at the end of a text, so a range ending in
/// "  \n" gave other tokens than the whole text. The Llama 3 and Qwen3 files split with the cl100k form
/// (<c>\s*[\r\n]+</c> before <c>\s+(?!\S)</c>); a GPT-2-style file (ByteLevel with its own regex, r50k's rule) is made
/// here from the Llama 3 file by replacing its pre-tokenizer. Reference: the Rust tokenizers library (npm
/// @anush008/tokenizers 0.6.0, tests/js/tokenizer-reference.js) encoding the whole text as one document.
/// </summary>
public class RangeCutTokenizerJsonTests
{
    // spaces and tabs before newlines, blank lines, lines of only spaces, CR LF; every line starts with a letter, so
    // each line end is a place the planner may cut
    private static readonly string[] Ends = ["  \n", " \n", "\t\n", " \t \n", "\t\t\n", "\n \n", "\n\n", "   \n\n", "\r\n",
        " \r\n", "\n", "\n"];

    /// <summary>The tokenizer file of <paramref name="name"/>; "gpt2-style" is written into <paramref name="d"/>.</summary>
    private static string TokenizerFile(string name, TempDir d)
    {
        if (name != "gpt2-style") return TokenizerFiles.Path_(name);
        var j = JsonNode.Parse(File.ReadAllText(TokenizerFiles.Path_("llama3")))!;
        // the pre-tokenizer GPT-2's tokenizer.json ships: ByteLevel with its built-in regex (common practice)
        j["pre_tokenizer"] = new JsonObject
        {
            ["type"] = "ByteLevel",
            ["add_prefix_space"] = false,
            ["trim_offsets"] = true,
            ["use_regex"] = true,
        };
        string path = d["gpt2-style.json"];
        File.WriteAllText(path, j.ToJsonString());
        return path;
    }

    [TokenizerJsonTheory]
    [InlineData("llama3", true)]
    [InlineData("qwen3", true)]
    [InlineData("gpt2-style", false)]
    public void RangesCutAfterWhitespaceRunsGiveTheWholeTextsCounts(string name, bool cuts)
    {
        using var d = new TempDir();
        string tok = TokenizerFile(name, d);
        string text = RangeCutTests.WhitespaceBeforeNewlines(30_000, seed: 7, lineEnds: Ends);
        File.WriteAllText(d["ws.txt"], text);
        var tokenizer = TokenizerFactory.Create("hf:" + tok);
        var (files, _) = InputPlanner.Expand([d["ws.txt"]], new SourceOptions());
        int units = InputPlanner.Plan(files, tokenizer.RangeCut, 16, 16 << 10).Count;
        // the cl100k form may be cut after a newline before a letter; r50k's rule must not be cut at all
        if (cuts) Assert.True(units > 8, $"only {units} ranges: the test needs cuts");
        else Assert.Equal(1, units);

        var (total, counts) = TokenizerFiles.ReferenceCounts(tok, "text", d["ws.txt"]);
        using var ours = CountJob.Count([d["ws.txt"]], new CountSettings("hf:" + tok, Threads: 2, SplitAboveBytes: 16 << 10));
        var rows = (InMemoryRows)ours.Rows;
        var mine = new SortedDictionary<int, long>();
        for (int i = 0; i < rows.Counts.Length; i++) mine[rows.TokenIds![i]] = rows.Counts[i];
        Assert.Equal(total, ours.Summary.Tokens);
        Assert.Equal(counts, mine);
    }

    [TokenizerJsonTheory]
    [InlineData("llama3", 7, 3_000)]
    [InlineData("qwen3", 61, 3_000)]
    [InlineData("gpt2-style", 61, 3_000)]
    // over a million characters in one document: the session encodes what it holds up to a cut of its own (the last
    // newline before a letter) where the rule allows one
    [InlineData("llama3", 64 << 10, 60_000)]
    [InlineData("qwen3", 64 << 10, 60_000)]
    [InlineData("gpt2-style", 64 << 10, 60_000)]
    public void BlockEdgesInsideWhitespaceRunsChangeNoId(string name, int block, int lines)
    {
        using var d = new TempDir();
        string tok = TokenizerFile(name, d);
        string text = RangeCutTests.WhitespaceBeforeNewlines(lines, seed: 13, lineEnds: Ends);
        Assert.True(lines < 10_000 || text.Length > 1 << 20, "the long case must pass the session's own cut size");
        File.WriteAllText(d["one.jsonl"], JsonSerializer.Serialize(new Dictionary<string, string> { ["text"] = text }) + "\n");
        var whole = TokenizerFiles.Node("ids", tok, d["one.jsonl"]).Trim().Split(' ').Select(int.Parse).ToList();

        var sink = new ListSink();
        var session = TokenizerFactory.Create("hf:" + tok).CreateSession(sink);
        var bytes = Encoding.UTF8.GetBytes(text); // ASCII only, so any block edge is a character edge
        for (int pos = 0; pos < bytes.Length; pos += block)
            session.Feed(bytes.AsSpan(pos, Math.Min(block, bytes.Length - pos)), false);
        session.Feed([], true);
        Assert.Equal(whole.Count, sink.Ids.Count);
        Assert.True(whole.SequenceEqual(sink.Ids), "ids differ from the whole text's");
    }
}
