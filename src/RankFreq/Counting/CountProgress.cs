using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>Progress of a counting run.</summary>
/// <param name="DoneBytes">Stored bytes consumed.</param>
/// <param name="TotalBytes">Stored bytes in all (0 when unknown, e.g. standard input).</param>
/// <param name="Tokens">Tokens counted so far.</param>
/// <param name="Elapsed">Time since start.</param>
public readonly record struct CountProgress(long DoneBytes, long TotalBytes, long Tokens, TimeSpan Elapsed);
