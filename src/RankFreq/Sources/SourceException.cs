using RankFreq.Primitives;

namespace RankFreq.Sources;

/// <summary>Bad or unreadable input: the message names the file and, where known, the line or byte offset.</summary>
public sealed class SourceException(string message, Exception? inner = null) : RankFreqException(message, inner);
