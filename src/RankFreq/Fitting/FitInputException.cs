using RankFreq.Primitives;

namespace RankFreq.Fitting;

/// <summary>Input that cannot be fitted (not a count table, bad counts, an empty list).</summary>
public sealed class FitInputException(string message, Exception? inner = null) : RankFreqException(message, inner);
