using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>An input as recorded in the count table metadata.</summary>
public sealed record InputInfo(string Path, long Bytes);
