using System.Buffers;
using System.Collections.Concurrent;
using System.Runtime.ExceptionServices;
using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>
/// Hands the text one thread reads to a sink that runs on a thread of its own, in order: writes are copied into
/// chunks of about 256 KiB (each write's length and end-of-document flag kept beside it) and a chunk is handed over
/// when full; steps that must run in order with the text (a work unit's or a group's start and end) travel in the
/// same chunks. At most <see cref="Depth"/> chunks wait, so the text in flight stays bounded (about 2 MiB).
/// </summary>
/// <remarks>
/// Used by the paired count when a corpus has fewer work units than threads (one compressed file, say): the reading
/// thread tokenizes with one tokenizer while this pipe feeds the other, so both cores work. A fault of the sink is
/// kept and thrown to the writer at its next call; after a fault or cancellation the rest is drained unprocessed, so
/// the writer never waits on a full pipe.
/// </remarks>
internal sealed class BlockPipe
{
    private const int ChunkBytes = 256 << 10;
    private const int Depth = 8;
    private const int MaxItems = 4096;
    private readonly BlockingCollection<Chunk> _queue = new(Depth);
    private readonly ITextSink _sink;
    private readonly CancellationToken _ct;
    private readonly Task _consumer;
    private Chunk _open = new(ChunkBytes);
    private volatile ExceptionDispatchInfo? _fault;

    private sealed class Chunk(int size)
    {
        public readonly byte[] Bytes = ArrayPool<byte>.Shared.Rent(size);
        public int Used;
        /// <summary>Writes (length ≥ 0, end of document) and steps (length −1) in order.</summary>
        public readonly List<(int Length, bool EndOfDocument, Action? Step)> Items = [];
    }

    /// <summary>Starts the consuming thread.</summary>
    public BlockPipe(ITextSink sink, CancellationToken ct)
    {
        _sink = sink;
        _ct = ct;
        _consumer = Task.Factory.StartNew(Consume, CancellationToken.None, TaskCreationOptions.LongRunning, TaskScheduler.Default);
    }

    /// <summary>Copies a block into the pipe.</summary>
    public void Write(ReadOnlySpan<byte> utf8, bool endOfDocument)
    {
        if (utf8.Length > _open.Bytes.Length - _open.Used || _open.Items.Count >= MaxItems)
        {
            Hand();
            if (utf8.Length > _open.Bytes.Length)
            {
                ArrayPool<byte>.Shared.Return(_open.Bytes);
                _open = new Chunk(utf8.Length);
            }
        }
        utf8.CopyTo(_open.Bytes.AsSpan(_open.Used));
        _open.Used += utf8.Length;
        _open.Items.Add((utf8.Length, endOfDocument, null));
    }

    /// <summary>Runs <paramref name="step"/> on the sink's thread after the text written so far.</summary>
    public void Post(Action step)
    {
        if (_open.Items.Count >= MaxItems) Hand();
        _open.Items.Add((-1, false, step));
    }

    /// <summary>Hands over what is open, waits until the sink has taken everything and stops its thread; does not
    /// throw (see <see cref="ThrowIfFaulted"/>).</summary>
    public void Finish()
    {
        if (_queue.IsAddingCompleted) return;
        try
        {
            if (_open.Items.Count > 0) _queue.Add(_open);
            else ArrayPool<byte>.Shared.Return(_open.Bytes);
        }
        finally
        {
            _queue.CompleteAdding();
            _consumer.Wait(CancellationToken.None);
        }
    }

    /// <summary>Throws what the sink threw, if anything.</summary>
    public void ThrowIfFaulted() => _fault?.Throw();

    private void Hand()
    {
        ThrowIfFaulted();
        if (_open.Items.Count == 0) return;
        _queue.Add(_open, CancellationToken.None);
        _open = new Chunk(ChunkBytes);
    }

    private void Consume()
    {
        foreach (var chunk in _queue.GetConsumingEnumerable())
        {
            try
            {
                if (_fault is null && !_ct.IsCancellationRequested)
                {
                    int at = 0;
                    foreach (var (length, eod, step) in chunk.Items)
                    {
                        if (step is not null) { step(); continue; }
                        _sink.Write(chunk.Bytes.AsSpan(at, length), eod);
                        at += length;
                    }
                }
            }
            catch (Exception e)
            {
                _fault = ExceptionDispatchInfo.Capture(e);
            }
            finally
            {
                ArrayPool<byte>.Shared.Return(chunk.Bytes);
            }
        }
    }
}
