using System.Buffers.Binary;

namespace RankFreq.Primitives;

/// <summary>
/// A structural check of a Parquet file's footer (the FileMetaData struct in the Thrift compact protocol) before a
/// Parquet library decodes it. A damaged footer can make a decoder read past the footer's end, where a reader that
/// takes end-of-data as a byte 0xFF (a varint that never ends) loops for ever; this walk reads every value with
/// bounds checked, so such a file is refused in one line instead.
/// </summary>
/// <remarks>
/// The compact protocol as the Apache Thrift specification defines it (doc/specs/thrift-compact-protocol.md): a field
/// header byte holds a field-id delta (high nibble; 0 means a zigzag varint id follows) and a type (low nibble); 0 ends
/// a struct. Booleans live in the header; byte 1 byte; i16, i32, i64 zigzag varints; double 8 bytes; binary a varint
/// length then bytes; list and set a size/type byte (size 15: a varint size follows); map a varint size, then a
/// key/value type byte when not empty; struct nested fields. Lists may not claim more elements than bytes are left,
/// and nesting is limited, so the walk is linear in the footer's length.
/// </remarks>
public static class ParquetFooterCheck
{
    private const int MaxDepth = 64;

    /// <summary>What is wrong with the footer of the seekable Parquet <paramref name="file"/>, or null when it walks
    /// cleanly; the stream's position is left at its start.</summary>
    public static string? Problem(Stream file)
    {
        long length = file.Length;
        if (length < 12) return "shorter than a Parquet file's header and footer";
        Span<byte> tail = stackalloc byte[8];
        file.Seek(-8, SeekOrigin.End);
        file.ReadExactly(tail);
        if (!tail[4..].SequenceEqual("PAR1"u8)) return "no Parquet end marker";
        long footerLength = BinaryPrimitives.ReadInt32LittleEndian(tail);
        if (footerLength <= 0 || footerLength > length - 12) return $"footer length {footerLength} does not fit the file";
        var footer = new byte[footerLength];
        file.Seek(-8 - footerLength, SeekOrigin.End);
        file.ReadExactly(footer);
        file.Seek(0, SeekOrigin.Begin);
        var walk = new Walk(footer);
        return walk.Struct(0) ? null : $"footer damaged near byte {length - 8 - footerLength + walk.At} ({walk.Why})";
    }

    /// <summary><see cref="Problem(Stream)"/> of the file at <paramref name="path"/>.</summary>
    public static string? Problem(string path)
    {
        using var fs = File.OpenRead(path);
        return Problem(fs);
    }

    /// <summary>Throws <see cref="InvalidDataException"/> with <see cref="Problem(Stream)"/>, if any: called before a
    /// Parquet decoder opens <paramref name="file"/>, inside the caller's "not a readable Parquet file" handling.</summary>
    public static void ThrowIfDamaged(Stream file)
    {
        if (Problem(file) is { } problem) throw new InvalidDataException(problem);
    }

    /// <summary><see cref="ThrowIfDamaged(Stream)"/> for the file at <paramref name="path"/>.</summary>
    public static void ThrowIfDamaged(string path)
    {
        if (Problem(path) is { } problem) throw new InvalidDataException(problem);
    }

    private ref struct Walk(ReadOnlySpan<byte> b)
    {
        private readonly ReadOnlySpan<byte> _b = b;
        public int At;
        public string Why = "";

        private bool Fail(string why)
        {
            Why = why;
            return false;
        }

        private bool Byte(out byte v)
        {
            v = 0;
            if (At >= _b.Length) return Fail("ends inside a value");
            v = _b[At++];
            return true;
        }

        private bool Varint(out ulong v)
        {
            v = 0;
            for (int shift = 0; shift < 70; shift += 7)
            {
                if (!Byte(out byte x)) return false;
                v |= (ulong)(x & 0x7f) << shift;
                if ((x & 0x80) == 0) return true;
            }
            return Fail("a varint longer than 10 bytes");
        }

        private bool Skip(ulong n)
        {
            if (n > (ulong)(_b.Length - At)) return Fail("a length past the footer's end");
            At += (int)n;
            return true;
        }

        public bool Struct(int depth)
        {
            if (depth > MaxDepth) return Fail("nested too deeply");
            while (true)
            {
                if (!Byte(out byte h)) return false;
                if (h == 0) return true;
                int type = h & 0x0f;
                if (h >> 4 == 0 && !Varint(out _)) return false;
                if (type is 1 or 2) continue; // a boolean field holds its value in the header
                if (!Value(type, depth)) return false;
            }
        }

        private bool Value(int type, int depth)
        {
            switch (type)
            {
                case 1 or 2 or 3: return Byte(out _); // a boolean element of a list takes a byte of its own
                case 4 or 5 or 6: return Varint(out _);
                case 7: return Skip(8);
                case 8: return Varint(out ulong n) && Skip(n);
                case 9 or 10:
                    {
                        if (!Byte(out byte st)) return false;
                        ulong size = (ulong)(st >> 4);
                        if (size == 15 && !Varint(out size)) return false;
                        return Elements(size, st & 0x0f, depth);
                    }
                case 11:
                    {
                        if (!Varint(out ulong size)) return false;
                        if (size == 0) return true;
                        if (!Byte(out byte kv)) return false;
                        for (ulong i = 0; i < size; i++)
                            if (!Value(kv >> 4, depth + 1) || !Value(kv & 0x0f, depth + 1)) return false;
                        return true;
                    }
                case 12: return Struct(depth + 1);
                default: return Fail($"unknown value type {type}");
            }
        }

        private bool Elements(ulong size, int type, int depth)
        {
            // every element takes at least one byte: a longer list cannot be in the footer
            if (size > (ulong)(_b.Length - At)) return Fail("a list longer than the footer");
            for (ulong i = 0; i < size; i++)
                if (!Value(type, depth + 1)) return false;
            return true;
        }
    }
}
