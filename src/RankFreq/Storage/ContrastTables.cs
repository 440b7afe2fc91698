using Parquet;
using Parquet.Schema;
using RankFreq.Comparison;
using RankFreq.Counting;

namespace RankFreq.Storage;

/// <summary>Parquet tables of a contrast: groups, pairs, and the grouped count table.</summary>
public static class ContrastTables
{
    private static ParquetOptions Options => new() { CompressionMethod = CompressionMethod.Zstd, CompressionLevel = System.IO.Compression.CompressionLevel.Optimal };

    /// <summary>One row per group, columns from <see cref="ContrastFields.GroupFlat"/> (all nullable; NaN written as null).</summary>
    public static Task WriteGroupsAsync(string path, ContrastResult r, CancellationToken ct = default) =>
        WriteRowsAsync(path, "contrast_groups", ContrastFields.GroupFlat, r.Groups, ct);

    /// <summary>One row per pair, columns from <see cref="ContrastFields.PairFlat"/>.</summary>
    public static Task WritePairsAsync(string path, ContrastResult r, CancellationToken ct = default) =>
        WriteRowsAsync(path, "contrast_pairs", ContrastFields.PairFlat, r.Pairs, ct);

    /// <summary>Writes rows of any result type through its field list, atomically.</summary>
    public static Task WriteRowsAsync<T>(string path, string table, IReadOnlyList<ResultField<T>> fields, IReadOnlyList<T> rows, CancellationToken ct = default) =>
        AtomicFile.WriteAsync(path, async stream =>
        {
            var dataFields = fields.Select(f => f.Kind switch
            {
                FieldKind.Text => (DataField)new DataField<string>(f.Name, true),
                FieldKind.Integer => new DataField<long?>(f.Name),
                FieldKind.Flag => new DataField<bool?>(f.Name),
                _ => new DataField<double?>(f.Name),
            }).ToArray();
            await using var w = await ParquetWriter.CreateAsync(new ParquetSchema(dataFields), stream, Options, cancellationToken: ct);
            w.CustomMetadata = new Dictionary<string, string> { ["rankfreq.table"] = table, ["rankfreq.version"] = CountTableMetadata.CurrentVersion };
            using var rg = w.CreateRowGroup();
            for (int i = 0; i < fields.Count; i++)
            {
                var f = fields[i];
                var values = rows.Select(f.Get).ToArray();
                switch (f.Kind)
                {
                    case FieldKind.Text: await rg.WriteAsync(dataFields[i], values.Select(v => v as string).ToArray()); break;
                    case FieldKind.Integer: await rg.WriteAsync<long>(dataFields[i], values.Select(v => v is null ? (long?)null : Convert.ToInt64(v)).ToArray()); break;
                    case FieldKind.Flag: await rg.WriteAsync<bool>(dataFields[i], values.Select(v => v as bool?).ToArray()); break;
                    default:
                        await rg.WriteAsync<double>(dataFields[i], values.Select(v => v is double d && double.IsFinite(d) ? d : (double?)null).ToArray());
                        break;
                }
            }
        });

    /// <summary>
    /// The grouped count table: the count-table columns with a leading <c>group</c> string column, groups one after
    /// another in the given order, ranks within each group; footer as a count table's plus <c>rankfreq.group_key</c>.
    /// Token strings of types counted below <c>meta.RedactedBelow</c> are written as null.
    /// </summary>
    public static Task WriteGroupedCountsAsync(string path, IReadOnlyList<CountGroup> groups, bool hasIds, CountTableMetadata meta, string groupKey,
        CancellationToken ct = default) =>
        AtomicFile.WriteAsync(path, stream =>
        {
            var columns = new List<FlatColumn> { new("group", FlatType.String), new("token", FlatType.String, Nullable: true) };
            if (hasIds) columns.Add(new("token_id", FlatType.Int32));
            columns.Add(new("count", FlatType.Int64));
            columns.Add(new("rank", FlatType.Int64));
            var footer = meta.ToFooter();
            footer["rankfreq.group_key"] = groupKey;
            using var w = new FlatParquetWriter(stream, columns) { Metadata = footer, CreatedBy = $"rankfreq {meta.ToolVersion}" };
            foreach (var g in groups)
                foreach (var b in g.Rows.Batches())
                {
                    ct.ThrowIfCancellationRequested();
                    var data = new List<Array> { Enumerable.Repeat<string?>(g.Group, b.Counts.Length).ToArray() };
                    data.AddRange(CountTableFile.BatchColumns(b, hasIds, meta.RedactedBelow));
                    w.WriteRowGroup(b.Counts.Length, data);
                }
            w.Finish();
            return Task.CompletedTask;
        });
}
