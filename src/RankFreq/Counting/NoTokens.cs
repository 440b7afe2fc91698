using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>Why a count found no tokens, in words that point at the fix (a wrong field name, only malformed
/// records, only binary files) rather than a bare "no tokens".</summary>
internal static class NoTokens
{
    public static string Message(IReadOnlyList<InputFile> files, IReadOnlyList<SkippedFile> skipped, SourceStats stats,
        SourceOptions source)
    {
        string where = files.Count == 1 ? files[0].Path : $"{files.Count} files";
        bool jsonl = files.Any(f => f.Format == InputFormat.JsonLines);
        if (stats.Records > 0 && stats.MissingField == stats.Records && jsonl)
            return $"{where}: {stats.Records:N0} record{(stats.Records == 1 ? " lacks" : "s lack")} a text field '{source.TextField}'"
                + (stats.FieldsSeen.Count > 0 ? $" (fields seen: {string.Join(", ", stats.FieldsSeen)}); use --text-field" : "");
        if (stats.Records > 0 && stats.MissingField == stats.Records)
            return $"{where}: all {stats.Records:N0} value{S(stats.Records)} of column '{source.TextColumn}' are empty (null)";
        if (stats.Records > 0 && stats.MalformedRecords + stats.MissingField == stats.Records)
            return $"{where}: no record could be read: {stats.MalformedRecords:N0} malformed, {stats.MissingField:N0} "
                + $"without a text field '{source.TextField}' (--strict stops at the first malformed one)";
        // the skipped files are named too: when every input was skipped, they are the only names there are
        return $"no tokens found in {string.Join(", ", files.Select(f => f.Path).Concat(skipped.Select(f => f.Path)))}"
            + (skipped.Count > 0 ? $" ({skipped.Count} file(s) skipped as binary)" : "");
    }

    private static string S(long n) => n == 1 ? "" : "s";
}
