namespace RankFreq.Comparison;

/// <summary>A vocabulary entry the text never produced.</summary>
/// <param name="Id">Vocabulary id.</param>
/// <param name="Token">Readable form (valid UTF-8 as is, other bytes as \xHH).</param>
public sealed record UnseenEntry(int Id, string Token);
