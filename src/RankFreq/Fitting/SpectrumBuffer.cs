namespace RankFreq.Fitting;

/// <summary>A growable spectrum buffer (values increasing), reused across replicates to avoid allocation.</summary>
internal sealed class SpectrumBuffer
{
    public long[] Values = new long[1024];
    public long[] Mult = new long[1024];
    public int Count;

    /// <summary>Suffix arrays for the xmin search of the spectrum held (<see cref="TailSearch"/>'s scratch).</summary>
    public readonly TailSearch.SearchScratch Search = new();

    /// <summary>The xmin search over the spectrum held, on this buffer's scratch arrays.</summary>
    public TailSearch NewSearch() => new(Values, Mult, Count, Search);
    private long[] _scratch = new long[256];

    public void Clear() => Count = 0;

    public void Add(long value, long mult)
    {
        if (mult <= 0) return;
        if (Count > 0 && Values[Count - 1] == value) { Mult[Count - 1] += mult; return; }
        if (Count == Values.Length) { Array.Resize(ref Values, Count * 2); Array.Resize(ref Mult, Count * 2); }
        Values[Count] = value; Mult[Count] = mult; Count++;
    }

    private int[] _hist = new int[256];

    /// <summary>Adds individually drawn values (all larger than those already held), sorted and grouped.</summary>
    /// <remarks>The values below lo + 2·count + 64 (lo the smallest; most of a power-law sample) are counted in a
    /// histogram and the few above it sorted: the same buffer content as sorting them all, in O(count) instead of
    /// O(count log count) (the sort was ~40% of a goodness-of-fit replicate's draw on a 10^9-token spectrum).</remarks>
    public void AddIndividuals(Span<long> xs)
    {
        if (xs.Length == 0) return;
        long lo = long.MaxValue;
        foreach (var x in xs) lo = Math.Min(lo, x);
        int width = 2 * xs.Length + 64;
        var hist = Histogram(width);
        int far = 0;
        foreach (var x in xs)
        {
            ulong d = (ulong)(x - lo);
            if (d < (ulong)width) hist[(int)d]++;
            else xs[far++] = x; // in place: far ≤ the index being read
        }
        for (int d = 0; d < width; d++)
            if (hist[d] != 0) Add(lo + d, hist[d]);
        var rest = xs[..far];
        rest.Sort();
        foreach (var x in rest) Add(x, 1);
    }

    /// <summary>A cleared count per cell for <paramref name="n"/> cells (the same scratch as <see cref="AddIndividuals"/>).</summary>
    public Span<int> Histogram(int n)
    {
        if (_hist.Length < n) _hist = new int[Math.Max(n, _hist.Length * 2)];
        var h = _hist.AsSpan(0, n);
        h.Clear();
        return h;
    }

    public Span<long> Scratch(int n)
    {
        if (_scratch.Length < n) _scratch = new long[Math.Max(n, _scratch.Length * 2)];
        return _scratch.AsSpan(0, n);
    }
}
