using RankFreq.Primitives;
using System.Globalization;
using Parquet;
using Parquet.Schema;
using RankFreq.Counting;

namespace RankFreq.Storage;

/// <summary>
/// Reads and writes count tables: columns token, token_id (subword only), count, rank; Zstd pages; row groups of 1M
/// rows. Written by <see cref="FlatParquetWriter"/> (fast for tables of millions of rows), read with Parquet.Net.
/// </summary>
public static class CountTableFile
{

    /// <summary>
    /// Writes <paramref name="rows"/> atomically. Token strings of types with count below <c>meta.RedactedBelow</c>
    /// are written as null; counts and ranks are kept, so the spectrum and every fit are unchanged.
    /// </summary>
    public static Task WriteAsync(string path, ICountRows rows, bool hasIds, CountTableMetadata meta, CancellationToken ct = default) =>
        AtomicFile.WriteAsync(path, stream =>
        {
            var columns = new List<FlatColumn> { new("token", FlatType.String, Nullable: true) };
            if (hasIds) columns.Add(new("token_id", FlatType.Int32));
            columns.Add(new("count", FlatType.Int64, Delta: true));
            columns.Add(new("rank", FlatType.Int64, Delta: true));
            using var w = new FlatParquetWriter(stream, columns) { Metadata = meta.ToFooter(), CreatedBy = $"rankfreq {meta.ToolVersion}" };
            foreach (var b in RowGroups.Of(rows.Batches()))
            {
                ct.ThrowIfCancellationRequested();
                w.WriteRowGroup(b.Counts.Length, BatchColumns(b, hasIds, meta.RedactedBelow));
            }
            w.Finish();
            return Task.CompletedTask;
        });

    /// <summary>The token (redacted below <paramref name="redactBelow"/>), token_id, count and rank columns of a batch.</summary>
    internal static List<object> BatchColumns(CountRowBatch b, bool hasIds, long redactBelow)
    {
        object tokens;
        if (b.Utf8 is { } utf8)
        {
            bool[]? isNull = null;
            if (redactBelow > 1)
            {
                isNull = new bool[b.Counts.Length];
                for (int i = 0; i < isNull.Length; i++) isNull[i] = b.Counts[i] < redactBelow;
            }
            tokens = new Utf8Values(utf8, isNull);
        }
        else
        {
            var strings = b.Tokens;
            if (redactBelow > 1)
            {
                strings = (string?[])strings.Clone();
                for (int i = 0; i < strings.Length; i++) if (b.Counts[i] < redactBelow) strings[i] = null;
            }
            tokens = strings;
        }
        var ranks = new long[b.Counts.Length];
        for (int i = 0; i < ranks.Length; i++) ranks[i] = b.FirstRank + i;
        var data = new List<object> { tokens };
        if (hasIds) data.Add(b.TokenIds ?? throw new InvalidOperationException("ids missing"));
        data.Add(b.Counts);
        data.Add(ranks);
        return data;
    }

    /// <summary>Opens a count table; throws <see cref="StorageException"/> if it is not one.</summary>
    public static async Task<CountTableReader> OpenAsync(string path, CancellationToken ct = default)
    {
        if (!File.Exists(path)) throw new StorageException($"{path}: no such file");
        ParquetReader r;
        try
        {
            ParquetFooterCheck.ThrowIfDamaged(path); // a damaged footer can loop the Parquet decoder for ever
            r = await ParquetReader.CreateAsync(path, cancellationToken: ct);
            _ = r.Schema.GetDataFields(); // the schema is decoded when first asked for: a damaged one fails here
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            throw new StorageException($"{path}: not a Parquet file ({e.Message.Split('\n')[0]})", e);
        }
        var meta = CountTableMetadata.FromFooter(r.CustomMetadata, path);
        var df = r.Schema.GetDataFields();
        var count = df.FirstOrDefault(f => f.Name == "count" && f.ClrType == typeof(long));
        var token = df.FirstOrDefault(f => f.Name == "token" && (f.ClrType == typeof(string) || f.ClrType == typeof(ReadOnlyMemory<char>)));
        var id = df.FirstOrDefault(f => f.Name == "token_id" && f.ClrType == typeof(int));
        if (count is null || token is null)
        {
            await r.DisposeAsync();
            throw new StorageException($"{path}: not a count table (needs columns token and count)");
        }
        return new CountTableReader(path, r, meta, token, id, count);
    }
}
