using RankFreq.Primitives;

namespace RankFreq.Cli;

/// <summary>Plain console tables from field lists.</summary>
internal static class ConsoleTable
{
    /// <summary>Label and value, one pair a line, labels padded to one width.</summary>
    public static void Pairs(TextWriter o, IReadOnlyList<(string Label, string Value)> pairs)
    {
        int w = pairs.Count == 0 ? 0 : pairs.Max(p => p.Label.Length);
        foreach (var (label, value) in pairs) o.WriteLine($"  {label.PadRight(w)}  {value}");
    }

    /// <summary>One row per item, one column per shown field, columns padded to their widest cell.</summary>
    public static void Rows<T>(TextWriter o, IReadOnlyList<ResultField<T>> fields, IReadOnlyList<T> items)
    {
        var shown = fields.Where(f => f.Shown).ToList();
        var cells = items.Select(i => shown.Select(f => f.Display(i)).ToArray()).ToList();
        var widths = shown.Select((f, c) => Math.Max(f.Label.Length, cells.Count == 0 ? 0 : cells.Max(r => r[c].Length))).ToArray();
        o.WriteLine("  " + string.Join("  ", shown.Select((f, c) => f.Label.PadRight(widths[c]))).TrimEnd());
        foreach (var r in cells) o.WriteLine("  " + string.Join("  ", r.Select((v, c) => v.PadRight(widths[c]))).TrimEnd());
    }
}
