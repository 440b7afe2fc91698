using System.Text;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Sources;
using RankFreq.Tokenization;
using Xunit;

namespace RankFreq.Tests.Counting;

public class RangeCutTests
{
    /// <summary>Lines of common English words ending in the whitespace runs that r50k's rule splits differently at the
    /// end of a text: "  \n", " \n", "\n\n", "\t\n", "\r\n", and plain "\n" (seeded, so the text is fixed).</summary>
    internal static string WhitespaceBeforeNewlines(int lines, ulong seed = 5, string[]? lineEnds = null)
    {
        string[] words = ["the", "of", "and", "to", "in", "that", "was", "he", "for", "it", "with", "as", "his", "on", "be",
            "at", "by", "had", "not", "are", "but", "from", "or", "have", "an", "they", "which", "one", "you", "were"];
        string[] ends = lineEnds ?? ["  \n", " \n", "\n\n", "\t\n", "\r\n", "\n", "\n", "\n"];
        var rng = new RankFreq.Fitting.Xoshiro(seed);
        var sb = new StringBuilder();
        for (int i = 0; i < lines; i++)
        {
            int n = 3 + (int)(rng.NextUInt64() % 7);
            for (int w = 0; w < n; w++) sb.Append(w > 0 ? " " : "").Append(words[rng.NextUInt64() % (ulong)words.Length]);
            sb.Append(ends[rng.NextUInt64() % (ulong)ends.Length]);
        }
        return sb.ToString();
    }

    [Theory]
    [InlineData("r50k_base")]
    [InlineData("cl100k_base")]
    [InlineData("o200k_base")]
    public void RangesCutInAPlainFileGiveTheWholeTextsIds(string encoding)
    {
        // a plain file cut into ranges counted on two threads must give the ids of the whole text encoded at once;
        // reference: the tiktoken tokenizer of Microsoft.ML.Tokenizers (NuGet) encoding the whole text
        using var d = new TempDir();
        // a third of the lines end in a blank line: r50k takes "\n\n" whole at the end of a range
        string text = WhitespaceBeforeNewlines(30_000, lineEnds: ["\n\n", "\n", "  \n"]);
        File.WriteAllText(d["ws.txt"], text);
        var whole = Microsoft.ML.Tokenizers.TiktokenTokenizer.CreateForEncoding(encoding).EncodeToIds(text);
        using var split = CountJob.Count([d["ws.txt"]], new CountSettings(encoding, Threads: 2, SplitAboveBytes: 64 << 10));
        var (ids, _) = Plan(d["ws.txt"], encoding);
        Assert.True(ids > 4, $"only {ids} ranges: the test needs cuts");
        var rows = (InMemoryRows)split.Rows;
        var expected = whole.GroupBy(i => i).ToDictionary(g => g.Key, g => (long)g.Count());
        Assert.Equal(whole.Count, split.Summary.Tokens);
        Assert.Equal(expected, rows.TokenIds!.Zip(rows.Counts).ToDictionary(p => p.First, p => p.Second));
    }

    [Theory]
    [InlineData("r50k_base", 7, 3_000)]
    [InlineData("r50k_base", 61, 3_000)]
    [InlineData("cl100k_base", 61, 3_000)]
    // over a million characters, every line ending in a blank line: the session encodes what it holds up to a cut of
    // its own, the last newline before a letter, which for r50k must not follow whitespace either (r50k splits
    // "\n\n" before a letter into two "\n" tokens, but takes "\n\n" whole at the end of a text)
    [InlineData("r50k_base", 64 << 10, 100_000)]
    [InlineData("o200k_base", 64 << 10, 100_000)]
    public void BlockEdgesInsideWhitespaceRunsChangeNoId(string encoding, int block, int lines)
    {
        // the same text fed to one session in blocks: ids in order equal the whole text's (reference as above)
        string text = WhitespaceBeforeNewlines(lines, seed: 11, lines > 10_000 ? ["\n\n"] : null);
        var whole = Microsoft.ML.Tokenizers.TiktokenTokenizer.CreateForEncoding(encoding).EncodeToIds(text);
        var fed = RankFreq.Tests.Tokenization.SubwordTokenizerTests.ViaSession(SubwordTokenizer.Tiktoken(encoding), text, block);
        Assert.Equal(whole.Count, fed.Count);
        Assert.True(whole.SequenceEqual(fed));
    }

    private static (int Units, RangeCut Cut) Plan(string path, string encoding)
    {
        var tok = TokenizerFactory.Create(encoding);
        var (files, _) = InputPlanner.Expand([path], new SourceOptions());
        return (InputPlanner.Plan(files, tok.RangeCut, 16, 64 << 10).Count, tok.RangeCut);
    }
}
