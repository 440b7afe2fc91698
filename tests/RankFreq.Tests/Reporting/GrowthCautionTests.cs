using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Lexical;
using RankFreq.Reporting;
using Xunit;

namespace RankFreq.Tests.Reporting;

/// <summary>Heaps' β above 1 is flagged as an effect of text order, not read as a growth law.</summary>
public class GrowthCautionTests
{
    /// <summary>Two halves with disjoint vocabularies (the second one larger), in that order and shuffled.</summary>
    private static List<string> Halves()
    {
        var rng = new RankFreq.Fitting.Xoshiro(5);
        var lines = new List<string>();
        // first half: 2,000 lines over 40 words; second half: 2,000 lines over 20,000 words never seen before
        for (int i = 0; i < 2000; i++)
            lines.Add(string.Join(' ', Enumerable.Range(0, 12).Select(_ => $"alpha{rng.NextUInt64() % 40}")));
        for (int i = 0; i < 2000; i++)
            lines.Add(string.Join(' ', Enumerable.Range(0, 12).Select(_ => $"omega{rng.NextUInt64() % 20000}")));
        return lines;
    }

    private static GrowthAnalysis Growth(IEnumerable<string> lines)
    {
        using var d = new TempDir();
        File.WriteAllLines(d["text.txt"], lines);
        using var c = CountJob.Count([d["text.txt"]], new CountSettings(Threads: 1));
        return Lexicon.Growth(c.Spectrum, c.Growth);
    }

    [Fact]
    public void BetaAboveOneFromTextOrderIsCautionedAndShuffledTextIsNot()
    {
        var lines = Halves();
        var ordered = Growth(lines);
        // V ≤ N bounds any steady source's growth; a new vocabulary arriving late makes the upper curve steeper than 1
        Assert.True(ordered.HeapsBeta > 1, $"β {ordered.HeapsBeta}");
        var caution = Cautions.HeapsBetaCaution(ordered);
        Assert.NotNull(caution);
        Assert.Contains(caution, Cautions.For(0, ordered));
        Assert.Equal(Cautions.For(0).Count + 1, Cautions.For(0, ordered).Count);

        var rng = new RankFreq.Fitting.Xoshiro(6);
        var shuffled = Growth(lines.OrderBy(_ => rng.NextUInt64()));
        Assert.True(shuffled.HeapsBeta < 1, $"β {shuffled.HeapsBeta}");
        Assert.Null(Cautions.HeapsBetaCaution(shuffled));
        Assert.Equal(Cautions.For(0), Cautions.For(0, shuffled));
    }
}
