using RankFreq.Counting;
using RankFreq.Storage;
using Xunit;
using RankFreq.Jobs;

namespace RankFreq.Tests.Storage;

public class ParquetInteropTests
{
    [Fact]
    public async Task ApacheArrowReaderSeesIdenticalRowsAndFooter()
    {
        // Independent reader: ParquetSharp (the Apache Arrow C++ Parquet implementation).
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], string.Join(' ', Enumerable.Range(0, 5000).Select(i => "t" + (i * 7919 % 613))) + " ünïcödé ünïcödé");
        using var r = CountJob.Count([d["a.txt"]], new CountSettings());
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

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public async Task FlatWriterFilesReadBackInBothReaders(bool utf8)
    {
        // Our writer against two independent readers: ParquetSharp (Apache Arrow C++) and Parquet.Net. Several row
        // groups, pages of 65,536 rows, a 32-bit id column, nulls both in one trailing run (redaction) and alternating, and a
        // delta-encoded column with runs of equal values, steps down, large steps up and differences that wrap.
        using var d = new TempDir();
        var groups = new[] { 150_000, 3, 70_000 };
        var all = new List<(string? T, int Id, long C, long D)>();
        string path = d["flat.parquet"];
        using (var fs = File.Create(path))
        using (var w = new FlatParquetWriter(fs, [new("token", FlatType.String, true), new("token_id", FlatType.Int32), new("count", FlatType.Int64),
            new("delta", FlatType.Int64, Delta: true)])
        { Metadata = new Dictionary<string, string> { ["k"] = "välue", ["rankfreq.x"] = new string('z', 300) } })
        {
            int row = 0;
            foreach (int n in groups)
            {
                var t = new string?[n]; var id = new int[n]; var c = new long[n]; var dv = new long[n];
                for (int i = 0; i < n; i++, row++)
                {
                    t[i] = row % 5 == 3 || row > 200_000 ? null : "w" + row + (row % 7 == 0 ? "ß中" : "");
                    id[i] = row * 3 - 5;
                    c[i] = (long)row * 1_000_003 - 17;
                    dv[i] = (row % 1000) switch
                    {
                        < 500 => 1_000_000 - row / 3,
                        777 => long.MinValue,
                        778 => long.MaxValue,
                        _ => (long)row * row,
                    };
                    all.Add((t[i], id[i], c[i], dv[i]));
                }
                w.WriteRowGroup(n, [utf8 ? AsUtf8(t) : t, id, c, dv]);
            }
            w.Finish();
        }
        using (var file = new ParquetSharp.ParquetFileReader(path))
        {
            Assert.Equal("välue", file.FileMetaData.KeyValueMetadata["k"]);
            Assert.Equal(groups.Length, file.FileMetaData.NumRowGroups);
            var got = new List<(string?, int, long, long)>();
            for (int g = 0; g < groups.Length; g++)
            {
                using var rg = file.RowGroup(g);
                int n = (int)rg.MetaData.NumRows;
                var t = rg.Column(0).LogicalReader<string?>().ReadAll(n);
                var id = rg.Column(1).LogicalReader<int>().ReadAll(n);
                var c = rg.Column(2).LogicalReader<long>().ReadAll(n);
                var dv = rg.Column(3).LogicalReader<long>().ReadAll(n);
                for (int i = 0; i < n; i++) got.Add((t[i], id[i], c[i], dv[i]));
            }
            Assert.Equal(all, got);
        }
        await using (var r = await Parquet.ParquetReader.CreateAsync(path))
        {
            Assert.Equal(new string('z', 300), r.CustomMetadata["rankfreq.x"]);
            var f = r.Schema.GetDataFields();
            var got = new List<(string?, int, long, long)>();
            for (int g = 0; g < r.RowGroupCount; g++)
            {
                using var rg = r.OpenRowGroupReader(g);
                var t = new string?[rg.RowCount]; var id = new int[rg.RowCount]; var c = new long[rg.RowCount];
                var dv = new long[rg.RowCount];
                await rg.ReadAsync(f[0], t.AsMemory());
                await rg.ReadAsync<int>(f[1], id.AsMemory());
                await rg.ReadAsync<long>(f[2], c.AsMemory());
                await rg.ReadAsync<long>(f[3], dv.AsMemory());
                for (int i = 0; i < t.Length; i++) got.Add((t[i], id[i], c[i], dv[i]));
            }
            Assert.Equal(all, got);
        }
    }

    /// <summary>The strings as the UTF-8 column the counting engine hands the writer (nulls as a mask).</summary>
    private static Utf8Values AsUtf8(string?[] t)
    {
        var starts = new int[t.Length + 1];
        var bytes = new List<byte>();
        for (int i = 0; i < t.Length; i++)
        {
            starts[i] = bytes.Count;
            if (t[i] is { } s) bytes.AddRange(System.Text.Encoding.UTF8.GetBytes(s));
        }
        starts[t.Length] = bytes.Count;
        return new Utf8Values(new Utf8Tokens([.. bytes], starts), t.Select(x => x is null).ToArray());
    }
}
