using System.Buffers.Binary;
using RankFreq.Primitives;

namespace RankFreq.Counting;

internal sealed unsafe partial class TokenTable
{
    /// <summary>The sort record of entry <paramref name="i"/>: count, first 16 key bytes, first position.</summary>
    private SortKey RecordOf(in Entry e, int i)
    {
        ulong a = e.K0, b = e.K1;
        if (e.Len > 16) KeyPacking.Pack16(Key(in e)[..16], out a, out b);
        // little-endian packed words byte-reversed: the first byte becomes the most significant
        return new SortKey(e.Count, BinaryPrimitives.ReverseEndianness(a), BinaryPrimitives.ReverseEndianness(b),
            e.First, e.Len, i);
    }

    /// <summary>
    /// Every type of the table in rank order (<paramref name="byCount"/>: count descending, ties by key bytes) or in
    /// key order (a spill run's order), as sort records in a native block that the caller disposes.
    /// </summary>
    /// <remarks>
    /// The records carry count, first position and the first 16 key bytes, so the sorted types are read in one
    /// sequential pass: reading them through entry indices instead costs a cache and TLB miss per type in the
    /// entries and another in the arena, which at millions of types was most of a ranking's time.
    /// </remarks>
    /// <remarks>
    /// With <paramref name="consume"/>, a table of short keys without ids turns its entries into the records in place
    /// (as <see cref="SortedByRank"/> does) and is empty afterwards: a spill then needs no second block beside the table.
    /// </remarks>
    public SortedTypes Sorted(bool byCount, bool consume = false)
    {
        var entries = Entries;
        int n = entries.Length;
        if (consume && SortsInPlace && n > 0)
        {
            long bytes = (long)_entryCap * sizeof(Entry);
            var records = TakeEntriesAsRecords();
            try
            {
                new SortKeyComparer(this, byCount).SortParallel(records, n);
                return new SortedTypes(this, records, n, bytes);
            }
            catch
            {
                NativeBlock.Free(records, bytes);
                throw;
            }
        }
        var keys = (SortKey*)NativeBlock.Alloc((long)Math.Max(1, n) * sizeof(SortKey));
        try
        {
            for (int i = 0; i < n; i++)
            {
                keys[i] = RecordOf(entries[i], i);
            }
            new SortKeyComparer(this, byCount).SortParallel(keys, n);
            return new SortedTypes(this, keys, n, (long)Math.Max(1, n) * sizeof(SortKey));
        }
        catch
        {
            NativeBlock.Free(keys, (long)Math.Max(1, n) * sizeof(SortKey));
            throw;
        }
    }

    /// <summary>
    /// Every type of the table in rank order, as <see cref="Sorted"/> with <c>byCount</c> gives it, by a counting sort
    /// on the count (counts below 65,536 placed by bucket, larger ones first and compared) and then a sort of each
    /// bucket by key alone: no count comparisons, and the buckets are small except the lowest counts'. With
    /// <paramref name="parallel"/>, large buckets are sorted on two threads.
    /// </summary>
    /// <remarks>
    /// With <paramref name="consume"/>, a table whose keys are all of at most 16 bytes and that has no ids (so the
    /// records are all that is read afterwards) turns each entry into its sort record where it lies — both are 40
    /// bytes — and places the records by count in place (American flag sort over the count buckets): no second block
    /// of records beside the entries, which had been the peak of a count at millions of types. The table gives its
    /// blocks up and is empty afterwards.
    /// </remarks>
    public SortedTypes SortedByRank(bool parallel, bool consume = false)
    {
        const int Buckets = 1 << 16;
        var entries = Entries;
        int n = entries.Length;
        var hist = new int[Buckets];
        foreach (ref readonly var e in entries) hist[e.Count < Buckets ? (int)e.Count : 0]++;
        // bucket starts: large counts (bucket 0; no count is 0) first, then counts descending
        var next = new int[Buckets];
        int at = hist[0];
        for (int c = Buckets - 1; c >= 1; c--) { next[c] = at; at += hist[c]; }
        bool inPlace = consume && SortsInPlace && n > 0;
        long keysBytes = inPlace ? (long)_entryCap * sizeof(Entry) : (long)Math.Max(1, n) * sizeof(SortKey);
        var keys = inPlace ? RecordsInPlace(hist, next) : (SortKey*)NativeBlock.Alloc(keysBytes);
        try
        {
            if (!inPlace)
                for (int i = 0; i < n; i++)
                {
                    ref readonly var e = ref entries[i];
                    int bucket = e.Count < Buckets ? (int)e.Count : 0;
                    keys[next[bucket]++] = RecordOf(e, i);
                }
            var byRank = new SortKeyComparer(this, byCount: true);
            var byKey = new SortKeyComparer(this, byCount: false);
            if (hist[0] > 1) byRank.Sort(keys, 0, hist[0] - 1);
            for (int c = 1; c < Buckets; c++)
            {
                // buckets lie in descending count order: bucket c ends where its pointer stopped
                int size = hist[c];
                if (size == 0) continue;
                int lo = next[c] - size;
                if (size > 1) RadixThenSort(byKey, keys + lo, size, 0, parallel);
            }
            return new SortedTypes(this, keys, n, keysBytes);
        }
        catch
        {
            NativeBlock.Free(keys, keysBytes);
            throw;
        }
    }

    /// <summary>
    /// The entries turned into sort records where they lie (<see cref="TakeEntriesAsRecords"/>) and placed in
    /// count-bucket order in place, each record moved once (cycle leader); <paramref name="next"/> holds each bucket's
    /// start and ends at its end. The table is empty afterwards.
    /// </summary>
    private SortKey* RecordsInPlace(int[] hist, int[] next)
    {
        const int Buckets = 1 << 16;
        var keys = TakeEntriesAsRecords();
        // bucket ends, in the order the buckets lie: bucket 0 (large counts) first, then counts descending
        var end = new int[Buckets];
        end[0] = hist[0];
        for (int c = 1; c < Buckets; c++) end[c] = next[c] + hist[c];
        var head = new int[Buckets];
        head[0] = 0;
        for (int c = 1; c < Buckets; c++) head[c] = next[c];
        for (int c = 0; c < Buckets; c++)
        {
            int stop = end[c];
            while (head[c] < stop)
            {
                var v = keys[head[c]];
                int d = v.Count < Buckets ? (int)v.Count : 0;
                while (d != c)
                {
                    (v, keys[head[d]]) = (keys[head[d]], v);
                    head[d]++;
                    d = v.Count < Buckets ? (int)v.Count : 0;
                }
                keys[head[c]++] = v;
            }
        }
        for (int c = 1; c < Buckets; c++) next[c] = end[c];
        return keys;
    }

    /// <summary>
    /// Each entry turned into its sort record where it lies (both 40 bytes; short keys only, so no record reads the
    /// arena), and the block handed over to the caller: the table frees the rest and is empty afterwards.
    /// </summary>
    private SortKey* TakeEntriesAsRecords()
    {
        int n = _count;
        var records = (SortKey*)_entries;
        for (int i = 0; i < n; i++)
        {
            var r = RecordOf(_entries[i], i); // the whole entry read before its record overwrites it
            records[i] = r;
        }
        _entries = null;
        _entryCap = 0;
        FreeAll();
        return records;
    }

    /// <summary>
    /// Sorts <paramref name="n"/> records by key: in place by one key byte at a time (American flag sort: each record
    /// moved once to its byte's bucket), from the first byte (<paramref name="level"/> 0) through the sixteenth while a
    /// bucket holds at least <see cref="RadixMin"/> records, then each bucket by comparison. The byte order is the
    /// comparison's order (big-endian words compared unsigned, first word first), so the result is the same; the
    /// comparison sort only sees small buckets and keys that share their first 16 bytes.
    /// </summary>
    /// <remarks>
    /// Bucket 0 of a level holds the keys that end before that byte (zero padding), at most one short key per prefix,
    /// so it goes to the comparison sort at once instead of through the remaining levels.
    /// </remarks>
    private static void RadixThenSort(SortKeyComparer byKey, SortKey* a, int n, int level, bool parallel)
    {
        if (n < RadixMin || level >= 16)
        {
            if (parallel) byKey.SortParallel(a, n);
            else byKey.Sort(a, 0, n - 1);
            return;
        }
        int shift = 56 - 8 * (level & 7);
        bool second = level >= 8;
        Span<int> head = stackalloc int[257];
        Span<int> start = stackalloc int[257];
        head.Clear();
        // the digits' range: keys of a few scripts use few byte values, so the loops below skip the rest
        int lowest = 255, highest = 0;
        for (int i = 0; i < n; i++)
        {
            int d = Digit(a[i], second, shift);
            head[d]++;
            lowest = Math.Min(lowest, d);
            highest = Math.Max(highest, d);
        }
        // every key has the same byte here: on to the next byte without moving anything
        if (lowest == highest)
        {
            if (lowest == 0) byKey.Sort(a, 0, n - 1);
            else RadixThenSort(byKey, a, n, level + 1, parallel);
            return;
        }
        start[..(lowest + 1)].Clear();
        for (int d = lowest, sum = 0; d <= highest; d++) { start[d] = sum; sum += head[d]; }
        start[(highest + 1)..].Fill(n);
        start.CopyTo(head);
        for (int d = lowest; d <= highest; d++)
        {
            int end = start[d + 1];
            while (head[d] < end)
            {
                var v = a[head[d]];
                int digit = Digit(v, second, shift);
                while (digit != d)
                {
                    (v, a[head[digit]]) = (a[head[digit]], v);
                    head[digit]++;
                    digit = Digit(v, second, shift);
                }
                a[head[d]++] = v;
            }
        }
        if (start[1] > 1) byKey.Sort(a, 0, start[1] - 1);
        if (parallel && n >= 1 << 15)
        {
            var bounds = start.ToArray();
            nint p = (nint)a;
            Parallel.For(1, 256, CoreLimit.Options, d =>
            {
                int size = bounds[d + 1] - bounds[d];
                if (size > 1) RadixThenSort(byKey, (SortKey*)p + bounds[d], size, level + 1, false);
            });
            return;
        }
        for (int d = Math.Max(1, lowest); d <= highest; d++)
        {
            int size = start[d + 1] - start[d];
            if (size > 1) RadixThenSort(byKey, a + start[d], size, level + 1, false);
        }
    }

    /// <summary>Buckets below this size are sorted by comparison rather than by another byte.</summary>
    private const int RadixMin = 64;

    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static int Digit(in SortKey k, bool second, int shift) => (int)((second ? k.B : k.A) >> shift) & 255;

    /// <summary>
    /// Frees the slots of a table whose counting is over (counts are copied into the entries first): entries and keys
    /// stay readable; nothing may be added until <see cref="Clear"/>.
    /// </summary>
    internal void FreeSlots()
    {
        if (_dirty) SyncCounts();
        NativeBlock.Free(_slots, SlotBytes);
        _slots = null;
        _slotCount = 0;
    }

    /// <summary>Whether <see cref="SortedByRank"/> with <c>consume</c> turns the entries into the sort records in place.</summary>
    internal bool SortsInPlace => !_hasLongKeys && !_hasIds;

    /// <summary>Whether any key was added with a vocabulary id (otherwise every id is -1).</summary>
    private bool _hasIds;

    /// <summary>Whether any key is longer than 16 bytes (only those are read from the arena once sorted).</summary>
    private bool _hasLongKeys;

    /// <summary>
    /// Frees entries, key bytes and slots when sort records made before hold all that is left to read (every key of at
    /// most 16 bytes, no ids): the rank step's peak is then lower by the table. The table must not be read again
    /// except through those records, and is empty afterwards. Returns whether it was freed.
    /// </summary>
    internal bool ReleaseIfSortRecordsSuffice()
    {
        if (_hasLongKeys || _hasIds) return false;
        FreeAll();
        return true;
    }

    /// <summary>The sorted types of <see cref="Sorted"/>; valid while the table is unchanged.</summary>
    internal sealed class SortedTypes : IDisposable
    {
        private readonly TokenTable _table;
        private SortKey* _keys;
        private readonly long _bytes;

        internal SortedTypes(TokenTable table, void* keys, int length, long bytes)
        {
            _table = table;
            _keys = (SortKey*)keys;
            Length = length;
            _bytes = bytes;
        }

        /// <summary>Number of types.</summary>
        public int Length { get; }

        /// <summary>The count of the type at position <paramref name="i"/>.</summary>
        public long CountAt(int i) => _keys[i].Count;

        /// <summary>The first position (packed) of the type at position <paramref name="i"/>.</summary>
        public long FirstAt(int i) => _keys[i].First;

        /// <summary>Key bytes 0–7 of the type at position <paramref name="i"/> as a big-endian word (zero-padded).</summary>
        public ulong AAt(int i) => _keys[i].A;

        /// <summary>Key bytes 8–15 of the type at position <paramref name="i"/> as a big-endian word (zero-padded).</summary>
        public ulong BAt(int i) => _keys[i].B;

        /// <summary>The key length in bytes of the type at position <paramref name="i"/>.</summary>
        public int LenAt(int i) => _keys[i].Len;

        /// <summary>The entry index (insertion order) of the type at position <paramref name="i"/>.</summary>
        public int IndexAt(int i) => _keys[i].Index;

        /// <summary>The vocabulary id of the type at position <paramref name="i"/>, or -1.</summary>
        public int IdAt(int i) => _table._hasIds ? _table._entries[_keys[i].Index].Id : -1;

        /// <summary>
        /// The key bytes of the type at position <paramref name="i"/>: rebuilt in <paramref name="buffer"/> (16 bytes)
        /// from the sort record for keys of at most 16 bytes, read from the arena beyond.
        /// </summary>
        public ReadOnlySpan<byte> KeyAt(int i, Span<byte> buffer)
        {
            ref readonly var k = ref _keys[i];
            if (k.Len > 16) return _table.Key(_table._entries[k.Index]);
            BinaryPrimitives.WriteUInt64BigEndian(buffer, k.A);
            BinaryPrimitives.WriteUInt64BigEndian(buffer[8..], k.B);
            return buffer[..k.Len];
        }

        /// <summary>Frees the sort records.</summary>
        public void Dispose()
        {
            NativeBlock.Free(_keys, _bytes);
            _keys = null;
        }
    }
}
