using System.Globalization;
using System.Text;
using Parquet;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Sources;

namespace RankFreq.Storage;

/// <summary>Loads a frequency spectrum for fitting: from a count table, a spectrum table, or a plain text list
/// counted elsewhere.</summary>
public static class SpectrumInput
{
    private const int PeekBytes = 8192;

    /// <summary>
    /// Reads <paramref name="path"/> ("-" for standard input): a count table (Parquet, from <c>count</c>), a spectrum
    /// table (Parquet with columns frequency and types, as <c>profile</c> writes), or text lines, each one of: a count;
    /// "value types" (a spectrum line); "count token" (as <c>sort | uniq -c</c> prints; a token listed twice has its
    /// counts added). Separators are spaces, tabs, commas or semicolons; blank lines and lines starting with # are
    /// ignored, and a first line that does not start with a number is taken for a header and skipped. When some line
    /// has a token that is not a number, every two-field line of the file is read as "count token". Throws
    /// <see cref="FitInputException"/> naming the file and line on bad input; Notes says what was skipped or merged.
    /// </summary>
    public static async Task<(FrequencySpectrum Spectrum, string Description, IReadOnlyList<string> Notes)> LoadAsync(
        string path, CancellationToken ct = default)
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
            if (Directory.Exists(path)) throw new FitInputException($"{path}: a folder; fit reads one count table or count list");
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
        await using (var raw = await OpenParquetAsync(path, ct))
        {
            var df = raw.Schema.GetDataFields();
            var freq = df.FirstOrDefault(f => f.Name == "frequency" && f.ClrType == typeof(long));
            var types = df.FirstOrDefault(f => f.Name == "types" && f.ClrType == typeof(long));
            if (freq is not null && types is not null && df.All(f => f.Name != "count"))
            {
                var pairs = new List<(long, long)>();
                for (int g = 0; g < raw.RowGroupCount; g++)
                {
                    var (f, t) = await ParquetPages.ReadAsync(path, g, async () =>
                    {
                        using var rg = raw.OpenRowGroupReader(g);
                        var f = new long[rg.RowCount];
                        var t = new long[rg.RowCount];
                        await rg.ReadAsync<long>(freq, f.AsMemory(), null, ct);
                        await rg.ReadAsync<long>(types, t.AsMemory(), null, ct);
                        return (f, t);
                    });
                    for (int i = 0; i < f.Length; i++)
                    {
                        if (f[i] <= 0 || t[i] <= 0)
                            throw new FitInputException($"{path}: row {pairs.Count + 1}: frequency {f[i]} with {t[i]} types (both must be positive)");
                        pairs.Add((f[i], t[i]));
                    }
                }
                if (pairs.Count == 0) throw new FitInputException($"{path}: the spectrum table has no rows");
                return (Spectrum(pairs, path), "spectrum table", []);
            }
        }
        try
        {
            await using var r = await CountTableFile.OpenAsync(path, ct);
            return (Sum(r.ReadSpectrum, path), $"count table ({r.Metadata.Tokenizer}, {r.Metadata.Tokens:N0} tokens)", []);
        }
        catch (StorageException e) { throw new FitInputException(e.Message, e); }
    }

    private static async Task<ParquetReader> OpenParquetAsync(string path, CancellationToken ct)
    {
        try
        {
            var r = await ParquetReader.CreateAsync(path, cancellationToken: ct);
            _ = r.Schema.GetDataFields(); // the schema is decoded when first asked for: a damaged one fails here
            return r;
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            throw new FitInputException($"{path}: not a readable Parquet file ({e.Message.Split('\n')[0]})", e);
        }
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
        return (Spectrum(pairs, name), tokens ? "token list" : "count list", notes);
    }

    private static FrequencySpectrum Spectrum(List<(long, long)> pairs, string name) => Sum(() => FrequencySpectrum.FromPairs(pairs), name);

    /// <summary>Counts whose total passes what a 64-bit count holds are bad input, not a bug.</summary>
    private static FrequencySpectrum Sum(Func<FrequencySpectrum> build, string name)
    {
        try { return build(); }
        catch (OverflowException e)
        {
            throw new FitInputException($"{name}: the counts add up to more than {long.MaxValue:N0} tokens, more than a count can hold; "
                + "the file is damaged or not a list of counts", e);
        }
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
