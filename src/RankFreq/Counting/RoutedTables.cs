using System.Runtime.InteropServices;

namespace RankFreq.Counting;

/// <summary>
/// A token on its way to the table that owns its hash: a key of at most 16 bytes as its two packed words (see
/// <see cref="Primitives.KeyPacking.ShortWords"/>), a longer one as the offset of its bytes in the batch's byte buffer
/// (<see cref="A"/>); its 64-bit hash (<see cref="Primitives.KeyPacking.Hash"/>), length and packed position.
/// </summary>
[StructLayout(LayoutKind.Sequential)]
internal struct RoutedToken
{
    public ulong A, B, Hash;
    public long First;
    public int Len;
}

/// <summary>
/// The tables of a routed count: the key space cut by hash into one partition per thread, each partition's table fed
/// by every worker in batches under the partition's own lock. No type is held in two tables, so the tables are never
/// merged: they are ranked side by side at the end.
/// </summary>
/// <remarks>
/// The partition is taken from the hash's high 32 bits, the table's home slot from its low bits, so each partition's
/// table is still spread evenly. A table that passes its share of the budget is spilled by the worker that holds its
/// lock, into the count's spill set, exactly as a worker's own table would be.
/// </remarks>
internal sealed class RoutedTables
{
    private readonly TokenTable[] _tables;
    private readonly object[] _locks;
    private readonly SpillSet _spill;
    private readonly long _budget;

    /// <summary>Partitions of the key space, each with a table limited to <paramref name="budget"/> / parts.</summary>
    public RoutedTables(int parts, SpillSet spill, long budget)
    {
        _spill = spill;
        _budget = Math.Max(1, budget / parts);
        _tables = new TokenTable[parts];
        _locks = new object[parts];
        var gate = new object();
        for (int i = 0; i < parts; i++)
        {
            _tables[i] = new TokenTable { GrowthLimit = _budget, GrowthGate = gate };
            _locks[i] = new object();
        }
    }

    /// <summary>Number of partitions.</summary>
    public int Parts => _tables.Length;

    private volatile bool _active;

    /// <summary>Set by the first worker that starts routing; every worker routes from then on.</summary>
    public bool Active { get => _active; set => _active = value; }

    /// <summary>Whether any worker has routed tokens here.</summary>
    public bool Used { get; private set; }

    /// <summary>The partitions' tables (read once counting is over).</summary>
    public List<TokenTable> Tables => [.. _tables];

    /// <summary>The partition owning <paramref name="hash"/>.</summary>
    public static int PartOf(ulong hash, int parts) => (int)(((hash >> 32) * (ulong)parts) >> 32);

    /// <summary>Adds batches to partition <paramref name="part"/> if its lock is free (or, with
    /// <paramref name="wait"/>, once it is); false when it was busy.</summary>
    public bool TryAdd(int part, Queue<RouteBatch> batches, Action<RouteBatch> done, bool wait)
    {
        object gate = _locks[part];
        if (wait) Monitor.Enter(gate);
        else if (!Monitor.TryEnter(gate)) return false;
        try
        {
            Used = true;
            var t = _tables[part];
            while (batches.TryDequeue(out var b))
            {
                t.AddRouted(b.Tokens.AsSpan(0, b.Count), b.LongKeys.AsSpan(0, b.LongBytes));
                done(b);
                // the table held back a growth to stay within its share: spill it before memory doubles
                if (t.OverBudget(_budget)) _spill.Spill(t);
            }
        }
        finally { Monitor.Exit(gate); }
        return true;
    }

    /// <summary>Adds every type of a worker's own table (counts and first positions kept) to its partition.</summary>
    public void AddTable(TokenTable local)
    {
        if (local.Count == 0) return;
        var entries = local.Entries;
        for (int p = 0; p < _tables.Length; p++)
        {
            lock (_locks[p])
            {
                Used = true;
                var t = _tables[p];
                foreach (ref readonly var e in entries)
                {
                    var key = local.Key(e);
                    if (PartOf(Primitives.KeyPacking.Hash(key), _tables.Length) != p) continue;
                    t.Add(key, e.Count, e.First, e.Id);
                    if (t.OverLimit) _spill.Spill(t);
                }
                if (t.OverBudget(_budget)) _spill.Spill(t);
            }
        }
    }
}

/// <summary>A worker's batch of tokens for one partition.</summary>
internal sealed class RouteBatch
{
    /// <summary>Tokens per batch: large enough that taking a lock is rare, small enough to stay in the L2 cache.</summary>
    public const int Size = 4096;

    public RoutedToken[] Tokens { get; } = new RoutedToken[Size];
    public byte[] LongKeys { get; private set; } = new byte[1 << 12];
    public int Count;
    public int LongBytes;

    /// <summary>Room for <paramref name="n"/> more key bytes.</summary>
    public void Reserve(int n)
    {
        if (LongBytes + n <= LongKeys.Length) return;
        var bigger = new byte[Math.Max(LongKeys.Length * 2, LongBytes + n)];
        LongKeys.AsSpan(0, LongBytes).CopyTo(bigger);
        LongKeys = bigger;
    }

    public void Reset()
    {
        Count = 0;
        LongBytes = 0;
    }
}
