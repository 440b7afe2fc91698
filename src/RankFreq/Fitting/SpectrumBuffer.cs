namespace RankFreq.Fitting;

/// <summary>A growable spectrum buffer (values increasing), reused across replicates to avoid allocation.</summary>
internal sealed class SpectrumBuffer
{
    public long[] Values = new long[1024];
    public long[] Mult = new long[1024];
    public int Count;
    private long[] _scratch = new long[256];

    public void Clear() => Count = 0;

    public void Add(long value, long mult)
    {
        if (mult <= 0) return;
        if (Count > 0 && Values[Count - 1] == value) { Mult[Count - 1] += mult; return; }
        if (Count == Values.Length) { Array.Resize(ref Values, Count * 2); Array.Resize(ref Mult, Count * 2); }
        Values[Count] = value; Mult[Count] = mult; Count++;
    }

    /// <summary>Adds individually drawn values (all larger than those already held), sorted and grouped.</summary>
    public void AddIndividuals(Span<long> xs)
    {
        xs.Sort();
        foreach (var x in xs) Add(x, 1);
    }

    public Span<long> Scratch(int n)
    {
        if (_scratch.Length < n) _scratch = new long[Math.Max(n, _scratch.Length * 2)];
        return _scratch.AsSpan(0, n);
    }
}
