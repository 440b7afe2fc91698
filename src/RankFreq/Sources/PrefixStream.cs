namespace RankFreq.Sources;

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
