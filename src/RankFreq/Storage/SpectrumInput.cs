using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Storage;

/// <summary>Loads a frequency spectrum for fitting: from a count table, or from a plain text list counted elsewhere.</summary>
public static class SpectrumInput
{
    /// <summary>
    /// A count table (Parquet, from <c>count</c>), or text with one count per line, or "value types" / "value,types"
    /// spectrum lines. Blank lines and lines starting with # are ignored. Throws <see cref="FitInputException"/>
    /// naming the file and line on bad input.
    /// </summary>
    public static async Task<(FrequencySpectrum Spectrum, string Description)> LoadAsync(string path, CancellationToken ct = default)
    {
        if (!File.Exists(path)) throw new FitInputException($"{path}: no such file");
        var head = new byte[4];
        using (var fs = File.OpenRead(path)) _ = fs.Read(head);
        if (head[0] == 'P' && head[1] == 'A' && head[2] == 'R' && head[3] == '1')
        {
            try
            {
                await using var r = await CountTableFile.OpenAsync(path, ct);
                return (r.ReadSpectrum(), $"count table ({r.Metadata.Tokenizer}, {r.Metadata.Tokens:N0} tokens)");
            }
            catch (StorageException e) { throw new FitInputException(e.Message, e); }
        }
        var pairs = new List<(long, long)>();
        int lineNo = 0;
        foreach (var raw in File.ReadLines(path))
        {
            lineNo++;
            var line = raw.Trim();
            if (line.Length == 0 || line[0] == '#') continue;
            var parts = line.Split([',', ' ', '\t', ';'], StringSplitOptions.RemoveEmptyEntries);
            if (parts.Length is < 1 or > 2)
                throw new FitInputException($"{path}:{lineNo}: expected a count, or 'value types', got '{Trunc(line)}'");
            long value = ParsePositive(parts[0], path, lineNo, "count");
            long types = parts.Length == 2 ? ParsePositive(parts[1], path, lineNo, "number of types") : 1;
            pairs.Add((value, types));
        }
        if (pairs.Count == 0) throw new FitInputException($"{path}: no counts found (expected one integer a line, or 'value types' lines)");
        return (FrequencySpectrum.FromPairs(pairs), "count list");
    }

    private static long ParsePositive(string s, string path, int line, string what)
    {
        if (!long.TryParse(s, NumberStyles.None, CultureInfo.InvariantCulture, out long v))
        {
            if (double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out double d))
                throw new FitInputException(d < 0 ? $"{path}:{line}: negative {what} {s}" : $"{path}:{line}: {what} {s} is not an integer");
            if (s.StartsWith('-')) throw new FitInputException($"{path}:{line}: negative {what} {s}");
            throw new FitInputException($"{path}:{line}: '{Trunc(s)}' is not a {what}");
        }
        if (v == 0) throw new FitInputException($"{path}:{line}: {what} 0 (counts must be positive)");
        return v;
    }

    private static string Trunc(string s) => s.Length > 40 ? s[..40] + "…" : s;
}
