using System.Runtime.CompilerServices;
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
        public ulong K0, K1; // for keys of at most 16 bytes, the two words that determine them (see ShortWords)
        public long Ref;    // page << 32 | offset
        public int Len;
        public uint Hash;
        public long Count;
        public long First;  // PackPosition(unit, offset)
        public int Id;      // vocabulary id, or -1
    }

    private const int PageBytes = 1 << 20;
    private byte[][] _pages = new byte[16][];
    private int _pageCount;
    private byte[] _page = [];
    private int _pagePos = PageBytes;
    private ulong[] _buckets = new ulong[1 << 12];   // (hash tag << 32) | (entry index + 1); 0 = empty
    private Entry[] _entries = new Entry[1 << 11];
    private int _count;
    private long _arenaBytes;

    /// <summary>Number of distinct keys.</summary>
    public int Count => _count;

    /// <summary>Approximate bytes held (entries, index and arena).</summary>
    public long MemoryBytes => (long)_entries.Length * 56 + (long)_buckets.Length * 8 + _arenaBytes;

    internal ReadOnlySpan<Entry> Entries => _entries.AsSpan(0, _count);

    /// <summary>Packs a first-seen position; units sort before offsets.</summary>
    public static long PackPosition(int unit, long offset) => ((long)unit << 40) | (offset & ((1L << 40) - 1));

    /// <summary>The key bytes of an entry.</summary>
    public ReadOnlySpan<byte> Key(in Entry e) => _pages[(int)(e.Ref >> 32)].AsSpan((int)e.Ref, e.Len);

    /// <summary>
    /// For a key of at most 16 bytes, two words that determine it given its length (overlapping reads of its first
    /// and last bytes), so such keys are compared without touching the arena; false for longer keys.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool ShortWords(ReadOnlySpan<byte> k, out ulong a, out ulong b)
    {
        ref byte r = ref MemoryMarshal.GetReference(k);
        int n = k.Length;
        if (n >= 8)
        {
            if (n > 16) { a = b = 0; return false; }
            a = Unsafe.ReadUnaligned<ulong>(ref r);
            b = Unsafe.ReadUnaligned<ulong>(ref Unsafe.Add(ref r, n - 8));
        }
        else if (n >= 4)
        {
            a = Unsafe.ReadUnaligned<uint>(ref r);
            b = Unsafe.ReadUnaligned<uint>(ref Unsafe.Add(ref r, n - 4));
        }
        else if (n > 0)
        {
            a = (ulong)r | ((ulong)Unsafe.Add(ref r, n >> 1) << 8) | ((ulong)Unsafe.Add(ref r, n - 1) << 16);
            b = 0;
        }
        else { a = 0; b = 0; }
        return true;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong Mix(ulong a, ulong b, int n)
    {
        ulong hi = Math.BigMul(a ^ 0xA0761D6478BD642FUL, b ^ 0xE7037ED1A0B428DBUL ^ (ulong)n, out ulong lo);
        return hi ^ lo;
    }

    /// <summary>
    /// A fast 64-bit hash: the wyhash-style 128-bit multiply mix of <see cref="ShortWords"/> for keys up to 16 bytes,
    /// XxHash3 beyond. Quality matters only for probe lengths: keys are always compared exactly.
    /// </summary>
    internal static ulong Hash(ReadOnlySpan<byte> k) =>
        ShortWords(k, out ulong a, out ulong b) ? Mix(a, b, k.Length) : XxHash3.HashToUInt64(k);

    /// <summary>Adds <paramref name="count"/> occurrences, keeping the earliest first position.</summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void Add(ReadOnlySpan<byte> key, long count, long first, int id = -1)
    {
        bool isShort = ShortWords(key, out ulong a, out ulong w);
        ulong h64 = isShort ? Mix(a, w, key.Length) : XxHash3.HashToUInt64(key);
        uint tag = (uint)(h64 >> 32);
        int mask = _buckets.Length - 1;
        int b = (int)h64 & mask;
        ref ulong b0 = ref MemoryMarshal.GetArrayDataReference(_buckets);
        while (true)
        {
            ulong slot = Unsafe.Add(ref b0, b);
            if (slot == 0) break;
            if ((uint)(slot >> 32) == tag)
            {
                ref Entry e = ref _entries[(int)(uint)slot - 1];
                if (e.Len == key.Length && (isShort ? e.K0 == a && e.K1 == w : Key(e).SequenceEqual(key)))
                {
                    e.Count += count;
                    if (first < e.First) e.First = first;
                    return;
                }
            }
            b = (b + 1) & mask;
        }
        if (_count == _entries.Length) Array.Resize(ref _entries, _entries.Length * 2);
        _entries[_count] = new Entry { K0 = a, K1 = w, Ref = Store(key), Len = key.Length, Hash = tag, Count = count, First = first, Id = id };
        _count++;
        Unsafe.Add(ref b0, b) = ((ulong)tag << 32) | (uint)_count;
        if (_count * 2 > _buckets.Length) Rehash();
    }

    private long Store(ReadOnlySpan<byte> key)
    {
        if (_pagePos + key.Length > _page.Length)
        {
            _page = new byte[Math.Max(PageBytes, key.Length)];
            if (_pageCount == _pages.Length) Array.Resize(ref _pages, _pages.Length * 2);
            _pages[_pageCount++] = _page;
            _pagePos = 0;
            _arenaBytes += _page.Length;
        }
        key.CopyTo(_page.AsSpan(_pagePos));
        long r = ((long)(_pageCount - 1) << 32) | (uint)_pagePos;
        _pagePos += key.Length;
        return r;
    }

    private void Rehash()
    {
        var nb = new ulong[_buckets.Length * 2];
        int mask = nb.Length - 1;
        for (int i = 0; i < _count; i++)
        {
            ulong h64 = Hash(Key(_entries[i]));
            int b = (int)h64 & mask;
            while (nb[b] != 0) b = (b + 1) & mask;
            nb[b] = ((ulong)_entries[i].Hash << 32) | (uint)(i + 1);
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
        _pages = new byte[16][];
        _pageCount = 0;
        _page = [];
        _pagePos = PageBytes;
        _arenaBytes = 0;
        _buckets = new ulong[1 << 12];
        _entries = new Entry[1 << 11];
        _count = 0;
    }
}
