using RankFreq.Counting;
using RankFreq.Storage;
using Xunit;

namespace RankFreq.Tests.Storage;

public class ParquetInteropTests
{
    [Fact]
    public async Task ApacheArrowReaderSeesIdenticalRowsAndFooter()
    {
        // Independent reader: ParquetSharp (the Apache Arrow C++ Parquet implementation).
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], string.Join(' ', Enumerable.Range(0, 5000).Select(i => "t" + (i * 7919 % 613))) + " ünïcödé ünïcödé");
        using var r = CountEngine.Count([d["a.txt"]], new CountSettings());
        var s = r.Summary;
        await CountTableFile.WriteAsync(d["t.parquet"], r.Rows, false, CountTableMetadata.From(s, 0));
        var mine = (InMemoryRows)r.Rows;

        using var file = new ParquetSharp.ParquetFileReader(d["t.parquet"]);
        Assert.Equal("words", file.FileMetaData.KeyValueMetadata["rankfreq.tokenizer"]);
        Assert.Equal(s.Tokens.ToString(), file.FileMetaData.KeyValueMetadata["rankfreq.tokens"]);
        var tokens = new List<string?>(); var counts = new List<long>(); var ranks = new List<long>();
        for (int g = 0; g < file.FileMetaData.NumRowGroups; g++)
        {
            using var rg = file.RowGroup(g);
            int n = (int)rg.MetaData.NumRows;
            tokens.AddRange(rg.Column(0).LogicalReader<string?>().ReadAll(n));
            counts.AddRange(rg.Column(1).LogicalReader<long>().ReadAll(n));
            ranks.AddRange(rg.Column(2).LogicalReader<long>().ReadAll(n));
        }
        Assert.Equal(mine.Tokens, tokens);
        Assert.Equal(mine.Counts, counts);
        Assert.Equal(Enumerable.Range(1, counts.Count).Select(i => (long)i), ranks);
        Assert.Equal(s.Tokens, counts.Sum());
        Assert.Equal(2, counts[tokens.IndexOf("ünïcödé")]);
    }
}
