using System.Globalization;
using Parquet;
using Parquet.Schema;

namespace RankFreq.Sources;

/// <summary>Group labels of Parquet rows from a column (<c>--by column:NAME</c>).</summary>
internal static class ParquetGroups
{
    /// <summary>The column named by the key; throws <see cref="SourceException"/> listing the columns when absent.</summary>
    public static DataField Field(ParquetReader reader, string path, GroupKey key)
    {
        var fields = reader.Schema.GetDataFields();
        return fields.FirstOrDefault(d => d.Name == key.Name || d.Path.ToString() == key.Name)
            ?? throw new SourceException($"{path}: no column '{key.Name}' to group by (columns: {string.Join(", ", fields.Select(d => d.Name))})");
    }

    /// <summary>One label per row: null values give <see cref="GroupKey.Missing"/>, values that cannot be binned give null.</summary>
    public static string?[] Labels(string path, ParquetRowGroupReader rg, DataField f, GroupKey key, CancellationToken ct)
    {
        int n = (int)rg.RowCount;
        string?[] Numbers<T>(Func<T, double> toDouble) where T : struct
        {
            var v = new T?[n];
            rg.ReadAsync<T>(f, v.AsMemory(), null, ct).GetAwaiter().GetResult();
            return v.Select(x => x is { } y ? key.LabelOfNumber(toDouble(y)) : GroupKey.Missing).ToArray();
        }
        var t = f.ClrType;
        if (t == typeof(int)) return Numbers<int>(x => x);
        if (t == typeof(long)) return Numbers<long>(x => x);
        if (t == typeof(short)) return Numbers<short>(x => x);
        if (t == typeof(double)) return Numbers<double>(x => x);
        if (t == typeof(float)) return Numbers<float>(x => x);
        if (t == typeof(bool) && key.BinWidth <= 0)
        {
            var b = new bool?[n];
            rg.ReadAsync<bool>(f, b.AsMemory(), null, ct).GetAwaiter().GetResult();
            return b.Select(x => x is { } y ? (y ? "true" : "false") : GroupKey.Missing).ToArray();
        }
        if (t == typeof(string) || t == typeof(ReadOnlyMemory<char>))
        {
            var s = new string?[n];
            rg.ReadAsync(f, s.AsMemory(), null, ct).GetAwaiter().GetResult();
            return s.Select(x =>
            {
                if (string.IsNullOrEmpty(x)) return GroupKey.Missing;
                if (key.BinWidth <= 0) return x;
                return double.TryParse(x, NumberStyles.Float, CultureInfo.InvariantCulture, out var d) && double.IsFinite(d) ? key.LabelOfNumber(d) : null;
            }).ToArray();
        }
        throw new SourceException($"{path}: column '{key.Name}' holds {t.Name}, which cannot name a group{(key.BinWidth > 0 ? " or be binned" : "")}");
    }
}
