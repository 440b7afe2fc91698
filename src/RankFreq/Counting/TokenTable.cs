using System.IO.Hashing;
using System.Runtime.InteropServices;

namespace RankFreq.Counting;

/// <summary>
/// Exact counts keyed on UTF-8 bytes: open addressing (linear probing) over an index of entries whose keys live
/// in an arena of 1 MiB pages, so no string is allocated per token. Each entry also keeps the first position
/// the type was seen, packed as (work unit, token offset), so vocabulary growth can be read off exactly.
/// </summary>
internal sealed class TokenTable
{
    internal struct Entry
    {
        public long Ref;    // page << 32 | offset
        public int Len;
        public uint Hash;
        public long Count;
        public long First;  // PackPosition(unit, offset)
        public int Id;      // vocabulary id, or -1
    }

    private const int PageBytes = 1 << 20;
    private readonly List<byte[]> _pages = [];
    private byte[] _page = [];
    private int _pagePos = PageBytes;
    private int[] _buckets = new int[1 << 12];
    private Entry[] _entries = new Entry[1 << 11];
    private int _count;
    private long _arenaBytes;

    /// <summary>Number of distinct keys.</summary>
    public int Count => _count;

    /// <summary>Approximate bytes held (entries, index and arena).</summary>
    public long MemoryBytes => (long)_entries.Length * 40 + (long)_buckets.Length * 4 + _arenaBytes;

    internal ReadOnlySpan<Entry> Entries => _entries.AsSpan(0, _count);

    /// <summary>Packs a first-seen position; units sort before offsets.</summary>
    public static long PackPosition(int unit, long offset) => ((long)unit << 40) | (offset & ((1L << 40) - 1));

    /// <summary>The key bytes of an entry.</summary>
    public ReadOnlySpan<byte> Key(in Entry e) => _pages[(int)(e.Ref >> 32)].AsSpan((int)e.Ref, e.Len);

    /// <summary>Adds <paramref name="count"/> occurrences, keeping the earliest first position.</summary>
    public void Add(ReadOnlySpan<byte> key, long count, long first, int id = -1)
    {
        uint h = (uint)XxHash3.HashToUInt64(key);
        int mask = _buckets.Length - 1;
        int b = (int)(h & mask);
        while (true)
        {
            int slot = _buckets[b];
            if (slot == 0) break;
            ref Entry e = ref _entries[slot - 1];
            if (e.Hash == h && e.Len == key.Length && Key(e).SequenceEqual(key))
            {
                e.Count += count;
                if (first < e.First) e.First = first;
                return;
            }
            b = (b + 1) & mask;
        }
        if (_count == _entries.Length) Array.Resize(ref _entries, _entries.Length * 2);
        _entries[_count] = new Entry { Ref = Store(key), Len = key.Length, Hash = h, Count = count, First = first, Id = id };
        _buckets[b] = ++_count;
        if (_count * 2 > _buckets.Length) Rehash();
    }

    private long Store(ReadOnlySpan<byte> key)
    {
        if (_pagePos + key.Length > _page.Length)
        {
            _page = new byte[Math.Max(PageBytes, key.Length)];
            _pages.Add(_page);
            _pagePos = 0;
            _arenaBytes += _page.Length;
        }
        key.CopyTo(_page.AsSpan(_pagePos));
        long r = ((long)(_pages.Count - 1) << 32) | (uint)_pagePos;
        _pagePos += key.Length;
        return r;
    }

    private void Rehash()
    {
        var nb = new int[_buckets.Length * 2];
        int mask = nb.Length - 1;
        for (int i = 0; i < _count; i++)
        {
            int b = (int)(_entries[i].Hash & mask);
            while (nb[b] != 0) b = (b + 1) & mask;
            nb[b] = i + 1;
        }
        _buckets = nb;
    }

    /// <summary>Entry indices sorted by key bytes (ordinal), the order of a spill run.</summary>
    public int[] IndicesByKey()
    {
        var idx = new int[_count];
        for (int i = 0; i < idx.Length; i++) idx[i] = i;
        Array.Sort(idx, (a, b) => Key(_entries[a]).SequenceCompareTo(Key(_entries[b])));
        return idx;
    }

    /// <summary>Entry indices in rank order: count descending, ties by key bytes.</summary>
    public int[] IndicesByRank()
    {
        var idx = new int[_count];
        for (int i = 0; i < idx.Length; i++) idx[i] = i;
        Array.Sort(idx, (a, b) =>
        {
            int c = _entries[b].Count.CompareTo(_entries[a].Count);
            return c != 0 ? c : Key(_entries[a]).SequenceCompareTo(Key(_entries[b]));
        });
        return idx;
    }

    /// <summary>Adds every entry of another table.</summary>
    public void MergeFrom(TokenTable other)
    {
        foreach (ref readonly var e in other.Entries) Add(other.Key(e), e.Count, e.First, e.Id);
    }

    /// <summary>Forgets everything (after a spill).</summary>
    public void Clear()
    {
        _pages.Clear();
        _page = [];
        _pagePos = PageBytes;
        _arenaBytes = 0;
        _buckets = new int[1 << 12];
        _entries = new Entry[1 << 11];
        _count = 0;
    }
}
