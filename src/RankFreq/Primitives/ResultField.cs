using System.Globalization;

namespace RankFreq.Primitives;

/// <summary>
/// One field of a result, listed once: its stable snake_case name, how it is stored, how it is read from the result,
/// and how a person sees it. Parquet columns, JSON documents, the console and the HTML tables are all generated from
/// these lists, so a field's name and meaning cannot drift between outputs.
/// </summary>
/// <typeparam name="T">The result type.</typeparam>
/// <param name="Name">snake_case name: Parquet column and JSON key.</param>
/// <param name="Kind">Storage kind.</param>
/// <param name="Get">Reads the value: long?/int for Integer, double for Real, string? for Text, bool for Flag.</param>
/// <param name="Label">Words for a person (console, report).</param>
/// <param name="Format">.NET format string for display of numbers ("F3", "N0", …).</param>
/// <param name="Shown">False for fields that are only for machines (they still go to JSON and Parquet).</param>
public sealed record ResultField<T>(string Name, FieldKind Kind, Func<T, object?> Get, string Label, string Format = "", bool Shown = true)
{
    /// <summary>The value as stored: null for a non-finite real or a missing value; integers widened to long.</summary>
    public object? Stored(T item) => Normalize(Kind, Get(item));

    /// <summary>The value as a person reads it: "–" where undefined.</summary>
    public string Display(T item)
    {
        var v = Stored(item);
        return v switch
        {
            null => "–",
            double d => d.ToString(Format.Length > 0 ? Format : "G6", CultureInfo.InvariantCulture),
            long l => l.ToString(Format.Length > 0 ? Format : "N0", CultureInfo.InvariantCulture),
            bool b => b ? "yes" : "no",
            IDictionary<string, object?> map => string.Join(", ", map.Select(kv =>
                $"{kv.Key}={(kv.Value is double x ? x.ToString("G6", CultureInfo.InvariantCulture) : kv.Value?.ToString() ?? "–")}")),
            _ => v.ToString() ?? "–",
        };
    }

    /// <summary>The same field read through a projection (e.g. from a (group, result) row).</summary>
    public ResultField<TOuter> From<TOuter>(Func<TOuter, T> project) =>
        new(Name, Kind, o => Get(project(o)), Label, Format, Shown);

    internal static object? Normalize(FieldKind kind, object? v) => (kind, v) switch
    {
        (_, null) => null,
        (FieldKind.Real, double d) => double.IsFinite(d) ? d : null,
        (FieldKind.Real, float f) => float.IsFinite(f) ? (double)f : null,
        (FieldKind.Integer, int i) => (long)i,
        (FieldKind.Integer, ulong u) => unchecked((long)u),
        (FieldKind.Integer, double d) => double.IsFinite(d) ? (long)Math.Round(d) : null,
        _ => v,
    };
}
