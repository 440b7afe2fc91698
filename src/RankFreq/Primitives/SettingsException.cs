namespace RankFreq.Primitives;

/// <summary>
/// A setting that no input could make valid (an unknown tokenizer name, a shard number past the shard count): the
/// caller's mistake rather than the data's, so a command line reports it as a usage error.
/// </summary>
public sealed class SettingsException(string message, Exception? inner = null) : RankFreqException(message, inner);
