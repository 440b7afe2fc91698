using Parquet;
using Parquet.Schema;
using RankFreq.Primitives;

namespace RankFreq.Storage;

/// <summary>
/// Writes results as a Parquet table whose columns are generated from their field list: integers as optional int64,
/// reals as optional double (null where not finite), text as string, flags as optional boolean, nested values as
/// their JSON text.
/// </summary>
public static class FieldTableFile
{
    private static ParquetOptions Options => new()
    {
        CompressionMethod = CompressionMethod.Zstd,
        CompressionLevel = System.IO.Compression.CompressionLevel.Optimal,
    };

    /// <summary>Writes one row per item of <paramref name="rows"/>, atomically, with <c>rankfreq.table</c> =
    /// <paramref name="table"/> in the footer.</summary>
    public static Task WriteAsync<T>(string path, string table, IReadOnlyList<ResultField<T>> fields, IReadOnlyList<T> rows,
        CancellationToken ct = default) =>
        AtomicFile.WriteAsync(path, async stream =>
        {
            var columns = fields.Select(f => f.Kind switch
            {
                FieldKind.Integer => (DataField)new DataField<long?>(f.Name),
                FieldKind.Real => new DataField<double?>(f.Name),
                FieldKind.Flag => new DataField<bool?>(f.Name),
                _ => new DataField<string>(f.Name),
            }).ToArray();
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(columns), stream, Options, cancellationToken: ct);
            w.CustomMetadata = new Dictionary<string, string>
            {
                ["rankfreq.table"] = table,
                ["rankfreq.version"] = CountTableMetadata.CurrentVersion,
            };
            using var rg = w.CreateRowGroup();
            for (int c = 0; c < fields.Count; c++)
            {
                var f = fields[c];
                var values = rows.Select(f.Stored).ToArray();
                switch (f.Kind)
                {
                    case FieldKind.Integer:
                        await rg.WriteAsync<long>((DataField<long?>)columns[c], values.Select(v => (long?)v).ToArray());
                        break;
                    case FieldKind.Real:
                        await rg.WriteAsync<double>((DataField<double?>)columns[c], values.Select(v => (double?)v).ToArray());
                        break;
                    case FieldKind.Flag:
                        await rg.WriteAsync<bool>((DataField<bool?>)columns[c], values.Select(v => (bool?)v).ToArray());
                        break;
                    case FieldKind.Nested:
                        await rg.WriteAsync((DataField<string>)columns[c], values.Select(v => v is null ? null : JsonText.Write(v, indented: false)).ToArray());
                        break;
                    default:
                        await rg.WriteAsync((DataField<string>)columns[c], values.Select(v => (string?)v).ToArray());
                        break;
                }
            }
        });
}
