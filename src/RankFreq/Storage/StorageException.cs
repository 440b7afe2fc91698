using RankFreq.Primitives;

namespace RankFreq.Storage;

/// <summary>Output that cannot be written.</summary>
public sealed class StorageException(string message, Exception? inner = null) : RankFreqException(message, inner);
