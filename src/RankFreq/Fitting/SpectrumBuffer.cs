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
    /// O(count log count) (the sort was ~40% of a goodness-of-fit replicate's draw on a 10^9-token spectrum). The
    /// histogram is read by vectorised skips over empty cells, and the values above it are put in order by a radix sort
    /// (the comparison sort of those was still ~13% of the draw): the same order, so the same buffer.</remarks>
    public void AddIndividuals(Span<long> xs)
    {
        if (xs.Length == 0) return;
        long lo = long.MaxValue;
        foreach (var x in xs) lo = Math.Min(lo, x);
        int width = 2 * xs.Length + 64;
        var hist = Histogram(width);
        int far = 0;
        long farMax = 0;
        foreach (var x in xs)
        {
            ulong d = (ulong)(x - lo);
            if (d < (ulong)width) hist[(int)d]++;
            else { xs[far++] = x; farMax = Math.Max(farMax, x); } // in place: far ≤ the index being read
        }
        for (int d = 0; d < width; d++)
        {
            int skip = hist[d..].IndexOfAnyExcept(0);
            if (skip < 0) break;
            d += skip;
            Add(lo + d, hist[d]);
        }
        var rest = xs[..far];
        SortFar(rest, lo + width, farMax);
        foreach (var x in rest) Add(x, 1);
    }

    private long[] _radix = new long[256];
    private readonly int[] _digits = new int[RadixBuckets];
    private const int RadixBits = 11, RadixBuckets = 1 << RadixBits;

    /// <summary>Sorts values in [<paramref name="min"/>, <paramref name="max"/>]: least-significant-digit radix sort on
    /// x − min, 11 bits a pass (up to four passes), or the comparison sort for few values or a wider range.</summary>
    private void SortFar(Span<long> a, long min, long max)
    {
        ulong range = (ulong)(max - min);
        int bits = 64 - System.Numerics.BitOperations.LeadingZeroCount(range);
        int passes = range == 0 ? 1 : (bits + RadixBits - 1) / RadixBits;
        if (a.Length < 128 || passes > 4 || a.Length < passes * 96) { a.Sort(); return; }
        if (_radix.Length < a.Length) _radix = new long[Math.Max(a.Length, _radix.Length * 2)];
        Span<long> from = a, to = _radix.AsSpan(0, a.Length);
        var count = _digits.AsSpan();
        for (int pass = 0, shift = 0; pass < passes; pass++, shift += RadixBits)
        {
            count.Clear();
            foreach (var x in from) count[(int)(((ulong)(x - min) >> shift) & (RadixBuckets - 1))]++;
            int sum = 0;
            for (int b = 0; b < RadixBuckets; b++) { int c = count[b]; count[b] = sum; sum += c; }
            foreach (var x in from) to[count[(int)(((ulong)(x - min) >> shift) & (RadixBuckets - 1))]++] = x;
            var t = from; from = to; to = t;
        }
        if (passes % 2 == 1) from.CopyTo(a); // after an odd number of passes the order sits in the scratch
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
