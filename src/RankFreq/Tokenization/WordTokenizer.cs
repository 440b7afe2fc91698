using RankFreq.Primitives;
using System.Runtime.Intrinsics;

namespace RankFreq.Tokenization;

/// <summary>
/// The <c>words</c> rule: a token is a maximal run of letters (L*), combining marks (M*) and decimal digits (Nd);
/// an apostrophe (U+0027 or U+2019) with a word character before it and a letter or digit after it stays inside;
/// every Han ideograph is a token of its own; each token is NFC-normalised and, unless case is kept, lower-cased
/// with the invariant culture.
/// </summary>
/// <remarks>
/// Works on UTF-8 bytes; pure-ASCII tokens (the common case) take a table-driven path with no decoding.
/// Scripts written without spaces other than Han (Thai, Lao, Khmer, Japanese kana) come out as one token per
/// unbroken run of letters, i.e. per phrase, not per word: this rule does no dictionary segmentation.
/// A run longer than <see cref="MaxTokenBytes"/> is cut into pieces of that size so memory stays bounded.
/// </remarks>
public sealed partial class WordTokenizer(bool keepCase) : ITokenizer
{
    /// <summary>Longest token kept whole, in UTF-8 bytes.</summary>
    public const int MaxTokenBytes = 64 * 1024;

    /// <inheritdoc/>
    public string Spec => keepCase ? "words:keep-case" : "words";
    /// <inheritdoc/>
    public string Normalization => "NFC";
    /// <inheritdoc/>
    public string CaseRule => keepCase ? "kept" : "folded";
    /// <inheritdoc/>
    public TokenIdentity Identity => TokenIdentity.Bytes;
    /// <inheritdoc/>
    public int VocabularySize => 0;
    /// <inheritdoc/>
    public Sources.RangeCut RangeCut => Sources.RangeCut.AnyNewline;
    /// <inheritdoc/>
    public string DisplayToken(int id) => throw new NotSupportedException();
    /// <inheritdoc/>
    public ITokenizerSession CreateSession(ITokenSink sink) => new Session(sink, keepCase, !ScalarOnly && Vector128.IsHardwareAccelerated);

    /// <summary>Uses only the byte-at-a-time path (tests compare it with the vectorised one).</summary>
    internal bool ScalarOnly { get; init; }

    private sealed partial class Session(ITokenSink sink, bool keepCase, bool vectorized) : ITokenizerSession
    {
        private ulong[] _bits = new ulong[2 * ((1 << 20) / 64 + 2)];
        private readonly HoldBack<byte> _held = new();
        private byte[] _bytes = new byte[256];
        private char[] _chars = new char[256];
        private char[] _chars2 = new char[256];

        public void Feed(ReadOnlySpan<byte> utf8, bool endOfDocument) => Process(_held.Join(utf8), endOfDocument);

        private void Process(ReadOnlySpan<byte> s, bool eod)
        {
            if (vectorized) ProcessVector(s, eod);
            else Scalar(s, 0, eod, false);
            if (_batchLen > 0) Flush();
        }
    }
}
