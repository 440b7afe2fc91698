using System.Globalization;
using System.Text;
using System.Text.Json;

namespace RankFreq.Sources;

/// <summary>What a document's group is taken from.</summary>
public enum GroupKind
{
    /// <summary>The input file's path.</summary>
    File,
    /// <summary>The folder holding the input file.</summary>
    Folder,
    /// <summary>A JSON Lines field (dots descend into nested objects).</summary>
    Field,
    /// <summary>A Parquet column.</summary>
    Column,
    /// <summary>A two-column table of (path, group) read from a file.</summary>
    Table,
}

/// <summary>Receives the group of the documents that follow; called between documents, never inside one.</summary>
public interface IGroupSink
{
    /// <summary>The documents written from now on belong to <paramref name="label"/>.</summary>
    void BeginGroup(string label);
}

/// <summary>
/// A grouping key for <c>contrast --by</c>: <c>file</c>, <c>folder</c>, <c>field:NAME</c>, <c>column:NAME</c>, or
/// <c>field:NAME/WIDTH</c> (a numeric field binned into intervals [k·WIDTH, (k+1)·WIDTH), labelled <c>1750–1799</c>
/// for WIDTH 50); or a table of (path, group) from <c>--groups FILE</c>. Documents without the key fall in the
/// group <see cref="Missing"/>.
/// </summary>
/// <param name="Kind">Where the group comes from.</param>
/// <param name="Name">Field or column name (dotted path for nested JSON).</param>
/// <param name="BinWidth">Bin width for a numeric field (0: the value itself is the label).</param>
/// <param name="Table">Full path → group, for <see cref="GroupKind.Table"/>.</param>
/// <param name="Spec">The key as the user wrote it.</param>
public sealed record GroupKey(GroupKind Kind, string Name, double BinWidth, IReadOnlyDictionary<string, string>? Table, string Spec)
{
    /// <summary>The group of documents that lack the key.</summary>
    public const string Missing = "(missing)";

    /// <summary>Whether the group is a property of a whole file (as opposed to one per record).</summary>
    public bool PerFile => Kind is GroupKind.File or GroupKind.Folder or GroupKind.Table;

    /// <summary>The dotted field path split into names.</summary>
    internal string[] Path => Name.Split('.');

    /// <summary>Parses a <c>--by</c> value; throws <see cref="FormatException"/> with the accepted forms.</summary>
    public static GroupKey Parse(string spec)
    {
        const string forms = "use file, folder, field:NAME, field:NAME/WIDTH or column:NAME";
        string s = spec.Trim();
        if (s == "file") return new(GroupKind.File, "", 0, null, s);
        if (s == "folder") return new(GroupKind.Folder, "", 0, null, s);
        int colon = s.IndexOf(':');
        string kind = colon < 0 ? s : s[..colon], rest = colon < 0 ? "" : s[(colon + 1)..];
        if (kind is not ("field" or "column")) throw new FormatException($"--by: unknown group key '{spec}'; {forms}");
        if (rest.Length == 0) throw new FormatException($"--by: '{spec}' names no {kind}; {forms}");
        double width = 0;
        int slash = rest.LastIndexOf('/');
        if (slash >= 0)
        {
            if (!double.TryParse(rest[(slash + 1)..], NumberStyles.Float, CultureInfo.InvariantCulture, out width) || !(width > 0) || !double.IsFinite(width))
                throw new FormatException($"--by: bin width in '{spec}' must be a positive number (e.g. field:year/50)");
            rest = rest[..slash];
            if (rest.Length == 0) throw new FormatException($"--by: '{spec}' names no {kind}; {forms}");
        }
        return new(kind == "field" ? GroupKind.Field : GroupKind.Column, rest, width, null, s);
    }

    /// <summary>
    /// Reads a groups file: one <c>path,group</c> or <c>path&lt;TAB&gt;group</c> a line (split at the first tab, else
    /// the first comma; blank lines and lines starting with # ignored; a first line <c>path,group</c> is a header).
    /// Paths are relative to the current folder. Throws <see cref="SourceException"/> naming the file and line.
    /// </summary>
    public static GroupKey FromTable(string file)
    {
        string[] lines;
        try { lines = System.IO.File.ReadAllLines(file); }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        { throw new SourceException($"{file}: cannot read the groups file ({e.Message})", e); }
        var map = new Dictionary<string, string>(StringComparer.Ordinal);
        for (int i = 0; i < lines.Length; i++)
        {
            string line = lines[i].Trim();
            if (line.Length == 0 || line.StartsWith('#')) continue;
            int cut = line.IndexOf('\t');
            if (cut < 0) cut = line.IndexOf(',');
            if (cut <= 0 || cut == line.Length - 1) throw new SourceException($"{file}:{i + 1}: expected two columns, path and group");
            string path = line[..cut].Trim(), group = line[(cut + 1)..].Trim();
            if (map.Count == 0 && path == "path" && group == "group") continue;
            string full = System.IO.Path.GetFullPath(path);
            if (map.TryGetValue(full, out var prev) && prev != group)
                throw new SourceException($"{file}:{i + 1}: {path} is already in group '{prev}'");
            map[full] = group;
        }
        if (map.Count == 0) throw new SourceException($"{file}: the groups file lists no paths");
        return new(GroupKind.Table, "", 0, map, $"groups:{file}");
    }

    /// <summary>The group of a whole input file (for per-file keys).</summary>
    public string LabelOfFile(string path) => Kind switch
    {
        GroupKind.File => path,
        GroupKind.Folder => System.IO.Path.GetDirectoryName(path) is { Length: > 0 } d ? d : ".",
        GroupKind.Table => Table!.TryGetValue(System.IO.Path.GetFullPath(path), out var g) ? g : Missing,
        _ => throw new InvalidOperationException("the group of a record key depends on the record"),
    };

    /// <summary>The label of a numeric value: itself, or its bin.</summary>
    public string LabelOfNumber(double v)
    {
        if (BinWidth <= 0) return v.ToString("R", CultureInfo.InvariantCulture);
        double lo = Math.Floor(v / BinWidth) * BinWidth;
        string L(double x) => x.ToString("0.######", CultureInfo.InvariantCulture);
        bool whole = BinWidth == Math.Floor(BinWidth) && lo == Math.Floor(lo);
        return whole ? $"{L(lo)}–{L(lo + BinWidth - 1)}" : $"[{L(lo)}, {L(lo + BinWidth)})";
    }

    /// <summary>
    /// The label of a record's key value given as a JSON token: strings as they are (for a binned key they must hold
    /// a number), numbers as written (or their bin), true/false; null and absent values give <see cref="Missing"/>.
    /// Returns null and sets <paramref name="problem"/> when the value cannot be a group.
    /// </summary>
    internal string? LabelOfJson(JsonTokenType type, ReadOnlySpan<byte> raw, out string? problem)
    {
        problem = null;
        switch (type)
        {
            case JsonTokenType.None or JsonTokenType.Null: return Missing;
            case JsonTokenType.Number or JsonTokenType.String:
                string text = Encoding.UTF8.GetString(raw);
                if (BinWidth <= 0) return text.Length == 0 ? Missing : text;
                if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) && double.IsFinite(v)) return LabelOfNumber(v);
                problem = $"field '{Name}' is \"{Trim(text)}\", not a number, so it cannot be binned ({Spec})";
                return null;
            case JsonTokenType.True or JsonTokenType.False:
                if (BinWidth <= 0) return type == JsonTokenType.True ? "true" : "false";
                problem = $"field '{Name}' is {(type == JsonTokenType.True ? "true" : "false")}, not a number, so it cannot be binned ({Spec})";
                return null;
            default:
                problem = $"field '{Name}' holds an object or array, not a value that can name a group ({Spec})";
                return null;
        }
    }

    private static string Trim(string s) => s.Length <= 40 ? s : s[..40] + "…";

    /// <summary>
    /// Labels in report order: bins by their lower bound, numbers numerically, other labels in ordinal order;
    /// <see cref="Missing"/> last.
    /// </summary>
    public IReadOnlyList<string> Order(IEnumerable<string> labels)
    {
        static double Lead(string l)
        {
            string t = l.TrimStart('[');
            int end = 0;
            while (end < t.Length && (char.IsAsciiDigit(t[end]) || t[end] is '.' || (end == 0 && t[end] == '-'))) end++;
            return double.TryParse(t[..end], NumberStyles.Float, CultureInfo.InvariantCulture, out var v) ? v : double.NaN;
        }
        var list = labels.Where(l => l != Missing).ToList();
        bool numeric = Kind is GroupKind.Field or GroupKind.Column && list.Count > 0 && list.All(l => double.IsFinite(Lead(l)));
        var ordered = numeric ? list.OrderBy(Lead).ThenBy(l => l, StringComparer.Ordinal).ToList() : list.Order(StringComparer.Ordinal).ToList();
        if (labels.Contains(Missing)) ordered.Add(Missing);
        return ordered;
    }

    /// <summary>Finds the value at <paramref name="path"/> in a JSON object; type None when absent.</summary>
    internal static JsonTokenType FindValue(ReadOnlySpan<byte> json, string[] path, out byte[] raw)
    {
        raw = [];
        var r = new Utf8JsonReader(json);
        if (!r.Read() || r.TokenType != JsonTokenType.StartObject) return JsonTokenType.None;
        int level = 0;
        while (r.Read())
        {
            if (r.TokenType != JsonTokenType.PropertyName || r.CurrentDepth != level + 1 || !r.ValueTextEquals(path[level])) continue;
            r.Read();
            if (level == path.Length - 1)
            {
                var t = r.TokenType;
                if (t == JsonTokenType.String)
                {
                    var buf = new byte[r.HasValueSequence ? r.ValueSequence.Length : r.ValueSpan.Length];
                    raw = buf[..r.CopyString(buf)];
                }
                else if (t == JsonTokenType.Number) raw = r.ValueSpan.ToArray();
                return t;
            }
            if (r.TokenType == JsonTokenType.StartObject) level++;
            else r.Skip();
        }
        return JsonTokenType.None;
    }
}
