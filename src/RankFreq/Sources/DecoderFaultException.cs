namespace RankFreq.Sources;

/// <summary>
/// A fault raised inside a decompressor while it decoded input: the data is corrupt or truncated. Only
/// <see cref="DecoderGuardStream"/> raises it, so a fault in RankFreq's own code is never mistaken for bad data.
/// </summary>
public sealed class DecoderFaultException(Exception inner) : IOException(inner.Message, inner);
