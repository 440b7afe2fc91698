using System.Buffers;
using System.Runtime.CompilerServices;
using RankFreq.Primitives;
using System.Runtime.InteropServices;
using System.Globalization;
using System.Text;
using System.Numerics;
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
public sealed class WordTokenizer(bool keepCase) : ITokenizer
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

    // Byte tables for the ASCII fast path (constant data, so the JIT drops bounds checks on a byte index).
    // StartTable: 1 where a token may start (ASCII letter or digit, or any non-ASCII byte).
    private static ReadOnlySpan<byte> StartTable => [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1];
    // WordTable: 1 lower-case letter or digit, 3 upper-case letter (bit 2 marks case), 0 otherwise.
    private static ReadOnlySpan<byte> WordTable => [0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0, 0, 0, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 3, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];

    // ASCII classes: 0 separator, 1 lower/digit, 2 upper, 3 apostrophe.
    private static readonly byte[] AsciiClass = BuildAsciiClass();

    private static byte[] BuildAsciiClass()
    {
        var t = new byte[128];
        for (int c = 'a'; c <= 'z'; c++) t[c] = 1;
        for (int c = '0'; c <= '9'; c++) t[c] = 1;
        for (int c = 'A'; c <= 'Z'; c++) t[c] = 2;
        t['\''] = 3;
        return t;
    }

    internal enum Kind { Separator, Word, Apostrophe, Han }

    internal static Kind Classify(Rune r)
    {
        int v = r.Value;
        if (v < 0x10000) return (Kind)(Bmp.Table[v] & 3);
        return ClassifySlow(r);
    }

    /// <summary>The rule's classes of every code point below U+10000, computed once: bits 0–1 <see cref="Kind"/>, bit 2 letter or digit.</summary>
    private static class Bmp
    {
        public static readonly byte[] Table = Build();

        private static byte[] Build()
        {
            var t = new byte[0x10000];
            for (int v = 0; v < t.Length; v++)
            {
                if (v is >= 0xD800 and <= 0xDFFF) continue; // surrogates are never decoded runes
                var r = new Rune(v);
                t[v] = (byte)((int)ClassifySlow(r) | (IsLetterOrDigitSlow(r) ? 4 : 0));
            }
            return t;
        }
    }

    private static Kind ClassifySlow(Rune r)
    {
        int v = r.Value;
        if (v < 0x80)
        {
            byte c = AsciiClass[v];
            return c == 3 ? Kind.Apostrophe : c != 0 ? Kind.Word : Kind.Separator;
        }
        if (v == 0x2019) return Kind.Apostrophe;
        if (IsHan(v)) return Kind.Han;
        switch (Rune.GetUnicodeCategory(r))
        {
            case UnicodeCategory.UppercaseLetter:
            case UnicodeCategory.LowercaseLetter:
            case UnicodeCategory.TitlecaseLetter:
            case UnicodeCategory.ModifierLetter:
            case UnicodeCategory.OtherLetter:
            case UnicodeCategory.NonSpacingMark:
            case UnicodeCategory.SpacingCombiningMark:
            case UnicodeCategory.EnclosingMark:
            case UnicodeCategory.DecimalDigitNumber:
                return Kind.Word;
            default:
                return Kind.Separator;
        }
    }

    private static bool IsLetterOrDigit(Rune r) => r.Value < 0x10000 ? (Bmp.Table[r.Value] & 4) != 0 : IsLetterOrDigitSlow(r);

    private static bool IsLetterOrDigitSlow(Rune r)
    {
        if (r.Value < 0x80) return AsciiClass[r.Value] is 1 or 2;
        var c = Rune.GetUnicodeCategory(r);
        return c <= UnicodeCategory.OtherLetter || c == UnicodeCategory.DecimalDigitNumber;
    }

    /// <summary>CJK Unified Ideographs and their extensions and compatibility blocks.</summary>
    internal static bool IsHan(int v) =>
        (v >= 0x4E00 && v <= 0x9FFF) || (v >= 0x3400 && v <= 0x4DBF) || (v >= 0xF900 && v <= 0xFAFF) ||
        (v >= 0x20000 && v <= 0x2FA1F) || (v >= 0x30000 && v <= 0x323AF);

    private sealed class Session(ITokenSink sink, bool keepCase, bool vectorized) : ITokenizerSession
    {
        private ulong[] _bits = new ulong[2 * ((1 << 20) / 64 + 2)];
        private byte[] _carry = new byte[256];
        private int _carryLen;
        private byte[] _bytes = new byte[256];
        private char[] _chars = new char[256];
        private char[] _chars2 = new char[256];

        public void Feed(ReadOnlySpan<byte> utf8, bool endOfDocument)
        {
            if (_carryLen == 0)
            {
                Process(utf8, endOfDocument);
                return;
            }
            int total = _carryLen + utf8.Length;
            byte[] joined = ArrayPool<byte>.Shared.Rent(total);
            _carry.AsSpan(0, _carryLen).CopyTo(joined);
            utf8.CopyTo(joined.AsSpan(_carryLen));
            _carryLen = 0;
            try { Process(joined.AsSpan(0, total), endOfDocument); }
            finally { ArrayPool<byte>.Shared.Return(joined); }
        }

        private void Process(ReadOnlySpan<byte> s, bool eod)
        {
            if (vectorized) ProcessVector(s, eod);
            else Scalar(s, 0, eod, false);
            if (_batchLen > 0) Flush();
        }

        /// <summary>
        /// The vectorised path. Classifies the block 64 bytes at a time into two bitmaps — W: ASCII letter or digit;
        /// S: non-ASCII byte or apostrophe — then walks tokens with bit scans. A token that is a run of W bytes ended
        /// by a plain ASCII separator is emitted directly (packed as two words when it has at most 16 bytes); any token
        /// that starts with a non-ASCII byte or ends at an S byte or the block edge is handed to <see cref="Scalar"/>,
        /// which returns after the next plain separator. So both paths apply one rule; tests compare them.
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveOptimization)] // jitted for this CPU at once (AVX-512 where present), not precompiled
        private void ProcessVector(ReadOnlySpan<byte> s, bool eod)
        {
            int n = s.Length;
            int words = (n + 63) >> 6;
            if (_bits.Length < 2 * (words + 1)) _bits = new ulong[2 * (words + 1) + 64];
            ClassifyBlock(s, _bits);
            ref ulong bits = ref MemoryMarshal.GetArrayDataReference(_bits);
            ref byte r0 = ref MemoryMarshal.GetReference(s);
            int p = 0;
            while (p < n)
            {
                int wi = p >> 6;
                ulong m = (Unsafe.Add(ref bits, 2 * wi) | Unsafe.Add(ref bits, 2 * wi + 1)) & (ulong.MaxValue << (p & 63));
                while (m == 0)
                {
                    if (++wi >= words) return;
                    m = Unsafe.Add(ref bits, 2 * wi) | Unsafe.Add(ref bits, 2 * wi + 1);
                }
                int start = (wi << 6) + BitOperations.TrailingZeroCount(m);
                if (((Unsafe.Add(ref bits, 2 * wi + 1) >> start) & 1) != 0)
                {
                    if (Unsafe.Add(ref r0, start) == (byte)'\'') { p = start + 1; continue; } // leading apostrophe
                    p = Scalar(s, start, eod, true);
                    continue;
                }
                int wj = wi;
                ulong e = ~Unsafe.Add(ref bits, 2 * wj) & (ulong.MaxValue << (start & 63));
                while (e == 0) e = ~Unsafe.Add(ref bits, 2 * ++wj); // the zero word after the block ends every run
                int end = (wj << 6) + BitOperations.TrailingZeroCount(e);
                if (end >= n || ((Unsafe.Add(ref bits, 2 * wj + 1) >> end) & 1) != 0 || end - start > MaxTokenBytes)
                {
                    p = Scalar(s, start, eod, true);
                    continue;
                }
                EmitRun(ref r0, n, start, end - start);
                p = end + 1;
            }
        }

        /// <summary>Writes the W and S bitmaps of <paramref name="s"/> (two words per 64 bytes) and a zero pair after them.</summary>
        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        private static void ClassifyBlock(ReadOnlySpan<byte> s, ulong[] bits)
        {
            int n = s.Length, full = n >> 6;
            ref byte r0 = ref MemoryMarshal.GetReference(s);
            ref ulong b0 = ref MemoryMarshal.GetArrayDataReference(bits);
            for (int k = 0; k < full; k++)
                Classify64(ref Unsafe.Add(ref r0, k << 6), out Unsafe.Add(ref b0, 2 * k), out Unsafe.Add(ref b0, 2 * k + 1));
            int words = full;
            if ((n & 63) != 0)
            {
                Span<byte> tail = stackalloc byte[64];
                tail.Clear();
                s[(full << 6)..].CopyTo(tail);
                Classify64(ref MemoryMarshal.GetReference(tail), out Unsafe.Add(ref b0, 2 * full), out Unsafe.Add(ref b0, 2 * full + 1));
                words++;
            }
            Unsafe.Add(ref b0, 2 * words) = 0;
            Unsafe.Add(ref b0, 2 * words + 1) = 0;
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private static void Classify64(ref byte p, out ulong w, out ulong sp)
        {
            if (Vector512.IsHardwareAccelerated)
            {
                var v = Vector512.LoadUnsafe(ref p);
                var alpha = Vector512.LessThanOrEqual((v | Vector512.Create((byte)0x20)) - Vector512.Create((byte)'a'), Vector512.Create((byte)25));
                var digit = Vector512.LessThanOrEqual(v - Vector512.Create((byte)'0'), Vector512.Create((byte)9));
                w = (alpha | digit).ExtractMostSignificantBits();
                sp = (v | Vector512.Equals(v, Vector512.Create((byte)'\''))).ExtractMostSignificantBits();
            }
            else if (Vector256.IsHardwareAccelerated)
            {
                Half256(Vector256.LoadUnsafe(ref p), out uint w0, out uint s0);
                Half256(Vector256.LoadUnsafe(ref p, 32), out uint w1, out uint s1);
                w = w0 | ((ulong)w1 << 32);
                sp = s0 | ((ulong)s1 << 32);
            }
            else
            {
                w = sp = 0;
                for (int q = 0; q < 4; q++)
                {
                    var v = Vector128.LoadUnsafe(ref p, (nuint)(16 * q));
                    var alpha = Vector128.LessThanOrEqual((v | Vector128.Create((byte)0x20)) - Vector128.Create((byte)'a'), Vector128.Create((byte)25));
                    var digit = Vector128.LessThanOrEqual(v - Vector128.Create((byte)'0'), Vector128.Create((byte)9));
                    w |= (ulong)(alpha | digit).ExtractMostSignificantBits() << (16 * q);
                    sp |= (ulong)(v | Vector128.Equals(v, Vector128.Create((byte)'\''))).ExtractMostSignificantBits() << (16 * q);
                }
            }
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private static void Half256(Vector256<byte> v, out uint w, out uint sp)
        {
            var alpha = Vector256.LessThanOrEqual((v | Vector256.Create((byte)0x20)) - Vector256.Create((byte)'a'), Vector256.Create((byte)25));
            var digit = Vector256.LessThanOrEqual(v - Vector256.Create((byte)'0'), Vector256.Create((byte)9));
            w = (alpha | digit).ExtractMostSignificantBits();
            sp = (v | Vector256.Equals(v, Vector256.Create((byte)'\''))).ExtractMostSignificantBits();
        }

        // 16 bytes of 0xFF then 16 of 0: loading at offset 16 − len gives a mask of len leading bytes.
        private static ReadOnlySpan<byte> LengthMask => [255, 255, 255, 255, 255, 255, 255, 255, 255, 255, 255, 255, 255, 255, 255, 255, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];

        private readonly byte[] _edge = new byte[16];

        /// <summary>
        /// Emits a run of ASCII letters and digits, lower-cased unless case is kept. Takes a reference, not a span:
        /// a span passed by value to a call is stored as two words and reloaded as one, which stalls store forwarding.
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private void EmitRun(ref byte r0, int n, int start, int len)
        {
            if (len > 16)
            {
                EmitLongRun(ref Unsafe.Add(ref r0, start), len);
                return;
            }
            Vector128<byte> v;
            if (start + 16 <= n) v = Vector128.LoadUnsafe(ref r0, (nuint)start);
            else
            {
                Unsafe.CopyBlockUnaligned(ref _edge[0], ref Unsafe.Add(ref r0, start), (uint)len);
                v = Vector128.LoadUnsafe(ref _edge[0]);
            }
            v &= Vector128.LoadUnsafe(ref MemoryMarshal.GetReference(LengthMask), (nuint)(16 - len));
            if (!keepCase)
                v |= Vector128.LessThanOrEqual(v - Vector128.Create((byte)'A'), Vector128.Create((byte)25)) & Vector128.Create((byte)0x20);
            var u = v.AsUInt64();
            _batch[_batchLen++] = new PackedToken(u.GetElement(0), u.GetElement(1), len);
            if (_batchLen == _batch.Length) Flush();
        }

        // packed tokens wait here and go to the sink a batch at a time; any other emission flushes first, so the
        // sink still sees corpus order
        private readonly PackedToken[] _batch = new PackedToken[512];
        private int _batchLen;

        private void Flush()
        {
            sink.AddPackedTokens(_batch.AsSpan(0, _batchLen));
            _batchLen = 0;
        }

        [MethodImpl(MethodImplOptions.NoInlining)]
        private void EmitLongRun(ref byte start, int len) => Emit(MemoryMarshal.CreateReadOnlySpan(ref start, len), false, !keepCase);

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

        private void Hold(ReadOnlySpan<byte> tail)
        {
            if (_carry.Length < tail.Length) _carry = new byte[Math.Max(tail.Length, _carry.Length * 2)];
            tail.CopyTo(_carry);
            _carryLen = tail.Length;
        }

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
