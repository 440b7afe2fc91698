using System.Runtime.CompilerServices;
using System.IO.Hashing;
using System.Runtime.InteropServices;
using System.Buffers.Binary;
using System.Runtime.Intrinsics.X86;
using RankFreq.Tokenization;
using RankFreq.Primitives;

namespace RankFreq.Counting;

/// <summary>
/// Exact counts keyed on UTF-8 bytes: open addressing (linear probing, load at most 1/2) over slots that hold the
/// key itself where it fits (up to 16 bytes in a 32-byte wide slot, up to 8 in a 16-byte narrow one; any other key's
/// 64-bit hash, so growth never reads the entries), the key's length, a 27-bit count and the entry index. Each type has
/// an entry holding a key of up to 16 bytes inline as two zero-padded words (longer keys: an arena reference and the
/// 64-bit hash, the bytes in the arena's 1 MiB pages), its length, vocabulary id and the first position it was seen,
/// packed as (work unit, token offset), so vocabulary growth can be read off exactly.
/// </summary>
/// <remarks>
/// A hit of a key the slot holds is confirmed by the slot alone and costs one cache line; any other key is compared
/// with its entry once the slot's hash matches. A new key costs only the slots it probes. Slots are wide while the
/// table is small (up to <see cref="WideMaxSlots"/> slots, about 262,000 types: every word of a natural-language
/// vocabulary is then confirmed in its slot) and turn narrow with the growth past it, at an unchanged block size, so
/// a type of a large table takes about 72–104 bytes (16-byte slots at a load of at most 1/2 and a 40-byte entry).
/// Counts live in the slots while counting (folded into the entry when they reach <see cref="FoldAt"/>);
/// <see cref="Entries"/> folds them into the entries when read. First positions stay exact without a look at the
/// entry on every hit: one feeder's positions only increase within a work unit, and a unit is read by one thread, so
/// an occurrence can lower a type's first position only when it comes from a unit earlier than that first one. The
/// table keeps the latest unit of any first position it holds; an occurrence from that unit or a later one is counted
/// in the slot, an earlier one (routed counting, where several threads feed one table) goes through the entry. A
/// table fed by one thread meets its units in increasing order and never takes that path.
/// </remarks>
internal sealed unsafe partial class TokenTable : IDisposable
{
    internal struct Slot
    {
        public ulong Key;    // a key held in the slot: its bytes 0-7 (zero-padded); any other key: its 64-bit hash
        public ulong Word;   // count (bits 0-26), length code (27-31), entry index + 1 (32-63); 0 = an empty slot
        // a wide slot (32 bytes) follows with the key's bytes 8-15 and 8 unused bytes
    }

    // the slot's word: occurrences not yet folded into the entry (folded before they pass CountMask), the length of a
    // key held in the slot (LongCode for any other key: the slot's key is then its hash) and the entry index + 1
    private const ulong CountMask = (1UL << 27) - 1;
    private const int CodeShift = 27;
    private const ulong CodeMask = 31UL << CodeShift;
    private const ulong LongCode = 31;
    private const int EntryShift = 32;

    // Slots are wide (32 bytes: keys of up to 16 bytes held whole) while the table has at most WideMaxSlots slots and
    // narrow (16 bytes: keys of up to 8 bytes held whole) beyond, where memory per type matters more than the entry
    // reads of 9- to 16-byte keys. The switch comes with the growth past WideMaxSlots, at an unchanged block size.
    private const int WideShift = 5, NarrowShift = 4;

    /// <summary>
    /// The most slots a table keeps wide: 2^19 (16 MiB of slots, about 262,000 types); lower only in tests, so the
    /// switch to narrow slots is exercised on small tables.
    /// </summary>
    internal int WideMaxSlots { get; init; } = 1 << 19;

    /// <summary>The length code of a key of <paramref name="len"/> bytes, in place in the slot's word.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong CodeOf(int len, int held) => (len <= held ? (ulong)len : LongCode) << CodeShift;

    /// <summary>
    /// The slot's key for a key of <paramref name="len"/> bytes with packed first word <paramref name="a"/> and hash
    /// <paramref name="h"/>: its first word when the slot holds it (up to <paramref name="held"/> bytes), else its hash.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong SlotKeyOf(ulong a, ulong h, int len, int held) => len <= held ? a : h;

    /// <summary>The hash of an occupied slot's key (recomputed for a key the slot holds).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong HashOf(Slot* s)
    {
        int code = (int)((s->Word & CodeMask) >> CodeShift);
        if (code == (int)LongCode) return s->Key;
        return KeyPacking.Mix(s->Key, code > 8 ? SecondWord(s) : 0, code);
    }

    /// <summary>Key bytes 8-15 held in a wide slot.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ref ulong SecondWord(Slot* s) => ref ((ulong*)s)[2];

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private Slot* SlotAt(int i) => (Slot*)((byte*)_slots + ((nint)i << _slotShift));

    /// <summary>
    /// The slot count at which a slot's count is folded into its entry; below <see cref="CountMask"/> only in tests,
    /// so the fold is exercised without billions of occurrences.
    /// </summary>
    internal uint FoldAt { get; set; } = (uint)CountMask;

    /// <summary>The largest count held in a slot and not yet folded into its entry (for tests).</summary>
    internal uint LargestSlotCount()
    {
        uint most = 0;
        for (int i = 0; i < _slotCount; i++) most = Math.Max(most, (uint)(SlotAt(i)->Word & CountMask));
        return most;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static int EntryOf(ulong word) => (int)(word >> EntryShift) - 1;

    internal struct Entry
    {
        public ulong K0, K1; // the key's bytes 0-7 and 8-15, zero-padded (≤ 16 bytes); beyond: arena reference, hash
        public int Len;
        public int Id;       // vocabulary id, or -1
        public long Count;   // folded count; whole when read through Entries (the slots' counts folded in)
        public long First;   // KeyPacking.PackPosition(unit, offset)
    }

    // slots, entries and arena pages live in native blocks (NativeBlock): freed at once on Clear, so a spilled
    // table leaves no managed garbage behind, and the entries grow in place
    private const int PageBytes = 1 << 20;
    private const int FirstPageBytes = 1 << 16; // pages double up to PageBytes, so small tables stay small
    private const int InitialSlots = 1 << 12;
    private nint[] _pages = new nint[16];
    private int[] _pageSizes = new int[16];
    private int _pageCount;
    private byte* _page;
    private int _pageSize;
    private int _pagePos;
    private Slot* _slots;
    private int _slotCount;
    private int _slotShift; // log2 of the slot size: WideShift or NarrowShift
    private int _held;      // the longest key a slot holds whole: 16 in wide slots, 8 in narrow ones
    private Entry* _entries;
    private int _entryCap;
    private int _count;
    private long _arenaBytes;
    private long _keyBytes;
    private bool _dirty;
    private int _unitFloor; // at least every first position's work unit (the latest unit inserted since Clear), so an
                            // occurrence from this unit or a later one cannot lower a first position

    /// <summary>An empty table.</summary>
    public TokenTable() => Init();

    /// <summary>Frees the native blocks of a table that was not disposed.</summary>
    ~TokenTable() => FreeAll();

    private void Init()
    {
        _slotCount = InitialSlots;
        _slotShift = WideShift;
        _held = 16;
        _slots = NewSlots((long)InitialSlots << WideShift);
        _entryCap = InitialSlots / 2;
        _entries = (Entry*)NativeBlock.Alloc((long)_entryCap * sizeof(Entry));
        _pagePos = 0;
        _pageSize = 0;
        _page = null;
    }

    private static Slot* NewSlots(long bytes) =>
        // every page mapped for writing before it is probed: a fresh page that is read first maps the shared zero page,
        // and the later write then costs a copy-on-write fault with a TLB flush on every core
        (Slot*)NativeBlock.AllocWritten(bytes);

    private void FreeAll()
    {
        NativeBlock.Free(_slots, SlotBytes);
        NativeBlock.Free(_entries, (long)_entryCap * sizeof(Entry));
        for (int i = 0; i < _pageCount; i++) NativeBlock.Free((void*)_pages[i], _pageSizes[i]);
        _slots = null;
        _entries = null;
        _pageCount = 0;
        _arenaBytes = 0;
        _keyBytes = 0;
        _slotCount = 0;
        _entryCap = 0;
        _count = 0;
        _dirty = false;
        _unitFloor = 0;
        _hasIds = false;
        _hasLongKeys = false;
    }

    /// <summary>Frees the table's memory; the table must not be used afterwards.</summary>
    public void Dispose()
    {
        FreeAll();
        GC.SuppressFinalize(this);
    }

    /// <summary>Number of distinct keys.</summary>
    public int Count => _count;

    /// <summary>Summed length of the keys in bytes.</summary>
    public long KeyBytes => _keyBytes;

    /// <summary>Approximate bytes held (slots, entries and arena).</summary>
    public long MemoryBytes => SlotBytes + (long)_entryCap * sizeof(Entry) + _arenaBytes;

    private long SlotBytes => (long)_slotCount << _slotShift;

    /// <summary>
    /// The log2 of the slot size after the next growth: wide slots turn narrow past <see cref="WideMaxSlots"/>, or
    /// earlier under a <see cref="GrowthLimit"/>. They stay wide only if the growth after this one could still turn
    /// them narrow within the limit (old wide and new narrow arrays side by side, the entries doubled once more), so a
    /// table under a small budget holds as many types before it spills as one that was narrow throughout.
    /// </summary>
    private int NextShift => _slotShift == NarrowShift || 2L * _slotCount > WideMaxSlots
        || (2L * _slotCount << (WideShift + 1)) + 2 * ((long)_entryCap * sizeof(Entry) + _arenaBytes) > GrowthLimit
        ? NarrowShift : WideShift;

    /// <summary>
    /// Bytes the table would hold at the peak of its next growth (the old and the doubled slot arrays side by side).
    /// </summary>
    public long GrowthPeakBytes => MemoryBytes + (2L * _slotCount << NextShift);

    /// <summary>
    /// The most bytes the table may reach while growing (<see cref="GrowthPeakBytes"/>). When a growth would pass
    /// it the table does not grow but fills further (up to 3/4 of its slots) and sets <see cref="OverLimit"/>, so its
    /// owner can spill it before memory doubles; past 3/4 it grows anyway, so adding never fails.
    /// </summary>
    public long GrowthLimit { get; set; } = long.MaxValue;

    /// <summary>
    /// Shared by tables that grow at about the same time (the hash partitions of a routed count, balanced by the hash):
    /// one of them rehashes at a time, so the old and doubled slot arrays of only one table are alive at once.
    /// </summary>
    public object? GrowthGate { get; set; }

    /// <summary>Set when the table held back a growth because of <see cref="GrowthLimit"/>; cleared by <see cref="Clear"/>.</summary>
    public bool OverLimit { get; private set; }

    /// <summary>
    /// Whether the table should be spilled under a budget of <paramref name="budget"/> bytes: it held back a growth,
    /// or it holds more than the budget and at least as many keys as an empty table has room for before its first
    /// growth (an empty table's own blocks may exceed a tiny budget; spilling it then would write runs of a few keys).
    /// </summary>
    public bool OverBudget(long budget) => OverLimit || (MemoryBytes > budget && _count >= InitialSlots / 2);

    /// <summary>The entries in insertion order, with their counts.</summary>
    internal ReadOnlySpan<Entry> Entries
    {
        get
        {
            if (_dirty) SyncCounts();
            return new ReadOnlySpan<Entry>(_entries, _count);
        }
    }

    private void SyncCounts()
    {
        // a type seen once has its count in the entry already (the slot's is 0): no write into the entries for it
        for (int i = 0; i < _slotCount; i++)
        {
            Slot* s = SlotAt(i);
            if ((s->Word & CountMask) != 0)
            {
                _entries[EntryOf(s->Word)].Count += (long)(s->Word & CountMask);
                s->Word &= ~CountMask;
            }
        }
        _dirty = false;
    }

    /// <summary>
    /// The key bytes of an entry, which must be a reference into this table's entries (a key of at most 16 bytes is
    /// read from the entry itself).
    /// </summary>
    public ReadOnlySpan<byte> Key(in Entry e) => e.Len <= 16
        ? MemoryMarshal.CreateReadOnlySpan(ref Unsafe.As<ulong, byte>(ref Unsafe.AsRef(in e.K0)), e.Len)
        : new((byte*)_pages[(int)(e.K0 >> 32)] + (uint)e.K0, e.Len);


    /// <summary>
    /// One occurrence of a key of 1 to 16 bytes given as packed words (see <see cref="KeyPacking.ShortWords"/>). The hot path of
    /// counting; <paramref name="first"/> is used only when the key is new.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public void AddShort(ulong a, ulong b, int len, long first) => AddShortHashed(a, b, len, KeyPacking.Mix(a, b, len), first);

    /// <summary>
    /// One occurrence of each packed token, in order; token i is new at position <paramref name="first"/> + i. Each
    /// token's home slot is prefetched <see cref="PrefetchDistance"/> tokens ahead of its probe, so the cache misses of
    /// rarer types overlap instead of stalling one after another (a whole batch prefetched at once overruns the
    /// memory system's queue of outstanding misses and stalls instead).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void AddPacked(ReadOnlySpan<PackedToken> tokens, long first)
    {
        const int Ring = 32; // power of two above the distance
        Span<ulong> ring = stackalloc ulong[Ring];
        int n = tokens.Length;
        for (int i = 0; i < Math.Min(PrefetchDistance, n); i++) ring[i] = HashAndPrefetch(tokens[i]);
        for (int i = 0; i < n; i++)
        {
            if (i + PrefetchDistance < n) ring[(i + PrefetchDistance) & (Ring - 1)] = HashAndPrefetch(tokens[i + PrefetchDistance]);
            ref readonly var t = ref tokens[i];
            AddShortHashed(t.Lo, t.Hi, t.Length, ring[i & (Ring - 1)], first + i);
        }
    }

    /// <summary>
    /// One occurrence of each routed token, in order (see <see cref="RoutedToken"/>): hashes were taken by the sender,
    /// so each home slot is prefetched ahead as in <see cref="AddPacked"/>. Keys over 16 bytes are read from
    /// <paramref name="longKeys"/>. Positions may come in any order across work units; first positions stay exact.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public void AddRouted(ReadOnlySpan<RoutedToken> tokens, ReadOnlySpan<byte> longKeys)
    {
        int n = tokens.Length;
        for (int i = 0; i < Math.Min(PrefetchDistance, n); i++) Prefetch(tokens[i].Hash);
        for (int i = 0; i < n; i++)
        {
            if (i + PrefetchDistance < n) Prefetch(tokens[i + PrefetchDistance].Hash);
            ref readonly var t = ref tokens[i];
            if (t.Len <= 16) AddShortHashed(t.A, t.B, t.Len, t.Hash, t.First);
            else Upsert(0, 0, t.Hash, longKeys.Slice((int)t.A, t.Len), 1, t.First, -1);
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void Prefetch(ulong h)
    {
        if (Sse.IsSupported) Sse.Prefetch0(SlotAt((int)h & (_slotCount - 1)));
    }

    /// <summary>How many tokens ahead of its probe a token's home slot is prefetched.</summary>
    private const int PrefetchDistance = 12;

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private ulong HashAndPrefetch(in PackedToken t)
    {
        ulong h = KeyPacking.Mix(t.Lo, t.Hi, t.Length);
        if (Sse.IsSupported) Sse.Prefetch0(SlotAt((int)h & (_slotCount - 1)));
        return h;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void AddShortHashed(ulong a, ulong b, int len, ulong h, long first)
    {
        // one probe loop per slot layout, each with its layout's constants folded in (the branch is predicted: the
        // layout changes once in a table's life)
        if (_slotShift == WideShift) AddShortIn(wide: true, a, b, len, h, first);
        else AddShortIn(wide: false, a, b, len, h, first);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private void AddShortIn(bool wide, ulong a, ulong b, int len, ulong h, long first)
    {
        byte* slots = (byte*)_slots;
        int shift = wide ? WideShift : NarrowShift;
        int mask = _slotCount - 1;
        // a wide slot holds every key of up to 16 bytes (b is 0 for keys of up to 8), a narrow one up to 8 bytes
        int held = wide ? 16 : 8;
        ulong key = SlotKeyOf(a, h, len, held);
        ulong code = CodeOf(len, held);
        int i = (int)h & mask;
        while (true)
        {
            Slot* s = (Slot*)(slots + ((nint)i << shift));
            ulong w = s->Word;
            if (w == 0) break;
            // a key the slot holds is confirmed by the slot alone; a longer one, whose hash the slot holds, by its entry
            if (s->Key == key && (w & CodeMask) == code
                && (wide ? SecondWord(s) == b : len <= 8 || ShortKeyIs(EntryOf(w), a, b, len)))
            {
                // both rare: a count about to pass the fold point, or an occurrence from a work unit earlier than some
                // type's first (then this type's first position may have to be lowered)
                if ((uint)(w & CountMask) >= FoldAt || (int)(first >> 40) < _unitFloor) Bump(s, first);
                else s->Word = w + 1;
                _dirty = true;
                return;
            }
            i = (i + 1) & mask;
        }
        InsertShort(SlotAt(i), a, b, len, h, first);
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private bool ShortKeyIs(int entry, ulong a, ulong b, int len)
    {
        Entry* e = _entries + entry;
        return e->K0 == a && e->K1 == b && e->Len == len;
    }

    /// <summary>One occurrence the hot path does not handle: folds the slot's count, lowers the first position.</summary>
    [MethodImpl(MethodImplOptions.NoInlining)]
    private void Bump(Slot* s, long first)
    {
        ref Entry e = ref _entries[EntryOf(s->Word)];
        e.Count += (long)(s->Word & CountMask) + 1;
        s->Word &= ~CountMask;
        if (first < e.First) e.First = first;
    }

    [MethodImpl(MethodImplOptions.NoInlining)]
    private void InsertShort(Slot* s, ulong a, ulong b, int len, ulong h, long first) =>
        Insert(s, a, b, h, len, default, 1, first, -1);

    /// <summary>Adds <paramref name="count"/> occurrences, keeping the earliest first position.</summary>
    public void Add(ReadOnlySpan<byte> key, long count, long first, int id = -1)
    {
        bool isShort = KeyPacking.ShortWords(key, out ulong a, out ulong w);
        ulong h = isShort ? KeyPacking.Mix(a, w, key.Length) : XxHash3.HashToUInt64(key);
        Upsert(a, w, h, key, count, first, id);
    }

    /// <summary>
    /// Adds to the key whose packed words are <paramref name="a"/>, <paramref name="b"/> (keys of at most 16 bytes;
    /// ignored beyond), whose hash is <paramref name="h"/> and whose bytes are <paramref name="key"/>, read only to
    /// store or to compare a long key. For a key of at most 16 bytes <paramref name="h"/> must be
    /// <c>KeyPacking.Mix(a, b, length)</c>: growth recomputes it from the words a slot holds.
    /// </summary>
    private void Upsert(ulong a, ulong b, ulong h, ReadOnlySpan<byte> key, long count, long first, int id)
    {
        System.Diagnostics.Debug.Assert(key.Length > 16 || h == KeyPacking.Mix(a, b, key.Length));
        int mask = _slotCount - 1;
        int len = key.Length;
        ulong slotKey = SlotKeyOf(a, h, len, _held);
        ulong code = CodeOf(len, _held);
        int i = (int)h & mask;
        while (true)
        {
            Slot* s = SlotAt(i);
            if (s->Word == 0)
            {
                Insert(s, a, b, h, len, key, count, first, id);
                return;
            }
            if (s->Key == slotKey && (s->Word & CodeMask) == code)
            {
                ref Entry e = ref _entries[EntryOf(s->Word)];
                if (len <= _held ? len <= 8 || SecondWord(s) == b
                    : len <= 16 ? ShortKeyIs(EntryOf(s->Word), a, b, len)
                    : e.Len == len && Key(in e).SequenceEqual(key))
                {
                    e.Count += count;
                    if (first < e.First) e.First = first;
                    return;
                }
            }
            i = (i + 1) & mask;
        }
    }

    /// <summary>
    /// Inserts a new type into the empty slot <paramref name="s"/>: a key of at most 16 bytes as its packed words
    /// <paramref name="a"/>, <paramref name="b"/> (<paramref name="key"/> is not read), a longer one stored from
    /// <paramref name="key"/>.
    /// </summary>
    private void Insert(Slot* s, ulong a, ulong b, ulong h, int len, ReadOnlySpan<byte> key, long count, long first,
        int id)
    {
        if (_count == _entryCap)
        {
            _entries = (Entry*)NativeBlock.Grow(_entries, (long)_entryCap * sizeof(Entry), 2L * _entryCap * sizeof(Entry));
            _entryCap *= 2;
        }
        if (len > 16)
        {
            a = (ulong)Store(key);
            b = h;
            _hasLongKeys = true;
        }
        _entries[_count] = new Entry { K0 = a, K1 = b, Len = len, Id = id, Count = count, First = first };
        if (id != -1) _hasIds = true;
        _count++;
        _keyBytes += len;
        s->Key = SlotKeyOf(a, h, len, _held);
        s->Word = ((ulong)_count << EntryShift) | CodeOf(len, _held); // the count is in the entry
        if (_slotShift == WideShift) SecondWord(s) = len <= 16 ? b : 0;
        if ((int)(first >> 40) > _unitFloor) _unitFloor = (int)(first >> 40);
        if ((long)_count * 2 > _slotCount)
        {
            // spill before growth: under a limit the table fills to 3/4 and waits for its owner to spill it
            if (GrowthPeakBytes > GrowthLimit && (long)_count * 4 < 3L * _slotCount) OverLimit = true;
            else if (GrowthGate is null) Rehash();
            else if (Monitor.TryEnter(GrowthGate))
            {
                try { Rehash(); }
                finally { Monitor.Exit(GrowthGate); }
            }
            // another table is growing: this one fills further (up to 3/4) and tries again at its next new key,
            // rather than holding its partition's lock while it waits
            else if ((long)_count * 4 >= 3L * _slotCount) lock (GrowthGate) Rehash();
        }
    }

    private long Store(ReadOnlySpan<byte> key)
    {
        if (_pagePos + key.Length > _pageSize)
        {
            int size = Math.Max(Math.Min(PageBytes, Math.Max(FirstPageBytes, _pageSize * 2)), key.Length);
            _page = (byte*)NativeBlock.Alloc(size);
            if (_pageCount == _pages.Length)
            {
                Array.Resize(ref _pages, _pages.Length * 2);
                Array.Resize(ref _pageSizes, _pageSizes.Length * 2);
            }
            _pages[_pageCount] = (nint)_page;
            _pageSizes[_pageCount++] = size;
            _pageSize = size;
            _pagePos = 0;
            _arenaBytes += size;
        }
        key.CopyTo(new Span<byte>(_page + _pagePos, key.Length));
        long r = ((long)(_pageCount - 1) << 32) | (uint)_pagePos;
        _pagePos += key.Length;
        return r;
    }

    private void Rehash()
    {
        int n = _slotCount * 2;
        int shift = NextShift;
        var ns = (byte*)NewSlots((long)n << shift);
        int mask = n - 1;
        bool narrowing = shift != _slotShift;
        for (int j = 0; j < _slotCount; j++)
        {
            Slot* s = SlotAt(j);
            if (s->Word == 0) continue;
            ulong h = HashOf(s);
            int i = (int)h & mask;
            while (((Slot*)(ns + ((nint)i << shift)))->Word != 0) i = (i + 1) & mask;
            Slot* d = (Slot*)(ns + ((nint)i << shift));
            d->Key = s->Key;
            d->Word = s->Word;
            if (shift == WideShift) SecondWord(d) = SecondWord(s);
            else if (narrowing && (s->Word & CodeMask) >> CodeShift is > 8 and not LongCode)
            {
                // a 9- to 16-byte key leaves the slot: its hash takes the key's place, its entry holds the bytes
                d->Key = h;
                d->Word = (s->Word & ~CodeMask) | (LongCode << CodeShift);
            }
        }
        NativeBlock.Free(_slots, SlotBytes);
        _slots = (Slot*)ns;
        _slotCount = n;
        _slotShift = shift;
        _held = shift == WideShift ? 16 : 8;
    }

    /// <summary>Entry indices sorted by key bytes (ordinal), the order of a spill run.</summary>
    public int[] IndicesByKey() => SortedIndices(byCount: false);

    /// <summary>Entry indices in rank order: count descending, ties by key bytes.</summary>
    public int[] IndicesByRank() => SortedIndices(byCount: true);

    /// <summary>Bytes the sort behind <see cref="IndicesByKey"/> and <see cref="IndicesByRank"/> holds while it runs.</summary>
    public long SortBytes => (long)_count * (sizeof(SortKey) + sizeof(int));

    private int[] SortedIndices(bool byCount)
    {
        using var sorted = Sorted(byCount);
        var idx = new int[sorted.Length];
        for (int i = 0; i < idx.Length; i++) idx[i] = sorted.IndexAt(i);
        return idx;
    }

    /// <summary>
    /// A key's sort form: count, then its first 16 bytes as two big-endian words (zero-padded), so most comparisons
    /// of keys never reach the arena. Zero padding keeps ordinal order: a prefix pads with the smallest byte. The
    /// first position rides along, so reading the sorted types needs the entries only for keys over 16 bytes.
    /// </summary>
    private readonly record struct SortKey(long Count, ulong A, ulong B, long First, int Len, int Index);

    /// <summary>
    /// Orders sort keys by <see cref="RankOrder"/> (or by key alone), comparing packed key words before the arena
    /// bytes. The sort is written here rather than taken from the base library so that ahead-of-time
    /// compiled builds run it optimised (a base-library sort instantiated over this struct is compiled at run time,
    /// first unoptimised). Quicksort with median-of-three pivots and insertion sort below 24 elements; recursion on the
    /// smaller side only, so the stack stays O(log n).
    /// </summary>
    private readonly struct SortKeyComparer(TokenTable t, bool byCount)
    {
        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        public int Compare(in SortKey x, in SortKey y)
        {
            if (byCount && x.Count != y.Count) return x.Count > y.Count ? -1 : 1;
            if (x.A != y.A) return x.A < y.A ? -1 : 1;
            if (x.B != y.B) return x.B < y.B ? -1 : 1;
            if (x.Len <= 16 && y.Len <= 16) return x.Len.CompareTo(y.Len);
            // equal first 16 bytes: a key of at most 16 bytes is a prefix of the longer one
            if (x.Len <= 16) return -1;
            if (y.Len <= 16) return 1;
            return CompareArena(x.Index, y.Index);
        }

        [MethodImpl(MethodImplOptions.NoInlining)]
        private int CompareArena(int x, int y) => t.Key(t._entries[x]).SequenceCompareTo(t.Key(t._entries[y]));

        /// <summary>Sorts; a large array is split by one partition step and its two sides sorted on two threads.</summary>
        public void SortParallel(SortKey* a, int n)
        {
            int hi = n - 1;
            if (n < 1 << 15 || CoreLimit.Cores < 2)
            {
                Sort(a, 0, hi);
                return;
            }
            var (j, i) = Partition(a, 0, hi);
            var me = this;
            nint p = (nint)a;
            Parallel.Invoke(() => me.Sort((SortKey*)p, 0, j), () => me.Sort((SortKey*)p, i, hi));
        }

        private (int J, int I) Partition(SortKey* a, int lo, int hi)
        {
            int mid = lo + ((hi - lo) >> 1);
            if (Compare(a[mid], a[lo]) < 0) (a[mid], a[lo]) = (a[lo], a[mid]);
            if (Compare(a[hi], a[lo]) < 0) (a[hi], a[lo]) = (a[lo], a[hi]);
            if (Compare(a[hi], a[mid]) < 0) (a[hi], a[mid]) = (a[mid], a[hi]);
            var pivot = a[mid];
            int i = lo, j = hi;
            while (i <= j)
            {
                while (Compare(a[i], pivot) < 0) i++;
                while (Compare(pivot, a[j]) < 0) j--;
                if (i <= j)
                {
                    (a[i], a[j]) = (a[j], a[i]);
                    i++;
                    j--;
                }
            }
            return (j, i);
        }

        public void Sort(SortKey* a, int lo, int hi)
        {
            while (hi - lo >= 24)
            {
                var (j, i) = Partition(a, lo, hi);
                if (j - lo < hi - i)
                {
                    Sort(a, lo, j);
                    lo = i;
                }
                else
                {
                    Sort(a, i, hi);
                    hi = j;
                }
            }
            for (int i = lo + 1; i <= hi; i++)
            {
                var v = a[i];
                int j = i - 1;
                while (j >= lo && Compare(v, a[j]) < 0)
                {
                    a[j + 1] = a[j];
                    j--;
                }
                a[j + 1] = v;
            }
        }
    }

    /// <summary>Adds every entry of another table.</summary>
    public void MergeFrom(TokenTable other)
    {
        // the other table's entries in insertion order (its arena read sequentially too), each home slot here
        // prefetched a few entries ahead: one cache miss per type, in this table only
        var es = other.Entries;
        const int Ahead = 8;
        Span<ulong> ring = stackalloc ulong[Ahead];
        for (int i = 0; i < Math.Min(Ahead, es.Length); i++) ring[i] = HashAndPrefetch(other.Key(es[i]));
        for (int i = 0; i < es.Length; i++)
        {
            ulong h = ring[i % Ahead];
            if (i + Ahead < es.Length) ring[i % Ahead] = HashAndPrefetch(other.Key(es[i + Ahead]));
            ref readonly var e = ref es[i];
            var key = other.Key(e);
            KeyPacking.ShortWords(key, out ulong a, out ulong w);
            Upsert(a, w, h, key, e.Count, e.First, e.Id);
        }
    }

    private ulong HashAndPrefetch(ReadOnlySpan<byte> key)
    {
        ulong h = KeyPacking.Hash(key);
        if (Sse.IsSupported) Sse.Prefetch0(SlotAt((int)h & (_slotCount - 1)));
        return h;
    }

    /// <summary>Forgets everything (after a spill) and returns its memory to the operating system.</summary>
    public void Clear()
    {
        FreeAll();
        Init();
        OverLimit = false;
    }
}
