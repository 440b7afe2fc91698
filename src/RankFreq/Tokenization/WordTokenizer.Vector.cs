using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Numerics;
using System.Runtime.Intrinsics;

namespace RankFreq.Tokenization;

// The vectorised walk: 64-byte classification into bitmaps and the token walk.
public sealed partial class WordTokenizer
{
    private sealed partial class Session
    {
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
            v &= Vector128.LoadUnsafe(ref MemoryMarshal.GetArrayDataReference(LengthMask), (nuint)(16 - len));
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
    }
}
