using System.IO.Compression;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Sources;
using RankFreq.Tests.Comparison;
using Xunit;

namespace RankFreq.Tests.Counting;

/// <summary>
/// A paired count with fewer work units than threads (a compressed file is one unit) runs the second tokenizer on a
/// thread of its own, fed through a pipe; each side must still equal counting with that tokenizer alone.
/// </summary>
public class PipedPairTests
{
    private static void Gzip(string text, string path)
    {
        using var f = File.Create(path);
        using var z = new GZipStream(f, CompressionLevel.Fastest);
        z.Write(System.Text.Encoding.UTF8.GetBytes(text));
    }

    [Theory]
    [InlineData("words", "o200k_base", 0L)]
    [InlineData("cl100k_base", "words", 1L << 20)]   // a budget that makes the piped side spill
    [InlineData("chars", "r50k_base", 0L)]
    public void OneCompressedFileOnTwoThreadsEqualsEachTokenizerAlone(string a, string b, long memory)
    {
        using var d = new TempDir();
        // about 1.5 MB: several of the pipe's 256 KiB chunks, and blocks ending inside whitespace runs
        Gzip(RangeCutTests.WhitespaceBeforeNewlines(60_000) + "café ½ 日本語 👋🏽\n", d["t.txt.gz"]);
        var s = new CountSettings(Threads: 2, MemoryBytes: memory, TempDirectory: d.Path);
        using (var pair = PairedCountTests.Pair(a, b, d["t.txt.gz"], s))
        {
            foreach (var (spec, side) in new[] { (a, pair.First), (b, pair.Second) })
            {
                using var alone = CountJob.Count([d["t.txt.gz"]], new CountSettings(spec, Threads: 1));
                Assert.Equal(alone.Summary.Tokens, side.Summary.Tokens);
                Assert.Equal(PairedCountTests.Table(alone.Rows), PairedCountTests.Table(side.Rows));
                Assert.Equal(alone.Spectrum, side.Spectrum);
                Assert.Equal(alone.Growth.Types, side.Growth.Types);
            }
        }
        Assert.Empty(Directory.GetDirectories(d.Path, "rankfreq-spill-*"));
    }

    [Fact]
    public void GroupTotalsThroughThePipeEqualEachGroupCountedAlone()
    {
        // 6,000 records switching group at random: the group steps travel in the pipe between the records' text
        using var d = new TempDir();
        var lines = ContrastDemo.Lines(4, ("harbour", 1901, 3000, 1.0), ("night", 1925, 2000, 1.2), ("pilot", 1948, 1000, 0.9));
        var rng = new RankFreq.Fitting.Xoshiro(9);
        lines = lines.OrderBy(_ => rng.NextUInt64()).ToList();
        Gzip(string.Join('\n', lines) + "\n", d["log.jsonl.gz"]);
        var s = new CountSettings(Source: new SourceOptions(TextField: "log.text"), Threads: 2);
        var key = GroupKey.Parse("field:crew");
        using var pair = PairedCountTests.Pair("words", "cl100k_base", d["log.jsonl.gz"], s, key);
        using var words = ContrastJob.CountGroups([d["log.jsonl.gz"]], s with { Tokenizer = "words", Threads = 1 }, key);
        using var cl = ContrastJob.CountGroups([d["log.jsonl.gz"]], s with { Tokenizer = "cl100k_base", Threads = 1 }, key);
        Assert.Equal(["harbour", "night", "pilot"], pair.Groups.Select(g => g.Group).ToArray());
        for (int i = 0; i < 3; i++)
        {
            Assert.Equal(words.Groups[i].Tokens, pair.Groups[i].FirstTokens);
            Assert.Equal(cl.Groups[i].Tokens, pair.Groups[i].SecondTokens);
            Assert.Equal(words.Groups[i].Documents, pair.Groups[i].Documents);
        }
        Assert.Equal(pair.Second.Summary.Tokens, pair.Groups.Sum(g => g.SecondTokens));
    }

    [Fact]
    public void CancellingStopsBothThreadsAndLeavesNoSpill()
    {
        using var d = new TempDir();
        Gzip(RangeCutTests.WhitespaceBeforeNewlines(60_000), d["t.txt.gz"]);
        using var cts = new CancellationTokenSource();
        cts.Cancel();
        var s = new CountSettings(Threads: 2, MemoryBytes: 1L << 20, TempDirectory: d.Path);
        Assert.ThrowsAny<OperationCanceledException>(() => PairedCountTests.Pair("words", "o200k_base", d["t.txt.gz"], s, ct: cts.Token));
        Assert.Empty(Directory.GetDirectories(d.Path, "rankfreq-spill-*"));
    }
}
