using System.Buffers.Binary;

namespace RankFreq.Storage;

/// <summary>
/// The DELTA_BINARY_PACKED encoding of Parquet for 64-bit integers: the differences between neighbours, less the
/// block's smallest difference, bit-packed in miniblocks. The count and rank columns of a count table are sorted, so
/// their differences take 0 to a few bits each: a page of ranks shrinks to a few bytes, and the compressor has almost
/// nothing left to do (PLAIN ranks and counts were about half of a large table's Zstd time).
/// </summary>
/// <remarks>
/// Layout per the Apache Parquet format specification (Encodings.md, "Delta Encoding"): a header (block size 128,
/// 4 miniblocks of 32 values, the value count, the first value as a zigzag varint), then per block the smallest
/// difference (zigzag varint), one bit width per miniblock and the miniblocks, each value packed from the least
/// significant bit up. Differences wrap as 64-bit integers, as the specification allows. The last block's unused
/// miniblocks get width 0 and no bytes; its last used miniblock is padded with zero values. Read back in tests by
/// Parquet.Net, ParquetSharp (Apache Arrow C++) and DuckDB.
/// </remarks>
internal static class DeltaBinaryPacked
{
    private const int BlockValues = 128, Miniblocks = 4, MiniValues = BlockValues / Miniblocks;

    /// <summary>Writes <paramref name="values"/> into <paramref name="page"/> (grown as needed); returns the length.</summary>
    public static int Encode(ref byte[] page, ReadOnlySpan<long> values)
    {
        int n = values.Length;
        // worst case: header, and per block a varint, the widths and 64 bits per value
        int max = 32 + (n / BlockValues + 1) * (10 + Miniblocks + 8 * BlockValues);
        if (page.Length < max) Array.Resize(ref page, max);
        int pos = FlatParquetWriter.WriteUVarint(page, 0, BlockValues);
        pos = FlatParquetWriter.WriteUVarint(page, pos, Miniblocks);
        pos = FlatParquetWriter.WriteUVarint(page, pos, (ulong)n);
        pos = FlatParquetWriter.WriteUVarint(page, pos, n == 0 ? 0 : ZigZag(values[0]));
        Span<ulong> delta = stackalloc ulong[BlockValues];
        for (int start = 1; start < n; start += BlockValues)
        {
            int m = Math.Min(BlockValues, n - start);
            long min = long.MaxValue;
            for (int i = 0; i < m; i++)
            {
                long d = unchecked(values[start + i] - values[start + i - 1]);
                delta[i] = (ulong)d;
                if (d < min) min = d;
            }
            for (int i = 0; i < m; i++) delta[i] = unchecked(delta[i] - (ulong)min);
            delta[m..].Clear(); // padding of the last miniblock
            pos = FlatParquetWriter.WriteUVarint(page, pos, ZigZag(min));
            int widthsAt = pos;
            pos += Miniblocks;
            for (int b = 0; b < Miniblocks; b++)
            {
                if (b * MiniValues >= m)
                {
                    page[widthsAt + b] = 0; // a miniblock the last block does not need: no bytes
                    continue;
                }
                var mini = delta.Slice(b * MiniValues, MiniValues);
                ulong or = 0;
                foreach (ulong v in mini) or |= v;
                int width = 64 - System.Numerics.BitOperations.LeadingZeroCount(or);
                page[widthsAt + b] = (byte)width;
                pos = Pack(page, pos, mini, width);
            }
        }
        return pos;
    }

    /// <summary>Packs 32 values of <paramref name="width"/> bits, least significant bit first: 4 × width bytes.</summary>
    private static int Pack(byte[] page, int pos, ReadOnlySpan<ulong> values, int width)
    {
        if (width == 0) return pos;
        ulong acc = 0;
        int bits = 0;
        foreach (ulong v in values)
        {
            acc |= v << bits;
            bits += width;
            if (bits < 64) continue;
            BinaryPrimitives.WriteUInt64LittleEndian(page.AsSpan(pos), acc);
            pos += 8;
            bits -= 64;
            // the bits of v that did not fit (none when it ended exactly at the word's end)
            acc = bits == 0 ? 0 : v >> (width - bits);
        }
        for (; bits > 0; bits -= 8, acc >>= 8) page[pos++] = (byte)acc;
        return pos;
    }

    private static ulong ZigZag(long v) => (ulong)((v << 1) ^ (v >> 63));
}
