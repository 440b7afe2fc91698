using System.IO.Compression;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using Parquet;
using Parquet.Schema;
using RankFreq.Storage;

namespace RankFreq.Benchmarks;

/// <summary>One count-table-shaped file (token, count, rank; N rows) written once in a fresh process, so first-use
/// cost (type loading, compilation) is included: RankFreq's FlatParquetWriter (Zstd level 1, the count tables'
/// writer) against Parquet.Net with several settings (CompressionLevel.Optimal; dictionary threshold 0.8 or off).
/// Rows are built in the setup, not timed.</summary>
[DefaultJob("ColdStart", RunStrategy.ColdStart, launchCount: 3, warmupCount: 0, iterationCount: 1)]
public class CountTableWriteCold
{
    private string?[] _tokens = [];
    private long[] _counts = [];
    private readonly string _path = Path.Combine(Path.GetTempPath(), $"rankfreq-write-cold-{Environment.ProcessId}.parquet");

    [Params(73_000, 1_000_000)]
    public int Rows { get; set; }

    [GlobalSetup]
    public void Setup()
    {
        _tokens = Enumerable.Range(0, Rows).Select(i => (string?)("tok" + i)).ToArray();
        _counts = Enumerable.Range(0, Rows).Select(i => (long)(Rows - i)).ToArray();
    }

    [GlobalCleanup]
    public void Cleanup() => File.Delete(_path);

    [Benchmark(Baseline = true, Description = "FlatParquetWriter (Zstd 1)")]
    public void Flat()
    {
        using var fs = File.Create(_path);
        using var fw = new FlatParquetWriter(fs,
            [new("token", FlatType.String, true), new("count", FlatType.Int64), new("rank", FlatType.Int64)]);
        fw.WriteRowGroup(Rows, [_tokens, _counts, _counts]);
        fw.Finish();
    }

    [Benchmark(Description = "Parquet.Net, Zstd")]
    public void ParquetNetZstd() => WithParquetNet(CompressionMethod.Zstd, dictionary: true);

    [Benchmark(Description = "Parquet.Net, Zstd, no dictionary")]
    public void ParquetNetZstdNoDictionary() => WithParquetNet(CompressionMethod.Zstd, dictionary: false);

    [Benchmark(Description = "Parquet.Net, Snappy")]
    public void ParquetNetSnappy() => WithParquetNet(CompressionMethod.Snappy, dictionary: true);

    [Benchmark(Description = "Parquet.Net, uncompressed")]
    public void ParquetNetUncompressed() => WithParquetNet(CompressionMethod.None, dictionary: true);

    private void WithParquetNet(CompressionMethod compression, bool dictionary)
    {
        var tf = new DataField<string>("token", true);
        var cf = new DataField<long>("count");
        var rf = new DataField<long>("rank");
        var opts = new ParquetOptions
        {
            CompressionMethod = compression,
            CompressionLevel = CompressionLevel.Optimal,
            DictionaryEncodingThreshold = dictionary ? 0.8 : 0,
        };
        using var fs = File.Create(_path);
        var w = ParquetWriter.CreateAsync(new ParquetSchema(tf, cf, rf), fs, opts).GetAwaiter().GetResult();
        using (var rg = w.CreateRowGroup())
        {
            rg.WriteAsync(tf, _tokens).GetAwaiter().GetResult();
            rg.WriteAsync<long>(cf, _counts).GetAwaiter().GetResult();
            rg.WriteAsync<long>(rf, _counts).GetAwaiter().GetResult();
        }
        w.DisposeAsync().AsTask().GetAwaiter().GetResult();
    }
}
