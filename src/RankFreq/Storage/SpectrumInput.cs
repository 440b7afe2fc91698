using System.Globalization;
using System.Text;
using Parquet;
using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Storage;

/// <summary>Loads a frequency spectrum for fitting: from a count table, a spectrum table, or a plain text list
/// counted elsewhere.</summary>
public static class SpectrumInput
{
    private const int PeekBytes = 8192;

    /// <summary>
    /// Reads <paramref name="path"/> ("-" for standard input): a count table (Parquet, from <c>count</c>, or any Parquet
    /// table with a count column, one row per type, as a SQL merge writes it), a spectrum table (Parquet with columns
    /// frequency and types, as <c>profile</c> or a SQL GROUP BY writes it), a folder of the Parquet parts of one such
    /// table (see <see cref="EngineTables"/>), or text lines, each one of: a count;
    /// "value types" (a spectrum line); "count token" (as <c>sort | uniq -c</c> prints; a token listed twice has its
    /// counts added). Separators are spaces, tabs, commas or semicolons; blank lines and lines starting with # are
    /// ignored, and a first line that does not start with a number is taken for a header and skipped. When some line
    /// has a token that is not a number, every two-field line of the file is read as "count token". Throws
    /// <see cref="FitInputException"/> naming the file and line on bad input; Notes says what was skipped or merged.
    /// </summary>
    public static async Task<(FrequencySpectrum Spectrum, string Description, IReadOnlyList<string> Notes)> LoadAsync(
        string path, CancellationToken ct = default)
    {
        try { return await LoadUncheckedAsync(path, ct); }
        catch (OverflowException e)
        {
            // counts whose total passes what a 64-bit count holds are bad input, not a bug
            throw new FitInputException($"{(path == "-" ? "standard input" : path)}: the counts add up to more than "
                + $"{long.MaxValue:N0} tokens, more than a count can hold; the input is damaged or not counts", e);
        }
    }

    private static async Task<(FrequencySpectrum Spectrum, string Description, IReadOnlyList<string> Notes)> LoadUncheckedAsync(
        string path, CancellationToken ct)
    {
        bool stdin = path == "-";
        string name = stdin ? "standard input" : path;
        byte[] head = new byte[PeekBytes];
        int n;
        Stream? input = null;
        if (stdin)
        {
            // the peek is replayed before the rest, so standard input is read once, as a stream
            input = Console.OpenStandardInput();
            n = await input.ReadAtLeastAsync(head, PeekBytes, throwOnEndOfStream: false, ct);
            input = new Sources.PrefixStream(head[..n], input);
        }
        else
        {
            if (Directory.Exists(path)) return await LoadPartsAsync(EngineTables.Parts(path), ct);
            if (!File.Exists(path)) throw new FitInputException($"{path}: no such file");
            using var fs = File.OpenRead(path);
            n = await fs.ReadAtLeastAsync(head, PeekBytes, throwOnEndOfStream: false, ct);
        }
        if (n >= 4 && head[0] == 'P' && head[1] == 'A' && head[2] == 'R' && head[3] == '1')
        {
            if (stdin) throw new FitInputException("standard input: Parquet data can only be read from a file; pass its name");
            return await LoadParquetAsync(path, ct);
        }
        if (Array.IndexOf(head, (byte)0, 0, n) >= 0)
            throw new FitInputException($"{name}: not a text list of counts (binary file)");
        var lines = input is not null ? ReadLines(input) : File.ReadLines(path);
        return ParseLines(lines, name);
    }

    private static IEnumerable<string> ReadLines(Stream input)
    {
        using var r = new StreamReader(input, Encoding.UTF8);
        while (r.ReadLine() is { } line) yield return line;
    }

    private static async Task<(FrequencySpectrum, string, IReadOnlyList<string>)> LoadParquetAsync(string path, CancellationToken ct)
    {
        var (spectrum, description) = await EngineTables.LoadAsync([path], ct);
        if (!await EngineTables.IsRankFreqCountTableAsync(path, ct)) return (spectrum, description, []);
        // a RankFreq count table: the spectrum from its count column alone (reading the token strings too took four
        // times as long on a table of 23 M types), the description from its footer
        string tokenizer;
        long tokens;
        try
        {
            await using var r = await CountTableFile.OpenAsync(path, ct);
            (tokenizer, tokens) = (r.Metadata.Tokenizer, r.Metadata.Tokens);
        }
        catch (StorageException e) { throw new FitInputException(e.Message, e); }
        return (spectrum, $"count table ({tokenizer}, {tokens:N0} tokens)", []);
    }

    /// <summary>A folder of Parquet parts read as one table. RankFreq's own count tables are separate tables (shards,
    /// say): their rows are not types of one table until merged by token, so a folder of several is refused.</summary>
    private static async Task<(FrequencySpectrum, string, IReadOnlyList<string>)> LoadPartsAsync(IReadOnlyList<string> parts,
        CancellationToken ct)
    {
        if (parts.Count == 1) return await LoadParquetAsync(parts[0], ct);
        foreach (var p in parts)
            if (await EngineTables.IsRankFreqCountTableAsync(p, ct))
                throw new FitInputException($"{p}: a count table of its own among {parts.Count} in one folder; the same "
                    + "token may be counted in several, so merge the tables by token first and fit the merged table");
        var (spectrum, description) = await EngineTables.LoadAsync(parts, ct);
        return (spectrum, description, []);
    }

    /// <summary>One content line: its number, the first field, and the rest (a second number or a token).</summary>
    private readonly record struct Line(int Number, string First, string Rest);

    private static (FrequencySpectrum, string, IReadOnlyList<string>) ParseLines(IEnumerable<string> text, string name)
    {
        var notes = new List<string>();
        var lines = new List<Line>();
        int lineNo = 0;
        foreach (var raw in text)
        {
            lineNo++;
            var line = raw.Trim();
            if (line.Length == 0 || line[0] == '#') continue;
            int sep = line.IndexOfAny([',', ' ', '\t', ';']);
            string first = sep < 0 ? line : line[..sep], rest = sep < 0 ? "" : line[(sep + 1)..].Trim(' ', '\t', ',', ';');
            if (lines.Count == 0 && notes.Count == 0 && !char.IsAsciiDigit(first[0]) && first[0] != '-')
            {
                notes.Add($"{name}:{lineNo}: '{Trunc(line)}' read as a header and skipped");
                continue;
            }
            lines.Add(new Line(lineNo, first, rest));
        }
        if (lines.Count == 0)
            throw new FitInputException($"{name}: no counts found (expected one integer a line, 'value types' or 'count token' lines)");

        // one token that is not a number makes the file a token list (uniq -c of numbers looks like spectrum lines)
        bool tokens = lines.Any(l => l.Rest.Length > 0 && !IsInteger(l.Rest));
        var pairs = new List<(long, long)>();
        var byToken = new Dictionary<string, (long Count, int Line)>(StringComparer.Ordinal);
        int repeated = 0;
        string? firstRepeat = null;
        foreach (var l in lines)
        {
            long value = ParsePositive(l.First, name, l.Number, "count");
            if (l.Rest.Length == 0) { pairs.Add((value, 1)); continue; }
            if (!tokens)
            {
                if (l.Rest.IndexOfAny([',', ' ', '\t', ';']) >= 0)
                    throw new FitInputException($"{name}:{l.Number}: expected a count, 'value types' or 'count token', "
                        + $"got '{Trunc(l.First + " " + l.Rest)}'");
                pairs.Add((value, ParsePositive(l.Rest, name, l.Number, "number of types")));
                continue;
            }
            if (byToken.TryGetValue(l.Rest, out var seen))
            {
                repeated++;
                firstRepeat ??= $"'{Trunc(l.Rest)}' on lines {seen.Line} and {l.Number}";
                byToken[l.Rest] = (seen.Count + value, seen.Line);
            }
            else byToken[l.Rest] = (value, l.Number);
        }
        if (repeated > 0)
            notes.Add($"{name}: {repeated:N0} token line{(repeated == 1 ? " repeats" : "s repeat")} an earlier token "
                + $"(first: {firstRepeat}); their counts were added");
        pairs.AddRange(byToken.Values.Select(v => (v.Count, 1L)));
        return (FrequencySpectrum.FromPairs(pairs), tokens ? "token list" : "count list", notes);
    }


    private static bool IsInteger(string s) => long.TryParse(s, NumberStyles.AllowLeadingSign, CultureInfo.InvariantCulture, out _);

    private static long ParsePositive(string s, string path, int line, string what)
    {
        if (!long.TryParse(s, NumberStyles.None, CultureInfo.InvariantCulture, out long v))
        {
            if (double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out double d))
                throw new FitInputException(d < 0 ? $"{path}:{line}: negative {what} {s}" : $"{path}:{line}: {what} {s} is not an integer");
            if (s.StartsWith('-')) throw new FitInputException($"{path}:{line}: negative {what} {Trunc(s)}");
            throw new FitInputException($"{path}:{line}: '{Trunc(s)}' is not a {what}");
        }
        if (v == 0) throw new FitInputException($"{path}:{line}: {what} 0 (counts must be positive)");
        return v;
    }

    /// <summary>At most 40 characters, control characters shown as '?', so a message stays one printable line.</summary>
    private static string Trunc(string s)
    {
        var t = s.Length > 40 ? s[..40] + "…" : s;
        return string.Concat(t.Select(c => char.IsControl(c) ? '?' : c));
    }
}
