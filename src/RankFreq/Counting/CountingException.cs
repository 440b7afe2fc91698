using RankFreq.Primitives;

namespace RankFreq.Counting;

/// <summary>Errors of the counting stage (memory, temporary files, incompatible tables).</summary>
public sealed class CountingException(string message, Exception? inner = null) : RankFreqException(message, inner);
