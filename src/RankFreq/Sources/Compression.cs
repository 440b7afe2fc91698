using System.IO.Compression;
using SharpCompress.Compressors;
using SharpCompress.Compressors.BZip2;
using SharpCompress.Compressors.Xz;
using ZstdSharp;

namespace RankFreq.Sources;

/// <summary>Compression formats recognised by their magic bytes.</summary>
public enum CompressionKind
{
    /// <summary>Not compressed.</summary>
    None,
    /// <summary>gzip (RFC 1952), 1F 8B.</summary>
    Gzip,
    /// <summary>Zstandard (RFC 8878), 28 B5 2F FD.</summary>
    Zstd,
    /// <summary>bzip2, "BZh".</summary>
    Bzip2,
    /// <summary>xz, FD 37 7A 58 5A 00.</summary>
    Xz,
}

/// <summary>Detects compression by content and opens a decompressing stream.</summary>
public static class Decompression
{
    /// <summary>Recognises a compression format from the first bytes of a stream.</summary>
    public static CompressionKind Detect(ReadOnlySpan<byte> head)
    {
        if (head.Length >= 2 && head[0] == 0x1F && head[1] == 0x8B) return CompressionKind.Gzip;
        if (head.Length >= 4 && head[0] == 0x28 && head[1] == 0xB5 && head[2] == 0x2F && head[3] == 0xFD) return CompressionKind.Zstd;
        if (head.Length >= 4 && head[0] == (byte)'B' && head[1] == (byte)'Z' && head[2] == (byte)'h' && head[3] is >= (byte)'1' and <= (byte)'9') return CompressionKind.Bzip2;
        if (head.Length >= 6 && head[0] == 0xFD && head[1] == 0x37 && head[2] == 0x7A && head[3] == 0x58 && head[4] == 0x5A && head[5] == 0) return CompressionKind.Xz;
        return CompressionKind.None;
    }

    /// <summary>Wraps <paramref name="raw"/> in the decompressor for <paramref name="kind"/>.</summary>
    public static Stream Open(Stream raw, CompressionKind kind) => kind switch
    {
        CompressionKind.None => raw,
        CompressionKind.Gzip => new GZipStream(raw, System.IO.Compression.CompressionMode.Decompress),
        CompressionKind.Zstd => new DecompressionStream(raw),
        CompressionKind.Bzip2 => BZip2Stream.Create(raw, SharpCompress.Compressors.CompressionMode.Decompress, decompressConcatenated: true, leaveOpen: false),
        CompressionKind.Xz => new XZStream(raw),
        _ => raw,
    };

    /// <summary>File name extensions that mark compression, stripped before guessing the format.</summary>
    public static string StripExtension(string name)
    {
        foreach (var ext in new[] { ".gz", ".zst", ".zstd", ".bz2", ".xz" })
            if (name.EndsWith(ext, StringComparison.OrdinalIgnoreCase)) return name[..^ext.Length];
        return name;
    }
}

/// <summary>Counts the bytes read through it (the offset reported when a decompressor fails).</summary>
internal sealed class CountingStream(Stream inner) : Stream
{
    public long BytesRead;
    private readonly byte[] _last = new byte[8];

    /// <summary>The last 8 bytes read (a gzip trailer: CRC-32 and size mod 2^32, little-endian).</summary>
    public ReadOnlySpan<byte> LastBytes => _last;

    private int Track(Span<byte> got)
    {
        if (got.Length >= 8) got[^8..].CopyTo(_last);
        else if (got.Length > 0)
        {
            _last.AsSpan(got.Length).CopyTo(_last);
            got.CopyTo(_last.AsSpan(8 - got.Length));
        }
        BytesRead += got.Length;
        return got.Length;
    }
    public override bool CanRead => true;
    public override bool CanSeek => false;
    public override bool CanWrite => false;
    public override long Length => inner.Length;
    public override long Position { get => BytesRead; set => throw new NotSupportedException(); }
    public override void Flush() { }
    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));
    public override int Read(Span<byte> buffer) { int n = inner.Read(buffer); return Track(buffer[..Math.Max(0, n)]); }
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    protected override void Dispose(bool disposing) { if (disposing) inner.Dispose(); base.Dispose(disposing); }
}

/// <summary>Replays bytes already read (a peek) before the rest of a stream.</summary>
internal sealed class PrefixStream(byte[] prefix, Stream rest) : Stream
{
    private int _pos;
    private long _total;
    public override bool CanRead => true;
    public override bool CanSeek => false;
    public override bool CanWrite => false;
    public override long Length => throw new NotSupportedException();
    public override long Position { get => _total; set => throw new NotSupportedException(); }
    public override void Flush() { }
    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));
    public override int Read(Span<byte> buffer)
    {
        if (_pos < prefix.Length)
        {
            int n = Math.Min(buffer.Length, prefix.Length - _pos);
            prefix.AsSpan(_pos, n).CopyTo(buffer);
            _pos += n;
            _total += n;
            return n;
        }
        int r = rest.Read(buffer);
        _total += r;
        return r;
    }
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
    protected override void Dispose(bool disposing) { if (disposing) rest.Dispose(); base.Dispose(disposing); }
}
