namespace RankFreq.Primitives;

/// <summary>
/// What a streaming reader or tokenizer holds back at a block edge (an unfinished token, code point or chunk) until
/// the next block arrives: <see cref="Join"/> puts the held part in front of the next block, <see cref="Hold"/> keeps
/// a new tail. Readers see their input in blocks of any size, so every one of them needs exactly this.
/// </summary>
/// <typeparam name="T">byte for UTF-8, char for UTF-16.</typeparam>
public sealed class HoldBack<T> where T : unmanaged
{
    private T[] _held = new T[256];
    private int _length;
    private T[] _work = [];

    /// <summary>Elements held.</summary>
    public int Length => _length;

    /// <summary>The held elements.</summary>
    public ReadOnlySpan<T> Held => _held.AsSpan(0, _length);

    /// <summary>
    /// The held elements followed by <paramref name="block"/>, and nothing held any more. Without held elements this is
    /// <paramref name="block"/> itself; otherwise a span of an internal buffer, valid until the next call.
    /// </summary>
    public ReadOnlySpan<T> Join(ReadOnlySpan<T> block)
    {
        if (_length == 0) return block;
        int total = _length + block.Length;
        if (_work.Length < total) _work = new T[(int)Math.Min(Array.MaxLength, Math.Max(total, _work.Length * 2L))];
        Held.CopyTo(_work);
        block.CopyTo(_work.AsSpan(_length));
        _length = 0;
        return _work.AsSpan(0, total);
    }

    /// <summary>Holds <paramref name="tail"/> (replacing anything held); it may be a span returned by <see cref="Join"/>.</summary>
    public void Hold(ReadOnlySpan<T> tail)
    {
        _length = 0;
        Append(tail);
    }

    /// <summary>Adds <paramref name="more"/> after what is held.</summary>
    public void Append(ReadOnlySpan<T> more)
    {
        more.CopyTo(AppendSpan(more.Length));
        _length += more.Length;
    }

    /// <summary>Room for up to <paramref name="max"/> more elements after what is held; say how many were written with
    /// <see cref="Advance"/>.</summary>
    public Span<T> AppendSpan(int max)
    {
        long need = (long)_length + max;
        if (_held.Length < need) Array.Resize(ref _held, (int)Math.Min(Array.MaxLength, Math.Max(need, _held.Length * 2L)));
        return _held.AsSpan(_length, max);
    }

    /// <summary>Counts <paramref name="count"/> elements written into <see cref="AppendSpan"/> as held.</summary>
    public void Advance(int count) => _length += count;

    /// <summary>Drops the first <paramref name="count"/> held elements, keeping the rest.</summary>
    public void Consume(int count)
    {
        _held.AsSpan(count, _length - count).CopyTo(_held);
        _length -= count;
    }

    /// <summary>Holds nothing.</summary>
    public void Clear() => _length = 0;
}
