namespace RankFreq.Sources;

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

    /// <summary>Top-level field names of the first records that lacked the text field, in order of first sight.</summary>
    public List<string> FieldsSeen { get; } = [];

    /// <summary>Adds another worker's counters.</summary>
    public void Add(SourceStats o)
    {
        foreach (var f in o.FieldsSeen) if (!FieldsSeen.Contains(f)) FieldsSeen.Add(f);
        StoredBytes += o.StoredBytes; TextBytes += o.TextBytes; ReplacedBytes += o.ReplacedBytes;
        Records += o.Records; MalformedRecords += o.MalformedRecords; MissingField += o.MissingField;
        BadGroupValues += o.BadGroupValues;
    }
}
