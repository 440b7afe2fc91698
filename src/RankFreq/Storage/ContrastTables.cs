using RankFreq.Comparison;
using RankFreq.Counting;

namespace RankFreq.Storage;

/// <summary>Parquet tables of a contrast: groups, pairs, and the grouped count table.</summary>
public static class ContrastTables
{
    /// <summary>One row per group, columns from <see cref="ContrastFields.GroupFlat"/> (NaN written as null).</summary>
    public static Task WriteGroupsAsync(string path, ContrastResult r, CancellationToken ct = default) =>
        FieldTableFile.WriteAsync(path, "contrast_groups", ContrastFields.GroupFlat, r.Groups, ct);

    /// <summary>One row per pair, columns from <see cref="ContrastFields.PairFlat"/>.</summary>
    public static Task WritePairsAsync(string path, ContrastResult r, CancellationToken ct = default) =>
        FieldTableFile.WriteAsync(path, "contrast_pairs", ContrastFields.PairFlat, r.Pairs, ct);

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
            columns.Add(new("count", FlatType.Int64, Delta: true));
            columns.Add(new("rank", FlatType.Int64, Delta: true));
            var footer = meta.ToFooter();
            footer["rankfreq.group_key"] = groupKey;
            using var w = new FlatParquetWriter(stream, columns) { Metadata = footer, CreatedBy = $"rankfreq {meta.ToolVersion}" };
            foreach (var g in groups)
                foreach (var b in RowGroups.Of(g.Rows.Batches()))
                {
                    ct.ThrowIfCancellationRequested();
                    var data = new List<object> { Enumerable.Repeat<string?>(g.Group, b.Counts.Length).ToArray() };
                    data.AddRange(CountTableFile.BatchColumns(b, hasIds, meta.RedactedBelow));
                    w.WriteRowGroup(b.Counts.Length, data);
                }
            w.Finish();
            return Task.CompletedTask;
        });
}
