using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Sources;
using RankFreq.Tests.Comparison;
using RankFreq.Tokenization;
using Xunit;

namespace RankFreq.Tests.Counting;

public class PairedCountTests
{
    internal static Dictionary<string, long> Table(ICountRows rows) =>
        CountingTests.Rows(rows).ToDictionary(p => p.Token!, p => p.Count);

    internal static PairedCountResult Pair(string a, string b, string path, CountSettings s, GroupKey? key = null,
        CancellationToken ct = default)
    {
        var source = s.Source ?? new SourceOptions();
        if (key is not null) source = source with { Group = key };
        var (files, skipped) = InputPlanner.Expand([path], source);
        return CountEngine.CountPair(TokenizerFactory.Create(a), TokenizerFactory.Create(b), files, skipped,
            s with { Source = source }, key, ct: ct);
    }

    [Theory]
    [InlineData("words", "o200k_base", 1, 0L, 16L << 20)]
    [InlineData("words", "o200k_base", 2, 0L, 64L << 10)]           // ranges cut where both rules allow
    [InlineData("chars", "r50k_base", 2, 1L << 20, 64L << 10)]      // the strictest cut, and a budget that spills
    [InlineData("cl100k_base", "whitespace", 2, 1L << 20, 64L << 10)]
    public void EachSideEqualsCountingWithThatTokenizerAlone(string a, string b, int threads, long memory, long split)
    {
        // one pass feeding both tokenizers must give, for each, what 'count' gives with it alone (the counting
        // engine itself is checked against reference encoders in the tokenization tests)
        using var d = new TempDir();
        File.WriteAllText(d["t.txt"], RangeCutTests.WhitespaceBeforeNewlines(20_000) + "café ½ 日本語 👋🏽\n");
        var s = new CountSettings(Threads: threads, MemoryBytes: memory, SplitAboveBytes: split, TempDirectory: d.Path);
        using var pair = Pair(a, b, d["t.txt"], s);
        foreach (var (spec, side) in new[] { (a, pair.First), (b, pair.Second) })
        {
            using var alone = CountJob.Count([d["t.txt"]], new CountSettings(spec, Threads: 1));
            Assert.Equal(alone.Summary.Tokens, side.Summary.Tokens);
            Assert.Equal(Table(alone.Rows), Table(side.Rows));
            Assert.Equal(alone.Spectrum, side.Spectrum);
            Assert.Equal(alone.Growth.Types, side.Growth.Types);
            Assert.Equal(alone.Summary.TextBytes, side.Summary.TextBytes);
        }
        Assert.Equal(new FileInfo(d["t.txt"]).Length, pair.TextBytes);
        pair.Dispose();
        Assert.Empty(Directory.GetDirectories(d.Path, "rankfreq-spill-*"));
    }

    [Theory]
    [InlineData(1, 16L << 20)]
    [InlineData(2, 64L << 10)]
    public void GroupTotalsEqualEachGroupCountedAlone(int threads, long split)
    {
        using var d = new TempDir();
        var lines = ContrastDemo.Lines(4, ("harbour", 1901, 300, 1.0), ("night", 1925, 200, 1.2), ("pilot", 1948, 100, 0.9));
        var rng = new RankFreq.Fitting.Xoshiro(9);
        lines = lines.OrderBy(_ => rng.NextUInt64()).ToList();
        File.WriteAllLines(d["log.jsonl"], lines);
        var log = new SourceOptions(TextField: "log.text");
        var s = new CountSettings(Source: log, Threads: threads, SplitAboveBytes: split);
        using var pair = Pair("words", "cl100k_base", d["log.jsonl"], s, GroupKey.Parse("field:crew"));
        Assert.Equal(["harbour", "night", "pilot"], pair.Groups.Select(g => g.Group).ToArray());
        using var words = ContrastJob.CountGroups([d["log.jsonl"]], s with { Tokenizer = "words" }, GroupKey.Parse("field:crew"));
        using var cl = ContrastJob.CountGroups([d["log.jsonl"]], s with { Tokenizer = "cl100k_base" }, GroupKey.Parse("field:crew"));
        for (int i = 0; i < 3; i++)
        {
            Assert.Equal(words.Groups[i].Tokens, pair.Groups[i].FirstTokens);
            Assert.Equal(cl.Groups[i].Tokens, pair.Groups[i].SecondTokens);
            Assert.Equal(words.Groups[i].Documents, pair.Groups[i].Documents);
        }
        // the bytes of a group are its records' text fields, without the JSON around them
        long harbour = lines.Where(l => l.Contains("\"harbour\"")).Sum(l =>
            (long)System.Text.Encoding.UTF8.GetByteCount(System.Text.Json.JsonDocument.Parse(l).RootElement
                .GetProperty("log").GetProperty("text").GetString()!));
        Assert.Equal(harbour, pair.Groups[0].TextBytes);
        Assert.Equal(pair.TextBytes, pair.Groups.Sum(g => g.TextBytes));
        Assert.Equal(pair.First.Summary.Tokens, pair.Groups.Sum(g => g.FirstTokens));
    }

    [Fact]
    public void CommonCutIsTheStricterRule()
    {
        Assert.Equal(RangeCut.None, CountEngine.CommonCut(RangeCut.AnyNewline, RangeCut.None));
        Assert.Equal(RangeCut.NewlineBeforeAsciiLetter, CountEngine.CommonCut(RangeCut.AnyNewline, RangeCut.NewlineBeforeAsciiLetter));
        Assert.Equal(RangeCut.NewlineAfterVisibleBeforeAsciiLetter,
            CountEngine.CommonCut(RangeCut.NewlineAfterVisibleBeforeAsciiLetter, RangeCut.NewlineBeforeAsciiLetter));
        Assert.Equal(RangeCut.AnyNewline, CountEngine.CommonCut(RangeCut.AnyNewline, RangeCut.AnyNewline));
    }

    [Fact]
    public void GroupsServedWorseAreThoseNeedingMoreTokensThanTheWhole()
    {
        // whole text: 1.2 tokens per word; a group at 1.5 is 25% above (worse), one at 1.0 17% below (better), one at
        // 1.23 within 5% (similar), one with 10 words too small to judge
        var g = ShiftGroups.From(
            [new("a", 1, 100, 2000, 3000), new("b", 1, 100, 2000, 2000), new("c", 1, 100, 2000, 2460), new("d", 1, 10, 10, 30)],
            ["a", "b", "c", "d"], 1.2);
        Assert.Equal([GroupService.Worse, GroupService.Better, GroupService.Similar, GroupService.TooSmall],
            g.Select(x => x.Service).ToArray());
        Assert.Equal(0.25, g[0].RelativeFertility, 12);
        Assert.Equal(100 / 3000.0, g[0].CandidateBytesPerToken, 12);
        Assert.Equal(100 / 2000.0, g[0].BaselineBytesPerToken, 12);
    }
}
