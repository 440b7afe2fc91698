using System.IO.Hashing;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics.X86;

namespace RankFreq.Primitives;

/// <summary>
/// Key packing and hashing shared by every byte-keyed table (count tables, caches): keys of at most 16 bytes as two
/// little-endian words, a fast 64-bit hash, and packed first-seen positions.
/// </summary>
public static class KeyPacking
{
    /// <summary>Packs a first-seen position; units sort before offsets.</summary>
    public static long PackPosition(int unit, long offset) => ((long)unit << 40) | (offset & ((1L << 40) - 1));

    /// <summary>Bytes 0–7 and 8–15 of a key of at most 16 bytes, little-endian and zero-padded; false for longer keys.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static bool ShortWords(ReadOnlySpan<byte> k, out ulong a, out ulong b)
    {
        if (k.Length > 16) { a = b = 0; return false; }
        Pack16(k, out a, out b);
        return true;
    }

    /// <summary>
    /// Packs 0–16 bytes into two little-endian words, zero-padded, with overlapping reads inside the span (no copy,
    /// no read past its end): bytes 8..n come from the last eight shifted down; short keys from two overlapping
    /// 4- or 2-byte reads whose overlap holds the same bytes.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static void Pack16(ReadOnlySpan<byte> k, out ulong a, out ulong b)
    {
        ref byte r = ref MemoryMarshal.GetReference(k);
        int n = k.Length;
        if (n >= 8)
        {
            a = Unsafe.ReadUnaligned<ulong>(ref r);
            b = n == 8 ? 0 : Unsafe.ReadUnaligned<ulong>(ref Unsafe.Add(ref r, n - 8)) >> ((16 - n) * 8);
        }
        else if (n >= 4)
        {
            a = Unsafe.ReadUnaligned<uint>(ref r) | ((ulong)Unsafe.ReadUnaligned<uint>(ref Unsafe.Add(ref r, n - 4)) << ((n - 4) * 8));
            b = 0;
        }
        else if (n >= 2)
        {
            a = Unsafe.ReadUnaligned<ushort>(ref r) | ((ulong)Unsafe.ReadUnaligned<ushort>(ref Unsafe.Add(ref r, n - 2)) << ((n - 2) * 8));
            b = 0;
        }
        else
        {
            a = n == 1 ? r : 0UL;
            b = 0;
        }
    }

    /// <summary>wyhash-style mix: the two halves of the 128-bit product of the key words, each xored with a constant.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static ulong Mix(ulong a, ulong b, int n)
    {
        ulong x = a ^ 0xA0761D6478BD642FUL, y = b ^ 0xE7037ED1A0B428DBUL ^ (ulong)n;
        // the high half by MULX and the low half by a plain multiply, both in registers: Math.BigMul's out parameter
        // is compiled as a store and a reload on the counting hot path
        ulong hi = Bmi2.X64.IsSupported ? Bmi2.X64.MultiplyNoFlags(x, y) : Math.BigMul(x, y, out _);
        return hi ^ (x * y);
    }

    /// <summary>
    /// A fast 64-bit hash: <see cref="Mix"/> of the packed words for keys up to 16 bytes, XxHash3 beyond.
    /// Quality matters only for probe lengths: keys are always compared exactly.
    /// </summary>
    public static ulong Hash(ReadOnlySpan<byte> k) =>
        ShortWords(k, out ulong a, out ulong b) ? Mix(a, b, k.Length) : XxHash3.HashToUInt64(k);
}
