using System.Text;
using RankFreq.Counting;
using Xunit;

namespace RankFreq.Tests.Counting;

public class RowGroupsTests
{
    private static Utf8Tokens Column(IEnumerable<string> tokens)
    {
        var list = tokens.ToList();
        var starts = new int[list.Count + 1];
        var bytes = new List<byte>();
        for (int i = 0; i < list.Count; i++)
        {
            starts[i] = bytes.Count;
            bytes.AddRange(Encoding.UTF8.GetBytes(list[i]));
        }
        starts[list.Count] = bytes.Count;
        return new Utf8Tokens([.. bytes], starts);
    }

    [Theory]
    [InlineData(true)]
    [InlineData(false)]
    public void BatchesOfAnySizeAreRecutIntoTheSameRowsAndRanks(bool utf8)
    {
        // 50 rows (multi-byte tokens among them) in batches of uneven sizes, one exactly a row group long
        var all = Enumerable.Range(0, 50).Select(i => i % 7 == 0 ? $"ü{i}é" : $"t{i}").ToArray();
        var counts = Enumerable.Range(0, 50).Select(i => 100L - i).ToArray();
        int[] sizes = [3, 8, 1, 13, 8, 17];
        var batches = new List<CountRowBatch>();
        int at = 0;
        foreach (int n in sizes)
        {
            var t = all[at..(at + n)];
            var c = counts[at..(at + n)];
            batches.Add(utf8 ? new CountRowBatch(at + 1, Column(t), null, c) : new CountRowBatch(at + 1, t, null, c));
            at += n;
        }
        var groups = RowGroups.Of(batches, rows: 8).ToList();
        Assert.Equal([8, 8, 8, 8, 8, 8, 2], groups.Select(g => g.Counts.Length));
        Assert.Equal(Enumerable.Range(0, 7).Select(g => 1L + 8 * g), groups.Select(g => g.FirstRank));
        Assert.Equal(all, groups.SelectMany(g => g.Tokens));
        Assert.Equal(counts, groups.SelectMany(g => g.Counts));
        // UTF-8 stays UTF-8 through the re-cut, so the writer never needs strings
        Assert.All(groups, g => Assert.Equal(utf8, g.Utf8 is not null));
    }

    [Fact]
    public void RankedCountsGiveTheSameSpectrumAsAnyOrder()
    {
        long[] ranked = [9, 9, 5, 3, 3, 3, 1, 1];
        Assert.Equal(FrequencySpectrum.FromCounts(ranked), FrequencySpectrum.FromRankedCounts(ranked));
        long[] unordered = [1, 9, 3, 5, 3, 1, 9, 3];
        Assert.Equal(FrequencySpectrum.FromCounts(unordered), FrequencySpectrum.FromRankedCounts(unordered));
    }
}
