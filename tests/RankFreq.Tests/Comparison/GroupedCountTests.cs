using Parquet;
using Parquet.Schema;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Sources;
using RankFreq.Tests.Counting;
using Xunit;

namespace RankFreq.Tests.Comparison;

public class GroupedCountTests
{
    private static Dictionary<string, long> Table(ICountRows rows) =>
        CountingTests.Rows(rows).ToDictionary(p => p.Token!, p => p.Count);

    private static SourceOptions Log => new(TextField: "log.text");

    [Theory]
    [InlineData(1, 0L, 16L << 20)]
    [InlineData(2, 0L, 64L << 10)]         // JSON Lines cut into ranges counted on two threads
    [InlineData(2, 1L << 20, 64L << 10)]   // and a memory budget small enough to spill group tables
    public void GroupedCountEqualsEachGroupCountedOnItsOwn(int threads, long memory, long splitAbove)
    {
        using var d = new TempDir();
        var lines = ContrastDemo.Lines(4, ("harbour", 1901, 400, 1.0), ("night", 1925, 300, 1.2), ("pilot", 1948, 200, 0.9));
        // every 37th record lacks the crew: those form the "(missing)" group
        lines = lines.Select((l, i) => i % 37 == 0 ? l.Replace("\"crew\": \"", "\"crewman\": \"") : l).ToList();
        var rng = new RankFreq.Fitting.Xoshiro(9);
        lines = lines.OrderBy(_ => rng.NextUInt64()).ToList();
        File.WriteAllLines(d["log.jsonl"], lines);
        var settings = new CountSettings(Source: Log, Threads: threads, MemoryBytes: memory, SplitAboveBytes: splitAbove, TempDirectory: d.Path);
        using var grouped = ContrastJob.CountGroups([d["log.jsonl"]], settings, GroupKey.Parse("field:crew"));
        Assert.Equal(["(missing)", "harbour", "night", "pilot"], grouped.Groups.Select(g => g.Group).ToArray());
        foreach (var g in grouped.Groups)
        {
            // the same group counted on its own, from a file holding only its records
            string crewText = g.Group == GroupKey.Missing ? "\"crewman\"" : $"\"crew\": \"{g.Group}\"";
            string file = d[$"only-{g.Group.Trim('(', ')')}.jsonl"];
            File.WriteAllLines(file, lines.Where(l => l.Contains(crewText)));
            using var alone = CountJob.Count([file], new CountSettings(Source: Log, Threads: 1));
            Assert.Equal(Table(alone.Rows), Table(g.Rows));
            Assert.Equal(alone.Spectrum, g.Spectrum);
            Assert.Equal(alone.Summary.Tokens, g.Tokens);
            Assert.Equal(alone.Summary.Records, g.Documents);
        }
        Assert.Equal(lines.Count, grouped.Summary.Records);
        Assert.Empty(Directory.GetDirectories(d.Path, ".spill.rankfreq-tmp.*"));
    }

    [Fact]
    public void BinnedYearsPerFileKeysAndAGroupsFile()
    {
        using var d = new TempDir();
        Directory.CreateDirectory(d["north"]);
        Directory.CreateDirectory(d["south"]);
        File.WriteAllLines(d["north/a.jsonl"], ContrastDemo.Lines(1, ("harbour", 1901, 30, 1.0)));
        File.WriteAllLines(d["north/b.jsonl"], ContrastDemo.Lines(2, ("night", 1948, 20, 1.0)));
        File.WriteAllLines(d["south/c.jsonl"], ContrastDemo.Lines(3, ("pilot", 1950, 10, 1.0)));
        var s = new CountSettings(Source: Log, Threads: 2);
        using (var years = ContrastJob.CountGroups([d.Path], s, GroupKey.Parse("field:year/25")))
            // years 1901–1907 fall in 1900–1924, 1948–1954 straddle 1925–1949 and 1950–1974
            Assert.Equal(["1900–1924", "1925–1949", "1950–1974"], years.Groups.Select(g => g.Group).Order(StringComparer.Ordinal).ToArray());
        using (var folders = ContrastJob.CountGroups([d.Path], s, GroupKey.Parse("folder")))
        {
            Assert.Equal(2, folders.Groups.Count);
            Assert.EndsWith("north", folders.Groups[0].Group);
            Assert.Equal(50 * 60, folders.Groups[0].Tokens);
        }
        using (var files = ContrastJob.CountGroups([d.Path], s, GroupKey.Parse("file")))
            Assert.Equal([30 * 60L, 20 * 60L, 10 * 60L], files.Groups.Select(g => g.Tokens).ToArray());
        File.WriteAllText(d["groups.csv"], $"path,group\n{d["north/a.jsonl"]},early\n{d["south/c.jsonl"]},late\n");
        using var table = ContrastJob.CountGroups([d["north"], d["south"]], s, GroupKey.FromTable(d["groups.csv"]));
        Assert.Equal(["(missing)", "early", "late"], table.Groups.Select(g => g.Group).ToArray());
        Assert.Equal(20 * 60, table.Groups[0].Tokens);
    }

    [Fact]
    public async Task ParquetColumnKeys()
    {
        using var d = new TempDir();
        var text = new DataField<string>("text");
        var year = new DataField<int?>("year");
        var crew = new DataField<string>("crew", true);
        await using (var fs = File.Create(d["log.parquet"]))
        await using (var w = await ParquetWriter.CreateAsync(new ParquetSchema(text, year, crew), fs))
        using (var rg = w.CreateRowGroup())
        {
            await rg.WriteAsync(text, new[] { "kalo mir", "ven tas ul", "dre ko", "sa nim" });
            await rg.WriteAsync<int>(year, new int?[] { 1901, 1949, null, 1902 });
            await rg.WriteAsync(crew, new[] { "night", null, "pilot", "night" });
        }
        var s = new CountSettings(Threads: 1);
        using (var y = ContrastJob.CountGroups([d["log.parquet"]], s, GroupKey.Parse("column:year/10")))
        {
            Assert.Equal(["(missing)", "1900–1909", "1940–1949"], y.Groups.Select(g => g.Group).ToArray());
            Assert.Equal([2L, 4, 3], y.Groups.Select(g => g.Tokens).ToArray());
        }
        using var c = ContrastJob.CountGroups([d["log.parquet"]], s, GroupKey.Parse("column:crew"));
        Assert.Equal(["(missing)", "night", "pilot"], c.Groups.Select(g => g.Group).ToArray());
        Assert.Equal([3L, 4, 2], c.Groups.Select(g => g.Tokens).ToArray());
        var ex = Assert.Throws<SourceException>(() => ContrastJob.CountGroups([d["log.parquet"]], s, GroupKey.Parse("column:shift")));
        Assert.Contains("no column 'shift'", ex.Message);
    }

    [Theory]
    [InlineData("file", GroupKind.File, "", 0.0)]
    [InlineData("field:meta.year/50", GroupKind.Field, "meta.year", 50.0)]
    [InlineData("column:party", GroupKind.Column, "party", 0.0)]
    public void ParsesKeys(string spec, GroupKind kind, string name, double width)
    {
        var k = GroupKey.Parse(spec);
        Assert.Equal((kind, name, width), (k.Kind, k.Name, k.BinWidth));
    }

    [Theory]
    [InlineData("colour")]
    [InlineData("field:")]
    [InlineData("field:year/0")]
    [InlineData("field:year/x")]
    public void RejectsBadKeys(string spec) => Assert.Throws<FormatException>(() => GroupKey.Parse(spec));

    [Fact]
    public void BinLabelsAndOrder()
    {
        var k = GroupKey.Parse("field:year/50");
        Assert.Equal("1750–1799", k.LabelOfNumber(1790));
        Assert.Equal("1800–1849", k.LabelOfNumber(1800));
        Assert.Equal("-50–-1", k.LabelOfNumber(-0.5));
        Assert.Equal("[0, 2.5)", GroupKey.Parse("field:x/2.5").LabelOfNumber(1));
        // bins in numeric order, not text order; the missing group last
        Assert.Equal(["950–999", "1000–1049", GroupKey.Missing], k.Order([GroupKey.Missing, "1000–1049", "950–999"]));
    }
}
