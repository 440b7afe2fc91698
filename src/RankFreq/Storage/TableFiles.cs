using Parquet;
using Parquet.Schema;
using RankFreq.Counting;
using RankFreq.Lexical;

namespace RankFreq.Storage;

/// <summary>Small Parquet tables of the profile: spectrum and growth.</summary>
public static class TableFiles
{
    private static ParquetOptions Options => new()
    {
        CompressionMethod = CompressionMethod.Zstd,
        CompressionLevel = System.IO.Compression.CompressionLevel.Optimal,
    };

    /// <summary>Columns frequency (int64) and types (int64): how many types occur exactly that often.</summary>
    public static Task WriteSpectrumAsync(string path, FrequencySpectrum s, CancellationToken ct = default) =>
        AtomicFile.WriteAsync(path, async stream =>
        {
            var f = new DataField<long>("frequency");
            var t = new DataField<long>("types");
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(f, t), stream, Options, cancellationToken: ct);
            w.CustomMetadata = new Dictionary<string, string> { ["rankfreq.table"] = "spectrum", ["rankfreq.version"] = CountTableMetadata.CurrentVersion };
            using var rg = w.CreateRowGroup();
            await rg.WriteAsync<long>(f, s.Values);
            await rg.WriteAsync<long>(t, s.Types);
        });

    /// <summary>Columns tokens, types_observed, types_expected (hypergeometric), types_binomial, types_heaps.</summary>
    public static Task WriteGrowthAsync(string path, GrowthAnalysis g, CancellationToken ct = default) =>
        AtomicFile.WriteAsync(path, async stream =>
        {
            var n = new DataField<long>("tokens");
            var o = new DataField<long>("types_observed");
            var e = new DataField<double>("types_expected");
            var b = new DataField<double>("types_binomial");
            var h = new DataField<double>("types_heaps");
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(n, o, e, b, h), stream, Options, cancellationToken: ct);
            w.CustomMetadata = new Dictionary<string, string>
            {
                ["rankfreq.table"] = "growth",
                ["rankfreq.heaps_k"] = g.HeapsK.ToString("R"),
                ["rankfreq.heaps_beta"] = g.HeapsBeta.ToString("R"),
                ["rankfreq.heaps_method"] = g.HeapsMethod,
                ["rankfreq.version"] = CountTableMetadata.CurrentVersion,
            };
            using var rg = w.CreateRowGroup();
            await rg.WriteAsync<long>(n, g.Tokens);
            await rg.WriteAsync<long>(o, g.Observed);
            await rg.WriteAsync<double>(e, g.Expected);
            await rg.WriteAsync<double>(b, g.Binomial);
            await rg.WriteAsync<double>(h, g.Tokens.Select(t => g.HeapsAt(t)).ToArray());
        });
}
