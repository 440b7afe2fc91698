namespace RankFreq.Cli;

/// <summary>Warns when an output name hides what the file is (Parquet under "x.txt" opens as noise elsewhere).</summary>
internal static class OutputName
{
    public static void WarnIfNotParquet(TextWriter stderr, string? path, string what)
    {
        if (path is null || path.EndsWith(".parquet", StringComparison.OrdinalIgnoreCase)) return;
        stderr.WriteLine($"rankfreq: warning: {path}: {what} is written as Parquet, but the name does not end in .parquet");
    }
}
