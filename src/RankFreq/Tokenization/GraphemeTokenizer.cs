using RankFreq.Primitives;
using System.Buffers;
using System.Text;

namespace RankFreq.Tokenization;

/// <summary>The <c>chars</c> rule: every extended grapheme cluster (UAX #29) that is not white space is a token, NFC-normalised, case kept.</summary>
public sealed class GraphemeTokenizer : ITokenizer
{
    /// <inheritdoc/>
    public string Spec => "chars";
    /// <inheritdoc/>
    public string Normalization => "NFC";
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
        private readonly HoldBack<char> _held = new();
        private byte[] _bytes = new byte[64];

        public void Feed(ReadOnlySpan<byte> utf8, bool eod)
        {
            int n = Encoding.UTF8.GetChars(utf8, _held.AppendSpan(Encoding.UTF8.GetMaxCharCount(utf8.Length)));
            _held.Advance(n);
            var text = _held.Join([]);
            int i = 0;
            while (i < text.Length)
            {
                int len = System.Globalization.StringInfo.GetNextTextElementLength(text[i..]);
                // The last cluster may continue in the next block (combining marks, ZWJ sequences).
                if (i + len == text.Length && !eod) { _held.Hold(text[i..]); return; }
                var cluster = text.Slice(i, len);
                i += len;
                if (cluster.Length == 1 && char.IsWhiteSpace(cluster[0])) continue;
                if (cluster.Length == 2 && cluster[0] == '\r' && cluster[1] == '\n') continue;
                string norm = cluster.IsNormalized() ? cluster.ToString() : cluster.ToString().Normalize();
                int max = Encoding.UTF8.GetMaxByteCount(norm.Length);
                if (_bytes.Length < max) _bytes = new byte[max * 2];
                int nb = Encoding.UTF8.GetBytes(norm, _bytes);
                sink.AddToken(_bytes.AsSpan(0, nb));
            }
        }
    }
}
