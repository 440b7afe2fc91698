namespace RankFreq.Sources;

/// <summary>Receives decoded text from a source: valid UTF-8, in blocks that never end inside a character.</summary>
public interface ITextSink
{
    /// <summary>A block of text; <paramref name="endOfDocument"/> marks the end of a file, record or cell.</summary>
    void Write(ReadOnlySpan<byte> utf8, bool endOfDocument);
}

/// <summary>Where a tokenizer allows a long plain-text file to be cut into ranges counted in parallel.</summary>
public enum RangeCut
{
    /// <summary>Never: the file is read whole by one worker.</summary>
    None,
    /// <summary>After any newline (no token spans a newline).</summary>
    AnyNewline,
    /// <summary>After a newline followed by an ASCII letter (a chunk boundary of the r50k, cl100k and o200k rules).</summary>
    NewlineBeforeAsciiLetter,
}

/// <summary>Input formats.</summary>
public enum InputFormat
{
    /// <summary>Guess from content and extension.</summary>
    Auto,
    /// <summary>Plain UTF-8 text.</summary>
    Text,
    /// <summary>JSON Lines, text in a (dotted) field.</summary>
    JsonLines,
    /// <summary>Parquet, text in a string column.</summary>
    Parquet,
}

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
}

/// <summary>Bad or unreadable input: the message names the file and, where known, the line or byte offset.</summary>
public sealed class SourceException(string message, Exception? inner = null) : Exception(message, inner);

/// <summary>Counters a reader keeps; one per worker, added up at the end.</summary>
public sealed class SourceStats
{
    /// <summary>Bytes read from inputs as stored (compressed size for compressed files).</summary>
    public long StoredBytes;
    /// <summary>Bytes of text after decompression.</summary>
    public long TextBytes;
    /// <summary>Bytes of invalid UTF-8 replaced by U+FFFD.</summary>
    public long ReplacedBytes;
    /// <summary>JSON Lines records or Parquet cells read.</summary>
    public long Records;
    /// <summary>Malformed JSON Lines records skipped.</summary>
    public long MalformedRecords;
    /// <summary>Records without the text field (or with a non-string value).</summary>
    public long MissingField;
    /// <summary>Records skipped because their group value could not be binned (with --skip-bad).</summary>
    public long BadGroupValues;

    /// <summary>Adds another worker's counters.</summary>
    public void Add(SourceStats o)
    {
        StoredBytes += o.StoredBytes; TextBytes += o.TextBytes; ReplacedBytes += o.ReplacedBytes;
        Records += o.Records; MalformedRecords += o.MalformedRecords; MissingField += o.MissingField;
        BadGroupValues += o.BadGroupValues;
    }
}
