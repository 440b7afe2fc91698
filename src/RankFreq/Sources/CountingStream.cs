namespace RankFreq.Sources;

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
