using RankFreq.Primitives;
using System.Globalization;
using Parquet;
using Parquet.Schema;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Sources;

namespace RankFreq.Storage;

/// <summary>
/// Reads count and spectrum tables that another engine wrote (a SQL merge of shard tables: Spark, DuckDB, …): no
/// RankFreq footer, columns found by name whatever their case, integers of any common width, nullable or not, and
/// a table split into part files (a folder of <c>*.parquet</c>, as a cluster job writes it).
/// </summary>
/// <remarks>
/// A count table is a <c>count</c> column, one row per type (other columns such as <c>token</c> or <c>token_id</c>
/// are not read); a spectrum table is <c>frequency</c> and <c>types</c> columns (rows with the same frequency are
/// added). Accepted column types: INT8–INT64 and their unsigned forms, and DECIMAL with scale 0 (what Spark's SUM
/// gives over decimals). Floating-point, string, 128-bit and fractional decimal columns are refused with one line
/// naming the file and the column; a null or non-positive value is refused with its file, column and row.
/// </remarks>
internal static class EngineTables
{
    /// <summary>The spectrum of <paramref name="files"/> read as one table, and a description of what was read.</summary>
    public static async Task<(FrequencySpectrum Spectrum, string Description)> LoadAsync(IReadOnlyList<string> files,
        CancellationToken ct)
    {
        var spectrum = new SpectrumBuilder();
        string? kind = null;
        long rows = 0;
        foreach (var path in files)
        {
            await using var r = await OpenAsync(path, ct);
            var fields = r.Schema.Fields.OfType<DataField>().ToList();
            DataField? count = Find(fields, "count"), freq = Find(fields, "frequency"), types = Find(fields, "types");
            string thisKind = count is not null ? "count" : freq is not null && types is not null ? "spectrum"
                : throw new FitInputException($"{path}: no column count (a count table) or frequency and types (a spectrum "
                    + $"table) among its top-level columns ({string.Join(", ", fields.Select(f => f.Name))})");
            if (kind is not null && thisKind != kind)
                throw new FitInputException($"{path}: a {thisKind} table, but {files[0]} is a {kind} table; "
                    + "the parts of one table must have the same columns");
            kind = thisKind;
            if (Find(fields, "group") is { } group)
                throw new FitInputException($"{path}: column {group.Name}: a grouped table mixes the types of several groups; "
                    + "fit one group at a time (select its rows, without the group column)");
            for (int g = 0; g < r.RowGroupCount; g++)
            {
                // a damaged page becomes one line naming the file and row group (Sources.ParquetPages)
                var (f, t, n) = await ParquetPages.ReadAsync<(long[], long[]?, long)>(path, g, async () =>
                {
                    using var rg = r.OpenRowGroupReader(g);
                    if (count is not null) return (await ReadPositiveAsync(rg, count, path, rows, ct), null, rg.RowCount);
                    return (await ReadPositiveAsync(rg, freq!, path, rows, ct), await ReadPositiveAsync(rg, types!, path, rows, ct),
                        rg.RowCount);
                });
                if (t is null) foreach (var c in f) spectrum.Add(c);
                else for (int i = 0; i < f.Length; i++) spectrum.Add(f[i], t[i]);
                rows += n;
            }
        }
        if (rows == 0) throw new FitInputException($"{files[0]}: the {kind} table has no rows");
        string parts = files.Count == 1 ? "" : $" in {files.Count} parts";
        return (spectrum.Build(), kind == "count" ? $"count table{parts}, {rows:N0} rows" : $"spectrum table{parts}");
    }

    /// <summary>The Parquet parts of a table folder: its <c>*.parquet</c> files (not those whose names start with _
    /// or .), in ordinal order.</summary>
    public static IReadOnlyList<string> Parts(string folder)
    {
        var parts = Directory.EnumerateFiles(folder, "*.parquet")
            .Where(p => Path.GetFileName(p) is var n && n[0] != '_' && n[0] != '.')
            .Order(StringComparer.Ordinal).ToList();
        if (parts.Count == 0)
            throw new FitInputException($"{folder}: a folder without .parquet files; fit reads one table (a file, or a "
                + "folder of the Parquet parts of one table) or a count list");
        return parts;
    }

    /// <summary>Whether the file's footer says RankFreq wrote it as a count table.</summary>
    public static async Task<bool> IsRankFreqCountTableAsync(string path, CancellationToken ct)
    {
        await using var r = await OpenAsync(path, ct);
        return r.CustomMetadata.ContainsKey("rankfreq.tokenizer");
    }

    private static async Task<ParquetReader> OpenAsync(string path, CancellationToken ct)
    {
        try
        {
            ParquetFooterCheck.ThrowIfDamaged(path); // a damaged footer can loop the Parquet decoder for ever
            var r = await ParquetReader.CreateAsync(path, cancellationToken: ct);
            _ = r.Schema.GetDataFields(); // the schema is decoded when first asked for: a damaged one fails here
            return r;
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            throw new FitInputException($"{path}: not a readable Parquet file ({e.Message.Split('\n')[0]})", e);
        }
    }

    /// <summary>A top-level column by name, ignoring case (engines and users differ: Count, COUNT).</summary>
    private static DataField? Find(List<DataField> fields, string name) =>
        fields.FirstOrDefault(f => f.Name == name) ?? fields.FirstOrDefault(f => string.Equals(f.Name, name, StringComparison.OrdinalIgnoreCase));

    /// <summary>One row group's values of an integer column as int64, each checked positive.</summary>
    private static async Task<long[]> ReadPositiveAsync(ParquetRowGroupReader rg, DataField f, string path, long rowBase,
        CancellationToken ct)
    {
        int n = checked((int)rg.RowCount);
        long[] v = f switch
        {
            DecimalDataField d when d.Scale == 0 => Widen(await ReadAsync<decimal>(rg, f, n, path, rowBase, ct), x => Exact(x, f, path)),
            DecimalDataField d => throw Refuse(f, path, $"DECIMAL({d.Precision},{d.Scale}) has a fractional part; cast it to BIGINT"),
            _ when f.ClrType == typeof(long) => await ReadAsync<long>(rg, f, n, path, rowBase, ct),
            _ when f.ClrType == typeof(int) => Widen(await ReadAsync<int>(rg, f, n, path, rowBase, ct), x => x),
            _ when f.ClrType == typeof(short) => Widen(await ReadAsync<short>(rg, f, n, path, rowBase, ct), x => x),
            _ when f.ClrType == typeof(sbyte) => Widen(await ReadAsync<sbyte>(rg, f, n, path, rowBase, ct), x => x),
            _ when f.ClrType == typeof(byte) => Widen(await ReadAsync<byte>(rg, f, n, path, rowBase, ct), x => x),
            _ when f.ClrType == typeof(ushort) => Widen(await ReadAsync<ushort>(rg, f, n, path, rowBase, ct), x => x),
            _ when f.ClrType == typeof(uint) => Widen(await ReadAsync<uint>(rg, f, n, path, rowBase, ct), x => x),
            _ when f.ClrType == typeof(ulong) => Widen(await ReadAsync<ulong>(rg, f, n, path, rowBase, ct),
                x => x <= long.MaxValue ? (long)x : throw Refuse(f, path, $"value {x} does not fit in a 64-bit count")),
            _ => throw Refuse(f, path, $"{Describe(f)} values are not whole-number counts; cast the column to BIGINT "
                + "(a SQL SUM of BIGINT is 128-bit in some engines)"),
        };
        for (int i = 0; i < v.Length; i++)
            if (v[i] <= 0)
                throw new FitInputException($"{path}: column {f.Name}, row {(rowBase + i + 1).ToString("N0", CultureInfo.InvariantCulture)}: "
                    + $"{v[i]} (counts, frequencies and types must be positive)");
        return v;
    }

    private static async Task<T[]> ReadAsync<T>(ParquetRowGroupReader rg, DataField f, int n, string path, long rowBase,
        CancellationToken ct) where T : struct
    {
        if (!f.IsNullable)
        {
            var plain = new T[n];
            await rg.ReadAsync<T>(f, plain.AsMemory(), null, ct);
            return plain;
        }
        var held = new T?[n];
        await rg.ReadAsync<T>(f, held.AsMemory(), null, ct);
        var values = new T[n];
        for (int i = 0; i < n; i++)
            values[i] = held[i] ?? throw new FitInputException($"{path}: column {f.Name}, row "
                + $"{(rowBase + i + 1).ToString("N0", CultureInfo.InvariantCulture)} is null (every row needs a value)");
        return values;
    }

    private static long[] Widen<T>(T[] values, Func<T, long> widen)
    {
        var r = new long[values.Length];
        for (int i = 0; i < r.Length; i++) r[i] = widen(values[i]);
        return r;
    }

    private static long Exact(decimal x, DataField f, string path) =>
        x >= long.MinValue && x <= long.MaxValue ? (long)x : throw Refuse(f, path, $"value {x} does not fit in a 64-bit count");

    private static FitInputException Refuse(DataField f, string path, string why) => new($"{path}: column {f.Name}: {why}");

    private static string Describe(DataField f) => f.ClrType == typeof(Int128) || f.ClrType == typeof(UInt128)
        ? "128-bit integer" : f.ClrType.Name;
}
