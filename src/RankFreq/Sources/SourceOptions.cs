namespace RankFreq.Sources;

/// <summary>How inputs are found and read.</summary>
/// <param name="Format">Input format, or <see cref="InputFormat.Auto"/>.</param>
/// <param name="TextField">JSON Lines field holding the text; dots descend into nested objects.</param>
/// <param name="TextColumn">Parquet column holding the text.</param>
/// <param name="MaxRecordBytes">Longest JSON Lines record accepted.</param>
/// <param name="Strict">Make a malformed JSON Lines record an error instead of skipping it.</param>
/// <param name="Include">Glob patterns a file inside a folder must match (empty: all).</param>
/// <param name="Exclude">Glob patterns that drop files inside a folder.</param>
public sealed record SourceOptions(
    InputFormat Format = InputFormat.Auto,
    string TextField = "text",
    string TextColumn = "text",
    long MaxRecordBytes = 64L << 20,
    bool Strict = false,
    IReadOnlyList<string>? Include = null,
    IReadOnlyList<string>? Exclude = null)
{
    /// <summary>Compressed files at least this large (stored size) are decompressed on a second thread while counting.</summary>
    public long ReadAheadAboveBytes { get; init; } = 4L << 20;

    /// <summary>Per-record group key (<c>field:</c> or <c>column:</c>), reported to an <see cref="IGroupSink"/> before each record.</summary>
    public GroupKey? Group { get; init; }

    /// <summary>Skip (and count) records whose group value cannot be binned instead of failing.</summary>
    public bool SkipBadGroupValues { get; init; }

    /// <summary>Files and folders never taken from a folder input: a job's own outputs, so that a second run over a
    /// folder holding them does not read the first run's tables.</summary>
    public IReadOnlyList<string>? SkipPaths { get; init; }

    /// <summary>These options with <paramref name="path"/> added to <see cref="SkipPaths"/>.</summary>
    public SourceOptions Skipping(string path) => this with { SkipPaths = [.. SkipPaths ?? [], path] };
}
