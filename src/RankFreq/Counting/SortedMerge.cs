using RankFreq.Primitives;
using System.Buffers.Binary;

namespace RankFreq.Counting;

/// <summary>
/// Ranks several tables of one count in memory without merging them into one hash table: each table's types are
/// sorted by key on their own (the tables in parallel), the key-ordered streams are merged with equal keys combined,
/// and the merged stream is put in rank order by a stable counting sort on the count (key order is kept within a
/// count, which is the tie rule of <see cref="Primitives.RankOrder"/>).
/// </summary>
/// <remarks>
/// Merging the tables by inserting one into another costs a random probe per type and the growth of the receiving
/// table, on one thread; at millions of types that was the largest serial step of a two-thread count. Here the sorts
/// run side by side and everything after them reads memory in order. Counts below <see cref="Buckets"/> are placed by
/// their bucket; the few larger ones are sorted by comparison and go first. The result is the same total order as
/// ranking the merged table, so the rows are identical.
/// </remarks>
internal static unsafe class SortedMerge
{
    /// <summary>Counts below this are placed by a counting sort; larger ones (at most tokens / this) are compared.</summary>
    private const int Buckets = 1 << 16;

    /// <summary>
    /// One ranked type in 20 bytes: its key words and length, or for a key over 16 bytes where its bytes are (table and
    /// entry in place of the words). A row per type is alive beside the counts at the rank step's peak.
    /// </summary>
    [System.Runtime.InteropServices.StructLayout(System.Runtime.InteropServices.LayoutKind.Sequential, Pack = 4)]
    private readonly record struct Row(ulong A, ulong B, int Len)
    {
        public static Row Of(ulong a, ulong b, int len, int part, int index) =>
            len <= 16 ? new Row(a, b, len) : new Row((ulong)part, (ulong)index, len);
    }

    /// <summary>Ranks <paramref name="tables"/> (two or more, none empty); frees their slots on the way.</summary>
    public static (Utf8Tokens[] Tokens, long[] Counts, int[]? Ids) Rank(List<TokenTable> tables, GrowthHistogram growth,
        bool withIds)
    {
        var parts = new TokenTable.SortedTypes[tables.Count];
        Row* placed = null;
        long placedBytes = 0;
        try
        {
            Parallel.For(0, tables.Count, CoreLimit.Options, i =>
            {
                tables[i].FreeSlots(); // probing is over; the slots are most of a table's memory
                parts[i] = tables[i].Sorted(byCount: false);
            });

            // pass 1: how many types of each count, and the types of large counts
            var hist = new long[Buckets];
            var big = new List<(long Count, long Order)>();
            long n = 0;
            Merge(tables, parts, (in Cursor c, long count, long first, int id) =>
            {
                if (count < Buckets) hist[count]++;
                else big.Add((count, n));
                n++;
            });
            // rank order: large counts descending (ties in key order, i.e. stream order), then buckets descending
            big.Sort((x, y) => x.Count != y.Count ? y.Count.CompareTo(x.Count) : x.Order.CompareTo(y.Order));
            var bigRank = new Dictionary<long, int>(big.Count);
            for (int i = 0; i < big.Count; i++) bigRank[big[i].Order] = i;
            var next = new long[Buckets];
            long at = big.Count;
            for (int c = Buckets - 1; c >= 1; c--) { next[c] = at; at += hist[c]; }

            // pass 2: every type to its rank
            int rows = checked((int)n);
            var counts = new long[rows];
            var ids = withIds ? new int[rows] : null;
            // in a native block, freed as soon as the strings are made: as a managed array it stayed on the large
            // object heap as garbage through the table's write, on top of the strings
            placedBytes = (long)Math.Max(1, rows) * sizeof(Row);
            placed = (Row*)NativeBlock.Alloc(placedBytes);
            long order = 0;
            Merge(tables, parts, (in Cursor c, long count, long first, int id) =>
            {
                long r = count < Buckets ? next[count]++ : bigRank[order];
                order++;
                counts[r] = count;
                if (ids is not null) ids[r] = id;
                placed[r] = Row.Of(c.A, c.B, c.Len, c.Part, c.Index);
                growth.Add(first);
            });
            foreach (var p in parts) p.Dispose();
            parts = [];

            nint rowsAt = (nint)placed;
            var tokens = InMemoryRows.MakeChunks(rows, (r, buffer) => KeyOf(tables, ((Row*)rowsAt)[r], buffer));
            return (tokens, counts, ids);
        }
        finally
        {
            foreach (var p in parts) p?.Dispose();
            NativeBlock.Free(placed, placedBytes);
        }
    }

    /// <summary>
    /// Ranks tables that share no key (the partitions of a routed count): each is put in rank order on its own thread
    /// (<see cref="TokenTable.SortedByRank"/>, its growth recorded there too), then the rank-ordered streams are merged
    /// (count descending, ties by key bytes: the order of <see cref="Primitives.RankOrder"/>), so the rows are those of
    /// ranking one table holding every type. Frees the tables' slots on the way.
    /// </summary>
    public static (Utf8Tokens[] Tokens, long[] Counts, int[]? Ids) RankDisjoint(List<TokenTable> tables, GrowthHistogram growth,
        bool withIds)
    {
        int k = tables.Count;
        var parts = new TokenTable.SortedTypes[k];
        var growths = new GrowthHistogram[k];
        Row* placed = null;
        long placedBytes = 0;
        try
        {
            Parallel.For(0, k, CoreLimit.Options, i =>
            {
                tables[i].FreeSlots();
                var sorted = parts[i] = tables[i].SortedByRank(parallel: false, consume: true);
                var g = growths[i] = growth.Fork();
                for (int r = 0; r < sorted.Length; r++) g.Add(sorted.FirstAt(r));
                // short keys only: the sort records are all that is read from here on
                tables[i].ReleaseIfSortRecordsSuffice();
            });
            foreach (var g in growths) growth.Absorb(g);

            int rows = checked(parts.Sum(p => p.Length));
            var counts = new long[rows];
            var ids = withIds ? new int[rows] : null;
            // in a native block, freed as soon as the strings are made: as a managed array it stayed on the large
            // object heap as garbage through the table's write, on top of the strings
            placedBytes = (long)Math.Max(1, rows) * sizeof(Row);
            placed = (Row*)NativeBlock.Alloc(placedBytes);
            // the rank-ordered streams merged in segments side by side: segment s starts at the part-0 type
            // s/segments of the way along and, in every other part, at the first type that does not rank before it
            int segments = rows < 1 << 16 ? 1 : Math.Clamp(CoreLimit.Cores, 1, 16);
            var cut = new int[segments + 1][];
            for (int sg = 0; sg <= segments; sg++)
            {
                cut[sg] = new int[k];
                for (int i = 0; i < k; i++)
                {
                    if (sg == 0) continue;
                    if (sg == segments) { cut[sg][i] = parts[i].Length; continue; }
                    int p0 = (int)((long)parts[0].Length * sg / segments);
                    cut[sg][i] = i == 0 ? p0 : CountRankingBefore(tables, parts, i, 0, p0);
                }
            }
            nint placedAt = (nint)placed;
            var ps = parts;
            Parallel.For(0, segments, CoreLimit.Options, sg =>
            {
                var pos = (int[])cut[sg].Clone();
                var end = cut[sg + 1];
                int r = cut[sg].Sum();
                int stop = end.Sum();
                for (; r < stop; r++)
                {
                    // the head ranking first among the parts (k is the thread count: a linear scan)
                    int m = -1;
                    for (int i = 0; i < k; i++)
                    {
                        if (pos[i] == end[i]) continue;
                        if (m < 0 || RankBefore(tables, ps, i, pos[i], m, pos[m])) m = i;
                    }
                    var part = ps[m];
                    int at = pos[m]++;
                    counts[r] = part.CountAt(at);
                    if (ids is not null) ids[r] = part.IdAt(at);
                    ((Row*)placedAt)[r] = Row.Of(part.AAt(at), part.BAt(at), part.LenAt(at), m, part.IndexAt(at));
                }
            });
            foreach (var p in parts) p.Dispose();
            parts = [];

            nint rowsAt = (nint)placed;
            var tokens = InMemoryRows.MakeChunks(rows, (r, buffer) => KeyOf(tables, ((Row*)rowsAt)[r], buffer));
            return (tokens, counts, ids);
        }
        finally
        {
            foreach (var p in parts) p?.Dispose();
            NativeBlock.Free(placed, placedBytes);
        }
    }

    /// <summary>How many types of part <paramref name="pi"/> rank before type <paramref name="y"/> of part
    /// <paramref name="py"/> (a binary search: each part is in rank order, and no type is in two parts).</summary>
    private static int CountRankingBefore(List<TokenTable> tables, TokenTable.SortedTypes[] parts, int pi, int py, int y)
    {
        int lo = 0, hi = parts[pi].Length;
        while (lo < hi)
        {
            int mid = (int)(((uint)lo + (uint)hi) >> 1);
            if (RankBefore(tables, parts, pi, mid, py, y)) lo = mid + 1;
            else hi = mid;
        }
        return lo;
    }

    /// <summary>Whether type <paramref name="x"/> of part <paramref name="px"/> ranks before type <paramref name="y"/> of
    /// part <paramref name="py"/>.</summary>
    private static bool RankBefore(List<TokenTable> tables, TokenTable.SortedTypes[] parts, int px, int x, int py, int y)
    {
        TokenTable.SortedTypes a = parts[px], b = parts[py];
        long ca = a.CountAt(x), cb = b.CountAt(y);
        if (ca != cb) return ca > cb;
        var cx = new Cursor { Part = px, A = a.AAt(x), B = a.BAt(x), Len = a.LenAt(x), Index = a.IndexAt(x) };
        var cy = new Cursor { Part = py, A = b.AAt(y), B = b.BAt(y), Len = b.LenAt(y), Index = b.IndexAt(y) };
        return Compare(tables, cx, cy) < 0;
    }

    private static ReadOnlySpan<byte> KeyOf(List<TokenTable> tables, in Row row, Span<byte> buffer)
    {
        if (row.Len > 16) return tables[(int)row.A].Key(tables[(int)row.A].Entries[(int)row.B]);
        BinaryPrimitives.WriteUInt64BigEndian(buffer, row.A);
        BinaryPrimitives.WriteUInt64BigEndian(buffer[8..], row.B);
        return buffer[..row.Len];
    }

    /// <summary>The head of one table's key-ordered stream.</summary>
    private struct Cursor
    {
        public int Part, Pos, Len, Index;
        public ulong A, B;
    }

    private delegate void Visit(in Cursor head, long count, long first, int id);

    /// <summary>
    /// Walks the key-ordered streams of all parts in key order, calling <paramref name="visit"/> once per distinct key
    /// with the summed count, the earliest first position and the id.
    /// </summary>
    private static void Merge(List<TokenTable> tables, TokenTable.SortedTypes[] parts, Visit visit)
    {
        int k = parts.Length;
        var heads = new Cursor[k];
        int live = 0;
        for (int p = 0; p < k; p++)
            if (parts[p].Length > 0) heads[live++] = Load(parts[p], p, 0);
        Span<bool> same = stackalloc bool[k];
        while (live > 0)
        {
            // the smallest key among the heads and which heads hold it, one comparison per other head (k is the
            // thread count: a linear scan beats a heap)
            int m = 0;
            same[0] = true;
            for (int i = 1; i < live; i++)
            {
                int c = Compare(tables, heads[i], heads[m]);
                if (c < 0)
                {
                    same[..i].Clear();
                    m = i;
                }
                same[i] = c <= 0;
            }
            var min = heads[m];
            long count = 0, first = long.MaxValue;
            int id = -1;
            for (int i = 0; i < live; i++)
            {
                if (!same[i]) continue;
                var part = parts[heads[i].Part];
                int pos = heads[i].Pos;
                count += part.CountAt(pos);
                first = Math.Min(first, part.FirstAt(pos));
                if (id == -1) id = part.IdAt(pos);
            }
            visit(min, count, first, id);
            // advance the heads that held the key, from the last: a finished head's slot takes the last head, which
            // has been dealt with already
            for (int i = live - 1; i >= 0; i--)
            {
                if (!same[i]) continue;
                same[i] = false;
                var part = parts[heads[i].Part];
                if (heads[i].Pos + 1 < part.Length) heads[i] = Load(part, heads[i].Part, heads[i].Pos + 1);
                else heads[i] = heads[--live];
            }
        }
    }

    private static Cursor Load(TokenTable.SortedTypes part, int p, int pos) => new()
    {
        Part = p,
        Pos = pos,
        A = part.AAt(pos),
        B = part.BAt(pos),
        Len = part.LenAt(pos),
        Index = part.IndexAt(pos),
    };

    /// <summary>Ordinal order of the key bytes: packed big-endian words first, the arena beyond 16 bytes.</summary>
    private static int Compare(List<TokenTable> tables, in Cursor x, in Cursor y)
    {
        if (x.A != y.A) return x.A < y.A ? -1 : 1;
        if (x.B != y.B) return x.B < y.B ? -1 : 1;
        if (x.Len <= 16 && y.Len <= 16) return x.Len.CompareTo(y.Len);
        // the first 16 bytes (zero-padded) are equal: a key of at most 16 bytes is a prefix of the longer one, and its
        // table may be freed already (short keys only rank from their sort records), so it is not read
        if (x.Len <= 16) return -1;
        if (y.Len <= 16) return 1;
        var tx = tables[x.Part];
        var ty = tables[y.Part];
        return tx.Key(tx.Entries[x.Index]).SequenceCompareTo(ty.Key(ty.Entries[y.Index]));
    }
}
