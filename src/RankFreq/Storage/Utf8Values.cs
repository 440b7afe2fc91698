using RankFreq.Counting;

namespace RankFreq.Storage;

/// <summary>A string column's values for <see cref="FlatParquetWriter"/> as UTF-8, with the rows to write as null.</summary>
/// <param name="Tokens">The values' bytes.</param>
/// <param name="IsNull">Rows written as null (redacted), or null when every row has its value.</param>
internal sealed record Utf8Values(Utf8Tokens Tokens, bool[]? IsNull);
