namespace RankFreq.Primitives;

/// <summary>
/// A bounded map from byte strings to byte strings (open addressing on <see cref="KeyPacking.Hash"/>, keys and values
/// in one arena). Cleared when it reaches <paramref name="maxEntries"/> or its arena 64 MiB: it is a cache, and a
/// miss only costs recomputing the value.
/// </summary>
internal sealed class ByteMap(int maxEntries)
{
    private struct Slot { public ulong Hash; public int KeyStart, KeyLen, ValueStart, ValueLen; }

    private const int MaxArena = 64 << 20;
    private Slot[] _slots = new Slot[1 << 10];
    private int _count;
    private byte[] _arena = new byte[1 << 16];
    private int _used;

    /// <summary>The value stored for <paramref name="key"/>, or false.</summary>
    public bool TryGet(ReadOnlySpan<byte> key, out ReadOnlySpan<byte> value)
    {
        ulong h = KeyPacking.Hash(key) | 1; // 0 marks an empty slot
        int mask = _slots.Length - 1;
        for (int i = (int)h & mask; ; i = (i + 1) & mask)
        {
            ref Slot s = ref _slots[i];
            if (s.Hash == 0) break;
            if (s.Hash == h && s.KeyLen == key.Length && _arena.AsSpan(s.KeyStart, s.KeyLen).SequenceEqual(key))
            {
                value = _arena.AsSpan(s.ValueStart, s.ValueLen);
                return true;
            }
        }
        value = default;
        return false;
    }

    /// <summary>Stores a value for a key that <see cref="TryGet"/> did not find.</summary>
    public void Add(ReadOnlySpan<byte> key, ReadOnlySpan<byte> value)
    {
        int need = key.Length + value.Length;
        if (_count >= maxEntries || _used + need > MaxArena) Clear();
        if (_used + need > _arena.Length) Array.Resize(ref _arena, Math.Max(_arena.Length * 2, _used + need));
        if ((_count + 1) * 2 > _slots.Length) Grow();
        ulong h = KeyPacking.Hash(key) | 1;
        int mask = _slots.Length - 1;
        int i = (int)h & mask;
        while (_slots[i].Hash != 0) i = (i + 1) & mask;
        key.CopyTo(_arena.AsSpan(_used));
        value.CopyTo(_arena.AsSpan(_used + key.Length));
        _slots[i] = new Slot { Hash = h, KeyStart = _used, KeyLen = key.Length, ValueStart = _used + key.Length, ValueLen = value.Length };
        _used += need;
        _count++;
    }

    private void Grow()
    {
        var ns = new Slot[_slots.Length * 2];
        int mask = ns.Length - 1;
        foreach (ref readonly var s in _slots.AsSpan())
        {
            if (s.Hash == 0) continue;
            int i = (int)s.Hash & mask;
            while (ns[i].Hash != 0) i = (i + 1) & mask;
            ns[i] = s;
        }
        _slots = ns;
    }

    private void Clear()
    {
        _slots = new Slot[1 << 10];
        _count = 0;
        _used = 0;
    }
}
