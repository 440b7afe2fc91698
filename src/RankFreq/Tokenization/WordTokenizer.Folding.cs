using RankFreq.Primitives;
using System.Text;

namespace RankFreq.Tokenization;

// Emission: ASCII lower-casing and the raw-to-folded cache for other tokens.
public sealed partial class WordTokenizer
{
    private sealed partial class Session
    {
        private void Hold(ReadOnlySpan<byte> tail) => _held.Hold(tail);

        private void EmitAscii(ReadOnlySpan<byte> tok)
        {
            if (tok.IsEmpty) return;
            Emit(tok, false, !keepCase && tok.ContainsAnyInRange((byte)'A', (byte)'Z'));
        }

        private void Emit(ReadOnlySpan<byte> tok, bool nonAscii, bool upper)
        {
            if (_batchLen > 0) Flush();
            if (!nonAscii)
            {
                if (keepCase || !upper) { sink.AddToken(tok); return; }
                if (_bytes.Length < tok.Length) _bytes = new byte[tok.Length * 2];
                for (int k = 0; k < tok.Length; k++)
                {
                    byte b = tok[k];
                    _bytes[k] = (uint)(b - 'A') <= 'Z' - 'A' ? (byte)(b | 0x20) : b;
                }
                sink.AddToken(_bytes.AsSpan(0, tok.Length));
                return;
            }
            EmitSlow(tok);
        }

        // raw token bytes → normalised, folded bytes: a token seen before skips decoding, NFC and case folding
        private readonly ByteMap _folded = new(1 << 18);

        private void EmitSlow(ReadOnlySpan<byte> tok)
        {
            if (_folded.TryGet(tok, out var known))
            {
                sink.AddToken(known);
                return;
            }
            var folded = Fold(tok);
            _folded.Add(tok, folded);
            sink.AddToken(folded);
        }

        private ReadOnlySpan<byte> Fold(ReadOnlySpan<byte> tok)
        {
            int maxChars = tok.Length + 1;
            if (_chars.Length < maxChars) _chars = new char[maxChars * 2];
            int nc = Encoding.UTF8.GetChars(tok, _chars);
            ReadOnlySpan<char> text = _chars.AsSpan(0, nc);
            if (!text.IsNormalized(NormalizationForm.FormC))
            {
                int need = text.GetNormalizedLength(NormalizationForm.FormC);
                if (_chars2.Length < need) _chars2 = new char[need * 2];
                text.TryNormalize(_chars2, out int written, NormalizationForm.FormC);
                (_chars, _chars2) = (_chars2, _chars);
                text = _chars.AsSpan(0, written);
            }
            if (!keepCase)
            {
                if (_chars2.Length < text.Length) _chars2 = new char[text.Length * 2];
                int w = text.ToLowerInvariant(_chars2);
                text = _chars2.AsSpan(0, w);
            }
            int maxBytes = Encoding.UTF8.GetMaxByteCount(text.Length);
            if (_bytes.Length < maxBytes) _bytes = new byte[maxBytes];
            int nb = Encoding.UTF8.GetBytes(text, _bytes);
            return _bytes.AsSpan(0, nb);
        }
    }
}
