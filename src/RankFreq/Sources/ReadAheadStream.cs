using System.Buffers;
using System.Collections.Concurrent;
using System.Runtime.ExceptionServices;

namespace RankFreq.Sources;

/// <summary>
/// Reads a stream on a background thread into a small queue of blocks, so that decompressing a file and counting its
/// text run on two cores at once. A fault of the inner stream is raised to the reader at the point where the data
/// before it has been consumed, exactly as a direct read would raise it. Does not dispose the inner stream.
/// </summary>
internal sealed class ReadAheadStream : Stream
{
    private readonly Stream _inner;
    private readonly BlockingCollection<(byte[] Buffer, int Length)> _queue;
    private readonly CancellationTokenSource _stop = new();
    private readonly Task _producer;
    private ExceptionDispatchInfo? _fault;
    private byte[]? _current;
    private int _pos, _len;

    public ReadAheadStream(Stream inner, int blockBytes, int depth)
    {
        _inner = inner;
        _queue = new BlockingCollection<(byte[], int)>(depth);
        _producer = Task.Factory.StartNew(() => Produce(blockBytes), TaskCreationOptions.LongRunning);
    }

    private void Produce(int blockBytes)
    {
        try
        {
            while (true)
            {
                var b = ArrayPool<byte>.Shared.Rent(blockBytes);
                int n = _inner.Read(b, 0, blockBytes);
                if (n <= 0)
                {
                    ArrayPool<byte>.Shared.Return(b);
                    break;
                }
                _queue.Add((b, n), _stop.Token);
            }
        }
        catch (OperationCanceledException) when (_stop.IsCancellationRequested) { }
        catch (Exception e) { _fault = ExceptionDispatchInfo.Capture(e); }
        finally { _queue.CompleteAdding(); }
    }

    public override int Read(byte[] buffer, int offset, int count) => Read(buffer.AsSpan(offset, count));

    public override int Read(Span<byte> buffer)
    {
        while (_current is null || _pos == _len)
        {
            if (_current is not null)
            {
                ArrayPool<byte>.Shared.Return(_current);
                _current = null;
            }
            if (!_queue.TryTake(out var item, Timeout.Infinite))
            {
                _fault?.Throw(); // everything read before the fault has been handed out
                return 0;
            }
            (_current, _len) = item;
            _pos = 0;
        }
        int n = Math.Min(buffer.Length, _len - _pos);
        _current.AsSpan(_pos, n).CopyTo(buffer);
        _pos += n;
        return n;
    }

    protected override void Dispose(bool disposing)
    {
        if (disposing)
        {
            _stop.Cancel();
            while (_queue.TryTake(out var item)) ArrayPool<byte>.Shared.Return(item.Buffer);
            try { _producer.Wait(); } catch (AggregateException) { }
            while (_queue.TryTake(out var item)) ArrayPool<byte>.Shared.Return(item.Buffer);
            if (_current is not null) ArrayPool<byte>.Shared.Return(_current);
            _current = null;
            _queue.Dispose();
            _stop.Dispose();
        }
        base.Dispose(disposing);
    }

    public override bool CanRead => true;
    public override bool CanSeek => false;
    public override bool CanWrite => false;
    public override long Length => throw new NotSupportedException();
    public override long Position { get => throw new NotSupportedException(); set => throw new NotSupportedException(); }
    public override void Flush() { }
    public override long Seek(long offset, SeekOrigin origin) => throw new NotSupportedException();
    public override void SetLength(long value) => throw new NotSupportedException();
    public override void Write(byte[] buffer, int offset, int count) => throw new NotSupportedException();
}
