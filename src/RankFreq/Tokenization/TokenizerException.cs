using RankFreq.Primitives;

namespace RankFreq.Tokenization;

/// <summary>A bad tokenizer spec or vocabulary file.</summary>
public sealed class TokenizerException(string message, Exception? inner = null) : RankFreqException(message, inner);
