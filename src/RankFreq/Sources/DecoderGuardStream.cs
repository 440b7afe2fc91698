namespace RankFreq.Sources;

/// <summary>
/// Wraps a decompressing stream: whatever its reads throw (each decoder has exception types of its own, and some
/// fail on corrupt data with index or state errors) is re-raised as <see cref="DecoderFaultException"/>.
/// </summary>
internal sealed class DecoderGuardStream(Stream decoder) : Stream
{
    public override bool CanRead => true;
    public override bool CanSeek => false;
    public override bool CanWrite => false;
    public override long Length => throw new NotSupportedException();
    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        try { return decoder.Read(buffer); }
        catch (Exception e) when (e is not OperationCanceledException and not DecoderFaultException)
        {
            throw new DecoderFaultException(e);
        }
    }

    public override void Flush() { }
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();

    protected override void Dispose(bool disposing)
    {
        if (disposing) decoder.Dispose();
        base.Dispose(disposing);
    }
}
