namespace RankFreq.Primitives;

/// <summary>How a result field is stored: the Parquet column type and the JSON value kind follow from it.</summary>
public enum FieldKind
{
    /// <summary>A whole number (int64; null where undefined).</summary>
    Integer,
    /// <summary>A real number (double; written as null where not finite).</summary>
    Real,
    /// <summary>Text (null allowed).</summary>
    Text,
    /// <summary>True or false.</summary>
    Flag,
    /// <summary>A nested list or object: JSON only, not a column.</summary>
    Nested,
}
