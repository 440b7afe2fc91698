using RankFreq.Primitives;
using System.Buffers;
using System.Text;

namespace RankFreq.Tokenization;

/// <summary>The <c>whitespace</c> rule: a token is a maximal run of characters that are not Unicode White_Space; bytes kept as they are.</summary>
public sealed class WhitespaceTokenizer : ITokenizer
{
    /// <inheritdoc/>
    public string Spec => "whitespace";
    /// <inheritdoc/>
    public string Normalization => "none";
    /// <inheritdoc/>
    public string CaseRule => "kept";
    /// <inheritdoc/>
    public TokenIdentity Identity => TokenIdentity.Bytes;
    /// <inheritdoc/>
    public int VocabularySize => 0;
    /// <inheritdoc/>
    public Sources.RangeCut RangeCut => Sources.RangeCut.AnyNewline;
    /// <inheritdoc/>
    public string DisplayToken(int id) => throw new NotSupportedException();
    /// <inheritdoc/>
    public ITokenizerSession CreateSession(ITokenSink sink) => new Session(sink);

    private sealed class Session(ITokenSink sink) : ITokenizerSession
    {
        private readonly HoldBack<byte> _held = new();

        public void Feed(ReadOnlySpan<byte> s, bool eod)
        {
            int i = 0, start = -1;
            if (_held.Length > 0)
            {
                // Extend the held token up to the first white space of this block.
                int j = 0;
                while (j < s.Length && !IsSpaceAt(s, j, out _)) j += Step(s, j);
                _held.Append(s[..j]);
                if (j == s.Length && !eod && _held.Length <= WordTokenizer.MaxTokenBytes) return;
                sink.AddToken(_held.Held);
                _held.Clear();
                i = j;
            }
            while (i < s.Length)
            {
                bool space = IsSpaceAt(s, i, out int len);
                if (space)
                {
                    if (start >= 0) { sink.AddToken(s[start..i]); start = -1; }
                }
                else if (start < 0) start = i;
                i += len;
            }
            if (start >= 0)
            {
                if (eod) sink.AddToken(s[start..]);
                else _held.Append(s[start..]);
            }
        }

        private static int Step(ReadOnlySpan<byte> s, int i)
        {
            if (s[i] < 0x80) return 1;
            Rune.DecodeFromUtf8(s[i..], out _, out int len);
            return Math.Max(1, len);
        }

        private static bool IsSpaceAt(ReadOnlySpan<byte> s, int i, out int len)
        {
            byte b = s[i];
            if (b < 0x80) { len = 1; return b is (byte)' ' or (byte)'\t' or (byte)'\n' or (byte)'\r' or 0x0B or 0x0C; }
            Rune.DecodeFromUtf8(s[i..], out Rune r, out len);
            len = Math.Max(1, len);
            return Rune.IsWhiteSpace(r);
        }
    }
}
