using System.IO.Compression;
using System.Text;
using RankFreq.Counting;
using RankFreq.Sources;
using Xunit;
using RankFreq.Jobs;

namespace RankFreq.Tests.Sources;

public class SourceTests
{
    private const string Sample = "The harbour light, the harbour wall; a gull, two gulls — three gulls!\nNorthwest 5 later.\n";

    private static CountResult Count(params string[] inputs) => CountJob.Count(inputs, new CountSettings(Threads: 2));

    // read-ahead (decompressing on a second thread) is normally only for compressed files of 4 MiB and more
    private static CountResult Count(bool readAhead, params string[] inputs) =>
        CountJob.Count(inputs, new CountSettings(Threads: 2, Source: new SourceOptions { ReadAheadAboveBytes = readAhead ? 0 : long.MaxValue }));

    public static readonly TheoryData<string, bool> Compressions = new()
    {
        { "gzip", false }, { "zstd", false }, { "bzip2", false }, { "xz", false },
        { "gzip", true }, { "zstd", true }, { "bzip2", true }, { "xz", true },
    };

    private static Dictionary<string, long> Table(CountResult r)
    {
        var rows = (InMemoryRows)r.Rows;
        return rows.Tokens.Select((t, i) => (t!, rows.Counts[i])).ToDictionary(p => p.Item1, p => p.Item2);
    }

    private static string Repeat(int n) => string.Concat(Enumerable.Repeat(Sample, n));

    [Theory]
    [MemberData(nameof(Compressions))]
    public void EveryCompressionGivesThePlainCounts(string kind, bool readAhead)
    {
        using var d = new TempDir();
        var text = Repeat(3000);
        File.WriteAllText(d["plain.txt"], text);
        // compressed with the system tools where present (an independent encoder), else with the libraries
        string packed = d["packed.bin"]; // no telling extension: detection is by magic bytes
        var tool = kind switch { "gzip" => "gzip", "zstd" => "zstd", "bzip2" => "bzip2", _ => "xz" };
        if (!RunTool(tool, d["plain.txt"], packed))
        {
            Assert.True(kind != "xz", "xz is needed to make the xz sample (Debian package xz-utils)");
            using var o = File.Create(packed);
            using Stream c = kind switch
            {
                "gzip" => new GZipStream(o, CompressionLevel.Fastest),
                "zstd" => new ZstdSharp.CompressionStream(o),
                _ => SharpCompress.Compressors.BZip2.BZip2Stream.Create(o, SharpCompress.Compressors.CompressionMode.Compress, false, false),
            };
            c.Write(Encoding.UTF8.GetBytes(text));
        }
        using var a = Count(d["plain.txt"]);
        using var b = Count(readAhead, packed);
        Assert.Equal(Table(a), Table(b));
        Assert.Equal(6000, Table(b)["harbour"]);
    }

    private static bool RunTool(string tool, string input, string output)
    {
        try
        {
            var psi = new System.Diagnostics.ProcessStartInfo(tool, ["-c", input]) { RedirectStandardOutput = true, UseShellExecute = false };
            using var p = System.Diagnostics.Process.Start(psi)!;
            using (var o = File.Create(output)) p.StandardOutput.BaseStream.CopyTo(o);
            p.WaitForExit();
            return p.ExitCode == 0;
        }
        catch (System.ComponentModel.Win32Exception) { return false; }
    }

    [Theory]
    [InlineData("gzip", false)]
    [InlineData("zstd", false)]
    [InlineData("bzip2", false)]
    [InlineData("gzip", true)]
    [InlineData("zstd", true)]
    [InlineData("bzip2", true)]
    public void TruncatedOrCorruptArchiveIsAnErrorNamingTheFile(string kind, bool readAhead)
    {
        using var d = new TempDir();
        var raw = Encoding.UTF8.GetBytes(Repeat(20000));
        var ms = new MemoryStream();
        using (Stream c = kind switch
        {
            "gzip" => new GZipStream(ms, CompressionLevel.Fastest, leaveOpen: true),
            "zstd" => new ZstdSharp.CompressionStream(ms, leaveOpen: true),
            _ => SharpCompress.Compressors.BZip2.BZip2Stream.Create(ms, SharpCompress.Compressors.CompressionMode.Compress, false, true),
        }) c.Write(raw);
        var packed = ms.ToArray();
        string path = d["broken.txt." + kind];
        File.WriteAllBytes(path, packed[..(packed.Length / 2)]);
        var e = Assert.ThrowsAny<Exception>(() => Count(readAhead, path));
        Assert.True(e is SourceException, $"{e.GetType().Name}: {e.Message}");
        Assert.Contains(path, e.Message);
    }

    [Fact]
    public void MultiMemberGzipCountsEveryMemberAndTruncationIsStillCaught()
    {
        // RFC 1952 §2.2: a gzip file may hold several members (cat a.gz b.gz; bgzip ends with an empty member).
        using var d = new TempDir();
        string a = Repeat(3000), b = "second member ünï " + Repeat(2000);
        static byte[] Member(string text)
        {
            var ms = new MemoryStream();
            using (var g = new GZipStream(ms, CompressionLevel.Optimal, leaveOpen: true)) g.Write(Encoding.UTF8.GetBytes(text));
            return ms.ToArray();
        }
        byte[] m1 = Member(a), m2 = Member(b), empty = Member("");
        File.WriteAllText(d["plain.txt"], a + b);
        var whole = m1.Concat(m2).Concat(empty).ToArray();
        File.WriteAllBytes(d["multi.gz"], whole);
        using (var plain = CountJob.Count([d["plain.txt"]], new CountSettings()))
        using (var multi = CountJob.Count([d["multi.gz"]], new CountSettings()))
        using (var ahead = Count(true, d["multi.gz"]))
        {
            Assert.Equal(plain.Summary.Tokens, multi.Summary.Tokens);
            Assert.Equal(plain.Spectrum, multi.Spectrum);
            Assert.Equal(plain.Spectrum, ahead.Spectrum);
        }
        File.WriteAllBytes(d["two.gz"], m1.Concat(m2).ToArray());
        using (var two = CountJob.Count([d["two.gz"]], new CountSettings())) Assert.True(two.Summary.Tokens > 5000);

        // members written by GNU gzip, which records the file name in each header (FNAME), where the tool is present
        File.WriteAllText(d["a.txt"], a);
        File.WriteAllText(d["b.txt"], b);
        if (RunTool("gzip", d["a.txt"], d["a.gz"]) && RunTool("gzip", d["b.txt"], d["b.gz"]))
        {
            var g1 = File.ReadAllBytes(d["a.gz"]);
            var g2 = File.ReadAllBytes(d["b.gz"]);
            Assert.True((g2[3] & 8) != 0, "gzip wrote no file name; the header path is not exercised");
            File.WriteAllBytes(d["gnu.gz"], g1.Concat(g2).ToArray());
            using (var plain = CountJob.Count([d["plain.txt"]], new CountSettings()))
            using (var gnu = CountJob.Count([d["gnu.gz"]], new CountSettings()))
                Assert.Equal(plain.Spectrum, gnu.Spectrum);
            File.WriteAllBytes(d["gnu-cut.gz"], g1.Concat(g2).Take(g1.Length + g2.Length / 2).ToArray());
            Assert.Throws<SourceException>(() => CountJob.Count([d["gnu-cut.gz"]], new CountSettings()));
        }

        // cut inside the second member, inside the first, and inside the last trailer
        foreach (int cut in new[] { m1.Length + m2.Length / 2, m1.Length / 2, m1.Length + m2.Length - 3 })
        {
            string p = d[$"cut{cut}.gz"];
            File.WriteAllBytes(p, m1.Concat(m2).Take(cut).ToArray());
            var e = Assert.Throws<SourceException>(() => CountJob.Count([p], new CountSettings()));
            Assert.Contains(p, e.Message);
            Assert.Contains(p, Assert.Throws<SourceException>(() => Count(true, p)).Message);
        }
    }

    [Fact]
    public async Task AnErrorWhileReadingAheadStopsTheReaderThread()
    {
        // a record over --max-record in a gzip JSON Lines file read ahead on a second thread: the error must reach
        // the caller, name file and line, and leave no thread blocked on a full queue
        using var d = new TempDir();
        string path = d["big.jsonl.gz"];
        using (var o = File.Create(path))
        using (var g = new GZipStream(o, CompressionLevel.Fastest))
        using (var w = new StreamWriter(g))
            for (int i = 0; i < 2500; i++) w.WriteLine("{\"text\":\"" + string.Concat(Enumerable.Repeat("word ",
                i == 3 ? 40_000 : 1000)) + "\"}"); // ~12 MB: the queue fills
        var run = Task.Run(() => CountJob.Count([path], new CountSettings(Threads: 2,
            Source: new SourceOptions(MaxRecordBytes: 100_000) { ReadAheadAboveBytes = 0 })));
        var finished = await Task.WhenAny(run, Task.Delay(TimeSpan.FromSeconds(60)));
        Assert.True(finished == run, "the count did not finish");
        var e = await Assert.ThrowsAsync<SourceException>(() => run);
        Assert.Contains(path + ":4:", e.Message);
    }

    [Fact]
    public void JsonLinesFilesAreCutAtRecordsWithFileLineNumbersInErrors()
    {
        using var d = new TempDir();
        string path = d["recs.jsonl"];
        var lines = Enumerable.Range(0, 3000).Select(i => $"{{\"id\":{i},\"text\":\"{Sample.Replace("\n", "\\n")} rec{i % 97}\"}}").ToList();
        File.WriteAllLines(path, lines);
        // one reader, and ranges of about 32 KiB handed to two threads: the same counts, records and growth
        using var whole = CountJob.Count([path], new CountSettings(Threads: 1));
        using var split = CountJob.Count([path], new CountSettings(Threads: 2, SplitAboveBytes: 1 << 17));
        Assert.Equal(3000, split.Summary.Records);
        Assert.Equal(Table(whole), Table(split));
        Assert.Equal(whole.Growth.Types, split.Growth.Types);

        // a malformed record deep in the file: under --strict the error names its line in the file, not in its range
        lines[2500] = "{\"text\": broken";
        File.WriteAllLines(path, lines);
        var strict = new SourceOptions(Strict: true);
        var e = Assert.Throws<SourceException>(() => CountJob.Count([path], new CountSettings(Source: strict, Threads: 2, SplitAboveBytes: 1 << 17)));
        Assert.Contains(path + ":2501:", e.Message);
    }

    [Fact]
    public void JsonLinesNestedFieldMalformedAndStrict()
    {
        using var d = new TempDir();
        File.WriteAllLines(d["a.jsonl"], [
            "{\"meta\":{\"body\":\"one two two\"},\"set\":\"x\"}",
            "{\"meta\":{\"body\":\"three \\u0074wo\"}}",
            "{not json",
            "{\"meta\":{\"other\":1}}",
            "",
            "{\"meta\":{\"body\":42}}",
        ]);
        var opts = new SourceOptions(TextField: "meta.body");
        using var r = CountJob.Count([d["a.jsonl"]], new CountSettings(Source: opts));
        Assert.Equal(5, r.Summary.Tokens);
        Assert.Equal(3, Table(r)["two"]);
        Assert.Equal(1, r.Summary.MalformedRecords);
        Assert.Equal(2, r.Summary.MissingField);
        var e = Assert.Throws<SourceException>(() => CountJob.Count([d["a.jsonl"]], new CountSettings(Source: opts with { Strict = true })));
        Assert.Contains("a.jsonl:3", e.Message);
    }

    [Fact]
    public void OverlongRecordIsAnErrorWithItsLine()
    {
        using var d = new TempDir();
        File.WriteAllText(d["big.jsonl"], "{\"text\":\"ok\"}\n{\"text\":\"" + new string('a', 5000) + "\"}\n");
        var e = Assert.Throws<SourceException>(() => CountJob.Count([d["big.jsonl"]], new CountSettings(Source: new SourceOptions(MaxRecordBytes: 1000))));
        Assert.Contains("big.jsonl:2", e.Message);
    }

    [Fact]
    public async Task ParquetTextColumn()
    {
        using var d = new TempDir();
        var f = new Parquet.Schema.DataField<string>("body");
        await using (var fs = File.Create(d["t.parquet"]))
        await using (var w = await Parquet.ParquetWriter.CreateAsync(new Parquet.Schema.ParquetSchema(f), fs))
        {
            using var rg = w.CreateRowGroup();
            await rg.WriteAsync(f, new[] { "red red blue", "green", "blue" });
        }
        using var r = CountJob.Count([d["t.parquet"]], new CountSettings(Source: new SourceOptions(TextColumn: "body")));
        Assert.Equal(new Dictionary<string, long> { ["red"] = 2, ["blue"] = 2, ["green"] = 1 }, Table(r));
        Assert.Throws<SourceException>(() => CountJob.Count([d["t.parquet"]], new CountSettings()));
    }

    [Fact]
    public void InvalidUtf8IsReplacedAndCountedBomSkippedBinarySkipped()
    {
        using var d = new TempDir();
        File.WriteAllBytes(d["bad.txt"], [0xEF, 0xBB, 0xBF, (byte)'a', (byte)'b', 0xFF, 0xFE, (byte)' ', (byte)'c', 0xC3]);
        File.WriteAllBytes(d["bin.dat"], [1, 2, 0, 3, (byte)'x']);
        using var r = CountJob.Count([d.Path], new CountSettings());
        Assert.Equal(3, r.Summary.ReplacedBytes);  // FF, FE and the dangling C3
        Assert.Equal(new Dictionary<string, long> { ["ab"] = 1, ["c"] = 1 }, Table(r));
        Assert.Single(r.Summary.SkippedFiles);
        Assert.EndsWith("bin.dat", r.Summary.SkippedFiles[0].Path);
    }

    [Fact]
    public void EmptyCorpusAndMissingInputAreErrors()
    {
        using var d = new TempDir();
        File.WriteAllText(d["empty.txt"], " ... ,, ");
        Assert.Contains("no tokens found", Assert.Throws<CountingException>(() => Count(d["empty.txt"])).Message);
        Assert.Contains("nope.txt", Assert.Throws<SourceException>(() => Count(d["nope.txt"])).Message);
    }

    [Fact]
    public void IncludeAndExcludeGlobs()
    {
        using var d = new TempDir();
        Directory.CreateDirectory(d["sub"]);
        File.WriteAllText(d["sub/a.txt"], "alpha");
        File.WriteAllText(d["sub/b.md"], "beta");
        File.WriteAllText(d["c.txt"], "gamma");
        using var r = CountJob.Count([d.Path], new CountSettings(Source: new SourceOptions(Include: ["**/*.txt"], Exclude: ["sub/**"])));
        Assert.Equal(["gamma"], Table(r).Keys);
    }
}
