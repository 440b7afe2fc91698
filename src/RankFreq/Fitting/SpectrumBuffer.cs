using System.Numerics;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;

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

    /// <summary>Adds individually drawn values (none smaller than the last value held), sorted and grouped.</summary>
    /// <remarks>The values below lo + 2·count + 64 (lo the smallest; most of a power-law sample) are counted in a
    /// histogram and the few above it sorted: the same buffer content as sorting them all, in O(count) instead of
    /// O(count log count) (the sort was ~40% of a goodness-of-fit replicate's draw on a 10^9-token spectrum). The
    /// histogram is read eight cells at a time (a bit mask of the non-empty ones), and the values above it are put in
    /// order by a radix sort (the comparison sort of those was still ~13% of the draw): the same order, so the same
    /// buffer. Room for every value is made once, so the values are written without a check each.</remarks>
    public void AddIndividuals(Span<long> xs)
    {
        if (xs.Length == 0) return;
        long lo = long.MaxValue;
        foreach (var x in xs) lo = Math.Min(lo, x);
        int width = 2 * xs.Length + 64;
        // one cell more than the histogram: the far values count there (never read), so the loop has no branch on
        // which side a value falls, only a conditional step of the far values' write position
        var hist = Histogram(width + 1);
        int far = 0;
        foreach (var x in xs)
        {
            ulong d = (ulong)(x - lo);
            hist[(int)Math.Min(d, (ulong)width)]++;
            xs[far] = x; // in place: far ≤ the index being read
            far += d >= (ulong)width ? 1 : 0;
        }
        long farMax = 0;
        foreach (var x in xs[..far]) farMax = Math.Max(farMax, x);
        Reserve(Count + xs.Length);
        // the smallest value (its cell is not empty) through Add, which joins it to an equal last value held; every
        // later value is larger than all before it, or (far values) repeats its predecessor
        Add(lo, hist[0]);
        long[] values = Values, mult = Mult;
        int count = Count;
        int c = 1;
        if (Vector256.IsHardwareAccelerated)
        {
            ref int h0 = ref MemoryMarshal.GetReference(hist);
            for (; c + Vector256<int>.Count <= width; c += Vector256<int>.Count)
            {
                var cells = Vector256.LoadUnsafe(ref h0, (nuint)c);
                uint full = (~Vector256.Equals(cells, Vector256<int>.Zero)).ExtractMostSignificantBits();
                while (full != 0)
                {
                    int at = c + BitOperations.TrailingZeroCount(full);
                    values[count] = lo + at; mult[count++] = hist[at];
                    full &= full - 1;
                }
            }
        }
        for (; c < width; c++)
            if (hist[c] != 0) { values[count] = lo + c; mult[count++] = hist[c]; }
        var rest = xs[..far];
        SortFar(rest, lo + width, farMax);
        foreach (var x in rest)
        {
            if (values[count - 1] == x) mult[count - 1]++;
            else { values[count] = x; mult[count++] = 1; }
        }
        Count = count;
    }

    /// <summary>Grows the arrays to hold at least <paramref name="n"/> values.</summary>
    private void Reserve(int n)
    {
        if (Values.Length >= n) return;
        int size = Math.Max(n, Values.Length * 2);
        Array.Resize(ref Values, size); Array.Resize(ref Mult, size);
    }

    private long[] _radix = new long[256];
    private readonly int[] _digits = new int[1 << MaxRadixBits];
    private const int MaxRadixBits = 11;

    /// <summary>Sorts values in [<paramref name="min"/>, <paramref name="max"/>]: least-significant-digit radix sort on
    /// x − min, up to four passes of at most 11 bits each (the bits shared evenly, so a 24-bit range takes three passes
    /// of 8 bits, 256 buckets each), or the comparison sort for few values or a wider range.</summary>
    private void SortFar(Span<long> a, long min, long max)
    {
        ulong range = (ulong)(max - min);
        int bits = 64 - BitOperations.LeadingZeroCount(range);
        int passes = range == 0 ? 1 : (bits + MaxRadixBits - 1) / MaxRadixBits;
        if (a.Length < 128 || passes > 4 || a.Length < passes * 96) { a.Sort(); return; }
        int digit = Math.Max(1, (bits + passes - 1) / passes);
        int buckets = 1 << digit;
        ulong mask = (ulong)buckets - 1;
        if (_radix.Length < a.Length) _radix = new long[Math.Max(a.Length, _radix.Length * 2)];
        Span<long> from = a, to = _radix.AsSpan(0, a.Length);
        var count = _digits.AsSpan(0, buckets);
        for (int pass = 0, shift = 0; pass < passes; pass++, shift += digit)
        {
            count.Clear();
            foreach (var x in from) count[(int)(((ulong)(x - min) >> shift) & mask)]++;
            int sum = 0;
            for (int b = 0; b < buckets; b++) { int c = count[b]; count[b] = sum; sum += c; }
            foreach (var x in from) to[count[(int)(((ulong)(x - min) >> shift) & mask)]++] = x;
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
