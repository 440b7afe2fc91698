using System.IO.Hashing;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using RankFreq.Primitives;

namespace RankFreq.Tokenization;

/// <summary>
/// Distinct chunk → its token ids: open addressing (linear probing, load at most 1/2) over slots that hold a chunk of
/// up to 8 UTF-16 code units inline as two packed words, so a hit on a short chunk reads one slot and no arena.
/// Longer chunks keep their 64-bit hash in the slot and are compared against a key arena; ids live in an id arena.
/// Cleared when it reaches its size limit, which only costs re-encoding.
/// </summary>
internal sealed class ChunkCache(int maxEntries)
{
    private struct Slot
    {
        public ulong K0, K1;   // packed chunk (≤ 8 code units), or K0 = hash
        public int Len;        // code units; 0 = empty (chunks are never empty)
        public int IdStart, IdLen;
        public int KeyStart;   // long chunks: start in the key arena
    }

    private const int InitialSlots = 1 << 14;
    private Slot[] _slots = new Slot[InitialSlots];
    private int _count;
    private char[] _keys = new char[1 << 16];
    private int _keyLen;
    private int[] _ids = new int[1 << 15];
    private int _idLen;

    /// <summary>Distinct chunks held.</summary>
    public int Count => _count;

    /// <summary>The ids cached for <paramref name="chunk"/>, or false and the slot where <see cref="Add"/> puts it.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public bool TryGet(ReadOnlySpan<char> chunk, out ReadOnlySpan<int> ids, out int slot)
    {
        var bytes = MemoryMarshal.AsBytes(chunk);
        ulong k0, k1, h;
        bool isShort = chunk.Length <= 8;
        if (isShort)
        {
            KeyPacking.Pack16(bytes, out k0, out k1);
            h = KeyPacking.Mix(k0, k1, chunk.Length);
        }
        else
        {
            h = XxHash3.HashToUInt64(bytes);
            k0 = h;
            k1 = 0;
        }
        int mask = _slots.Length - 1;
        int i = (int)h & mask;
        ref Slot s0 = ref MemoryMarshal.GetArrayDataReference(_slots);
        while (true)
        {
            ref Slot s = ref Unsafe.Add(ref s0, i);
            if (s.Len == 0) break;
            if (s.K0 == k0 && s.K1 == k1 && s.Len == chunk.Length &&
                (isShort || _keys.AsSpan(s.KeyStart, s.Len).SequenceEqual(chunk)))
            {
                ids = _ids.AsSpan(s.IdStart, s.IdLen);
                slot = i;
                return true;
            }
            i = (i + 1) & mask;
        }
        ids = default;
        slot = i;
        return false;
    }

    /// <summary>Adds a chunk that <see cref="TryGet"/> did not find (at the slot it returned); returns the cached ids.</summary>
    public ReadOnlySpan<int> Add(ReadOnlySpan<char> chunk, IReadOnlyList<int> ids, int slot)
    {
        if (_count >= maxEntries || _count * 2 >= _slots.Length)
        {
            if (_count >= maxEntries) Clear();
            else Grow();
            TryGet(chunk, out _, out slot);
        }
        if (_idLen + ids.Count > _ids.Length) Array.Resize(ref _ids, Math.Max(_ids.Length * 2, _idLen + ids.Count));
        for (int i = 0; i < ids.Count; i++) _ids[_idLen + i] = ids[i];
        ref Slot s = ref _slots[slot];
        s.Len = chunk.Length;
        s.IdStart = _idLen;
        s.IdLen = ids.Count;
        if (chunk.Length <= 8)
        {
            KeyPacking.Pack16(MemoryMarshal.AsBytes(chunk), out s.K0, out s.K1);
        }
        else
        {
            if (_keyLen + chunk.Length > _keys.Length) Array.Resize(ref _keys, Math.Max(_keys.Length * 2, _keyLen + chunk.Length));
            chunk.CopyTo(_keys.AsSpan(_keyLen));
            s.K0 = XxHash3.HashToUInt64(MemoryMarshal.AsBytes(chunk));
            s.K1 = 0;
            s.KeyStart = _keyLen;
            _keyLen += chunk.Length;
        }
        _idLen += ids.Count;
        _count++;
        return _ids.AsSpan(s.IdStart, s.IdLen);
    }

    private void Grow()
    {
        var ns = new Slot[_slots.Length * 2];
        ns.AsSpan().Clear(); // write fresh pages before probing them (as the count table does when it grows)
        int mask = ns.Length - 1;
        foreach (ref readonly var s in _slots.AsSpan())
        {
            if (s.Len == 0) continue;
            ulong h = s.Len <= 8 ? KeyPacking.Mix(s.K0, s.K1, s.Len) : s.K0;
            int i = (int)h & mask;
            while (ns[i].Len != 0) i = (i + 1) & mask;
            ns[i] = s;
        }
        _slots = ns;
    }

    private void Clear()
    {
        Array.Clear(_slots);
        _count = 0; _keyLen = 0; _idLen = 0;
    }
}
