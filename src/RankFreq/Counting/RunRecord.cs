namespace RankFreq.Counting;

/// <summary>A type in a spill run: key bytes, count, first position, vocabulary id.</summary>
internal sealed record RunRecord(byte[] Key, long Count, long First, int Id);
