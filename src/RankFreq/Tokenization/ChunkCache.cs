using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;

namespace RankFreq.Tokenization;

/// <summary>
/// Distinct chunk → its token ids: open addressing on a fast hash of the chunk's UTF-16 code units, with chunks and
/// ids kept in two growable arenas (no string or array allocated per chunk). Cleared when it reaches its size limit,
/// which only costs re-encoding.
/// </summary>
internal sealed class ChunkCache(int maxEntries)
{
    private struct Entry { public int KeyStart, KeyLen, IdStart, IdLen; }

    private ulong[] _buckets = new ulong[1 << 14];
    private Entry[] _entries = new Entry[1 << 13];
    private int _count;
    private char[] _keys = new char[1 << 16];
    private int _keyLen;
    private int[] _ids = new int[1 << 15];
    private int _idLen;

    /// <summary>The ids cached for <paramref name="chunk"/>, or false.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool TryGet(ReadOnlySpan<char> chunk, out ReadOnlySpan<int> ids, out int bucket, out uint tag)
    {
        ulong h = Counting.TokenTable.Hash(MemoryMarshal.AsBytes(chunk));
        tag = (uint)(h >> 32);
        int mask = _buckets.Length - 1;
        int b = (int)h & mask;
        while (true)
        {
            ulong slot = _buckets[b];
            if (slot == 0) break;
            if ((uint)(slot >> 32) == tag)
            {
                ref Entry e = ref _entries[(int)(uint)slot - 1];
                if (e.KeyLen == chunk.Length && _keys.AsSpan(e.KeyStart, e.KeyLen).SequenceEqual(chunk))
                {
                    ids = _ids.AsSpan(e.IdStart, e.IdLen);
                    bucket = b;
                    return true;
                }
            }
            b = (b + 1) & mask;
        }
        ids = default;
        bucket = b;
        return false;
    }

    /// <summary>Adds a chunk that <see cref="TryGet"/> did not find (at the bucket it returned).</summary>
    public void Add(ReadOnlySpan<char> chunk, IReadOnlyList<int> ids, int bucket, uint tag)
    {
        if (_count >= maxEntries) { Clear(); TryGet(chunk, out _, out bucket, out tag); }
        if (_keyLen + chunk.Length > _keys.Length) Array.Resize(ref _keys, Math.Max(_keys.Length * 2, _keyLen + chunk.Length));
        if (_idLen + ids.Count > _ids.Length) Array.Resize(ref _ids, Math.Max(_ids.Length * 2, _idLen + ids.Count));
        if (_count == _entries.Length) Array.Resize(ref _entries, _count * 2);
        chunk.CopyTo(_keys.AsSpan(_keyLen));
        for (int i = 0; i < ids.Count; i++) _ids[_idLen + i] = ids[i];
        _entries[_count] = new Entry { KeyStart = _keyLen, KeyLen = chunk.Length, IdStart = _idLen, IdLen = ids.Count };
        _keyLen += chunk.Length;
        _idLen += ids.Count;
        _count++;
        _buckets[bucket] = ((ulong)tag << 32) | (uint)_count;
        if (_count * 2 > _buckets.Length) Rehash();
    }

    private void Rehash()
    {
        var nb = new ulong[_buckets.Length * 2];
        int mask = nb.Length - 1;
        for (int i = 0; i < _count; i++)
        {
            var e = _entries[i];
            ulong h = Counting.TokenTable.Hash(MemoryMarshal.AsBytes(_keys.AsSpan(e.KeyStart, e.KeyLen)));
            int b = (int)h & mask;
            while (nb[b] != 0) b = (b + 1) & mask;
            nb[b] = ((h >> 32) << 32) | (uint)(i + 1);
        }
        _buckets = nb;
    }

    private void Clear()
    {
        Array.Clear(_buckets);
        _count = 0; _keyLen = 0; _idLen = 0;
    }
}
