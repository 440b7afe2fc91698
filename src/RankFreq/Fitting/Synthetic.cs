namespace RankFreq.Fitting;

/// <summary>Synthetic data generated as spectra (Clauset et al. 2009, §4.1, written over value multiplicities).</summary>
/// <remarks>
/// Exact in distribution: a multinomial draw of n points over cells with probabilities π_1, π_2, … is the sequence of
/// conditional binomials k_j ~ Binomial(n − Σ_{i&lt;j} k_i, π_j / Σ_{i≥j} π_i) (common practice; Devroye 1986,
/// "Non-Uniform Random Variate Generation", §XI.1.4). Each binomial comes from <see cref="BinomialSampler"/> (constant
/// expected time), so a replicate costs O(distinct values) at a few tens of nanoseconds per cell. Since issue 13's
/// speed round the bootstraps draw with it instead of the order-statistic recursion of <see cref="Samplers.Binomial"/>:
/// the same law, other random numbers, so p-values and intervals for a given seed differ from earlier versions.
/// </remarks>
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
            long k = BinomialSampler.Draw(rng, remaining, p);
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
            Samplers.PowerLaw(rng, alpha, x, xs);
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
            long k = j == to - 1 ? remaining : BinomialSampler.Draw(rng, remaining, Math.Min(1, m[j] / mass));
            buf.Add(v[j], k);
            remaining -= k;
            mass -= m[j];
        }
    }
}
