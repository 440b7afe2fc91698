using System.Buffers.Binary;
using System.IO.Compression;

namespace RankFreq.Sources;

/// <summary>
/// Checks the end of a gzip file whose trailer does not match its whole decompressed output. RFC 1952 §2.2 lets a
/// file hold several members, each with its own CRC-32 and size trailer (concatenated files, bgzip blocks), and
/// .NET's decoder reads them all — but it also stops quietly on a truncated file, so the end must still be checked.
/// </summary>
/// <remarks>
/// The last member is found by scanning back from the end for a member header (1F 8B 08 with the reserved flag bits
/// clear), decoding that member alone and comparing its CRC-32 and size with the file's final 8 bytes. Truncation can
/// only cut a file's end, and a cut member leaves a final 8 bytes that no candidate reproduces (a chance match needs
/// 64 bits to agree). A file cut exactly between two members is itself a valid gzip file and cannot be told apart.
/// </remarks>
internal static class GzipMembers
{
    private const int MaxCandidates = 256;

    /// <summary>True when a member ends the file exactly and its CRC-32 and size match the final trailer.</summary>
    public static bool LastMemberVerifies(string path)
    {
        using var fs = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16);
        long len = fs.Length;
        if (len < 18) return false;
        Span<byte> trailer = stackalloc byte[8];
        fs.Position = len - 8;
        fs.ReadExactly(trailer);
        uint crc = BinaryPrimitives.ReadUInt32LittleEndian(trailer);
        uint size = BinaryPrimitives.ReadUInt32LittleEndian(trailer[4..]);

        var buf = new byte[1 << 16];
        long end = len - 8;           // candidates start at least 10 bytes before the trailer
        int tried = 0;
        long windowEnd = end - 10 + 3; // exclusive end of the bytes a candidate's magic may occupy
        while (windowEnd > 0)
        {
            long windowStart = Math.Max(0, windowEnd - buf.Length);
            int n = (int)(windowEnd - windowStart);
            fs.Position = windowStart;
            fs.ReadExactly(buf.AsSpan(0, n));
            for (int i = n - 3; i >= 0; i--)
            {
                if (buf[i] != 0x1F || buf[i + 1] != 0x8B || buf[i + 2] != 8) continue;
                if (TryMember(fs, windowStart + i, end, crc, size)) return true;
                if (++tried >= MaxCandidates) return false;
            }
            if (windowStart == 0) break;
            windowEnd = windowStart + 2; // overlap so a magic split by the window edge is still seen
        }
        return false;
    }

    private static bool TryMember(FileStream fs, long start, long trailerPos, uint crc, uint size)
    {
        try
        {
            fs.Position = start;
            Span<byte> h = stackalloc byte[10];
            fs.ReadExactly(h);
            byte flags = h[3];
            if ((flags & 0xE0) != 0) return false;
            if ((flags & 4) != 0) // FEXTRA
            {
                Span<byte> x = stackalloc byte[2];
                fs.ReadExactly(x);
                fs.Position += BinaryPrimitives.ReadUInt16LittleEndian(x);
            }
            if ((flags & 8) != 0) SkipZeroTerminated(fs);  // FNAME
            if ((flags & 16) != 0) SkipZeroTerminated(fs); // FCOMMENT
            if ((flags & 2) != 0) fs.Position += 2;        // FHCRC
            if (fs.Position > trailerPos) return false;
            using var body = new Window(fs, fs.Position, trailerPos);
            using var inflate = new DeflateStream(body, CompressionMode.Decompress, leaveOpen: true);
            var c = new System.IO.Hashing.Crc32();
            var buf = new byte[1 << 16];
            long total = 0;
            int k;
            while ((k = inflate.Read(buf)) > 0)
            {
                c.Append(buf.AsSpan(0, k));
                total += k;
            }
            return c.GetCurrentHashAsUInt32() == crc && (uint)total == size;
        }
        catch (Exception e) when (e is InvalidDataException or EndOfStreamException or IOException)
        {
            return false;
        }
    }

    private static void SkipZeroTerminated(FileStream fs)
    {
        int b;
        while ((b = fs.ReadByte()) > 0) { }
        if (b < 0) throw new EndOfStreamException();
    }

    /// <summary>A read-only window [start, end) of a stream.</summary>
    private sealed class Window(Stream inner, long from, long end) : Stream
    {
        private readonly long _start = from;
        private long _pos = from;
        public override bool CanRead => true;
        public override bool CanSeek => false;
        public override bool CanWrite => false;
        public override long Length => end - _start;
        public override long Position { get => _pos - _start; set => throw new NotSupportedException(); }
        public override void Flush() { }
        public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));
        public override int Read(Span<byte> buffer)
        {
            int n = (int)Math.Min(buffer.Length, end - _pos);
            if (n <= 0) return 0;
            inner.Position = _pos;
            n = inner.Read(buffer[..n]);
            _pos += n;
            return n;
        }
        public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
        public override void SetLength(long value) => throw new NotSupportedException();
        public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    }
}
