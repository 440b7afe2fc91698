using System.Buffers;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Text;

namespace RankFreq.Tokenization;

// The byte-at-a-time rule.
public sealed partial class WordTokenizer
{
    private sealed partial class Session
    {
        /// <summary>
        /// The byte-at-a-time rule from <paramref name="from"/>. With <paramref name="stopEarly"/> it returns as soon
        /// as it is outside a token just after a plain ASCII separator (where the vectorised path can resume);
        /// otherwise, or when it holds a token back for the next block, it returns <c>s.Length</c>.
        /// </summary>
        private int Scalar(ReadOnlySpan<byte> s, int from, bool eod, bool stopEarly)
        {
            int n = s.Length, i = from, start = -1;
            bool nonAscii = false, upper = false;
            while (i < n)
            {
                if (start < 0)
                {
                    if (stopEarly && i > from && s[i - 1] < 0x80 && AsciiClass[s[i - 1]] == 0) return i;
                    // fast path: skip separators, then take a run of ASCII letters and digits
                    ref byte r0 = ref MemoryMarshal.GetReference(s);
                    while (i < n && StartTable[Unsafe.Add(ref r0, i)] == 0) i++;
                    if (i >= n) break;
                    if (Unsafe.Add(ref r0, i) < 0x80)
                    {
                        int st = i, cls = 0;
                        while (i < n)
                        {
                            int c = WordTable[Unsafe.Add(ref r0, i)];
                            if (c == 0) break;
                            cls |= c;
                            i++;
                        }
                        bool up = (cls & 2) != 0;
                        while (i - st > MaxTokenBytes) { EmitAscii(s.Slice(st, MaxTokenBytes)); st += MaxTokenBytes; }
                        if (i < n && Unsafe.Add(ref r0, i) < 0x80 && Unsafe.Add(ref r0, i) != (byte)'\'')
                        {
                            // the run ends at an ASCII separator: a whole token
                            Emit(s[st..i], false, up);
                            i++;
                            continue;
                        }
                        start = st;
                        nonAscii = false;
                        upper = up;
                        if (i >= n) break;
                    }
                }
                byte b = s[i];
                if (b < 0x80)
                {
                    byte c = AsciiClass[b];
                    if (c == 1 || c == 2)
                    {
                        if (start < 0) { start = i; nonAscii = false; upper = false; }
                        upper |= c == 2;
                        i++;
                        if (i - start >= MaxTokenBytes) { Emit(s[start..i], nonAscii, upper); start = -1; }
                        continue;
                    }
                    if (c == 3 && start >= 0)
                    {
                        if (!ApostropheStep(s, ref i, ref start, nonAscii, upper, eod, 1)) return n;
                        continue;
                    }
                    if (start >= 0) { Emit(s[start..i], nonAscii, upper); start = -1; }
                    i++;
                    continue;
                }
                var status = Rune.DecodeFromUtf8(s[i..], out Rune r, out int len);
                if (status == OperationStatus.NeedMoreData && !eod)
                {
                    // Only reachable when a caller feeds a block that ends inside a sequence.
                    Hold(s[(start >= 0 ? start : i)..]);
                    return n;
                }
                switch (Classify(r))
                {
                    case Kind.Word:
                        if (start < 0) { start = i; upper = false; }
                        nonAscii = true;
                        i += len;
                        break;
                    case Kind.Apostrophe when start >= 0:
                        if (!ApostropheStep(s, ref i, ref start, nonAscii, upper, eod, len)) return n;
                        break;
                    case Kind.Han:
                        if (start >= 0) { Emit(s[start..i], nonAscii, upper); start = -1; }
                        Emit(s.Slice(i, len), true, false);
                        i += len;
                        break;
                    default:
                        if (start >= 0) { Emit(s[start..i], nonAscii, upper); start = -1; }
                        i += len;
                        break;
                }
                if (start >= 0 && i - start > MaxTokenBytes)
                {
                    Emit(s[start..i], nonAscii, upper);
                    start = -1;
                }
            }
            if (start >= 0)
            {
                if (eod || n - start > MaxTokenBytes) Emit(s[start..n], nonAscii, upper);
                else Hold(s[start..n]);
            }
            return n;
        }

        /// <summary>Handles an apostrophe inside a token; false when the decision needs the next block.</summary>
        private bool ApostropheStep(ReadOnlySpan<byte> s, ref int i, ref int start, bool nonAscii, bool upper, bool eod, int len)
        {
            int next = i + len;
            if (next >= s.Length && !eod)
            {
                Hold(s[start..]);
                return false;
            }
            if (next < s.Length && Rune.DecodeFromUtf8(s[next..], out Rune r, out _) == OperationStatus.Done &&
                IsLetterOrDigit(r) && !IsHan(r.Value))
            {
                i = next;
                return true;
            }
            Emit(s[start..i], nonAscii, upper);
            start = -1;
            i = next;
            return true;
        }
    }
}
