namespace RankFreq.Sources;

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
