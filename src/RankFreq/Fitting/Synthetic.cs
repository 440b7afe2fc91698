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

/// <summary>Synthetic data generated as spectra (Clauset et al. 2009, §4.1, written over value multiplicities).</summary>
internal static class Synthetic
{
    /// <summary>
    /// Adds <paramref name="n"/> draws from the discrete power law (α, xmin) to <paramref name="buf"/> as a spectrum:
    /// sequential binomial splitting over small x (the count at x is Binomial(remaining, x^−α/ζ(α, x))), then the few
    /// remaining far-tail points drawn one by one with the exact rejection–inversion sampler conditioned on x ≥ the current value.
    /// </summary>
    public static void PowerLawTail(Xoshiro rng, double alpha, long xmin, long n, SpectrumBuffer buf)
    {
        long remaining = n;
        long x = xmin;
        double z = HurwitzZeta.Value(alpha, xmin);
        int steps = 0;
        while (remaining > 0)
        {
            double t = Math.Exp(-alpha * Math.Log(x));
            double p = t / z;
            if (remaining < 32 || remaining * p < 1) break;
            long k = Samplers.Binomial(rng, remaining, p);
            buf.Add(x, k);
            remaining -= k;
            z -= t;
            x++;
            // refresh ζ now and then so the running subtraction cannot drift
            if ((++steps & 255) == 0) z = HurwitzZeta.Value(alpha, x);
        }
        if (remaining > 0)
        {
            var xs = buf.Scratch((int)remaining);
            for (int i = 0; i < xs.Length; i++) xs[i] = Samplers.PowerLaw(rng, alpha, x);
            buf.AddIndividuals(xs);
        }
    }

    /// <summary>Adds a multinomial draw of <paramref name="n"/> points over the values <c>v[from..to)</c> with probabilities ∝ m.</summary>
    public static void Multinomial(Xoshiro rng, long[] v, long[] m, int from, int to, long n, SpectrumBuffer buf)
    {
        double mass = 0;
        for (int j = from; j < to; j++) mass += m[j];
        long remaining = n;
        for (int j = from; j < to && remaining > 0; j++)
        {
            long k = j == to - 1 ? remaining : Samplers.Binomial(rng, remaining, Math.Min(1, m[j] / mass));
            buf.Add(v[j], k);
            remaining -= k;
            mass -= m[j];
        }
    }
}
