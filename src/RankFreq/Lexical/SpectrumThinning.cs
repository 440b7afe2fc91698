using MathNet.Numerics;
using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Lexical;

/// <summary>
/// Binomial thinning of a frequency spectrum: every token is kept independently with probability p, so a type seen
/// c times keeps Binomial(c, p) occurrences and drops out when it keeps none. Thinning a corpus of N tokens with
/// p = n / N gives a random sample of about n tokens with the corpus's own type probabilities, which is what a
/// comparison at matched size needs (the lexical figures and the fitted tail all depend on N).
/// </summary>
/// <remarks>
/// Works on the (value, multiplicity) pairs. For a value c shared by m types the m kept counts are i.i.d.
/// Binomial(c, p), so their histogram is Multinomial(m; b₀..b_c) with b_k = C(c, k) p^k (1 − p)^(c−k); it is drawn by
/// sequential conditional binomials, the k-th with probability b_k / Σ_{j≥k} b_j (suffix sums of the pmf, computed
/// from log C(c, k) in doubles, so nothing cancels). That costs O(c) per value and is used when m exceeds c and 16;
/// otherwise each of the m types draws Binomial(c, p) on its own. Both draw with <see cref="BinomialSampler"/>, the
/// bootstraps' sampler (constant expected time). Both paths are exact in distribution; tests check E[kept] = p·c and the kept-count
/// histogram against the binomial pmf with a fixed seed.
/// </remarks>
public static class SpectrumThinning
{
    /// <summary>The spectrum after keeping each token with probability <paramref name="p"/> (0 &lt; p ≤ 1).</summary>
    public static FrequencySpectrum Thin(FrequencySpectrum spectrum, double p, Xoshiro rng) =>
        Thin(spectrum.Values, spectrum.Types, spectrum.Values.Length, p, rng);

    /// <summary>Thinning of a spectrum given as parallel arrays (first <paramref name="count"/> used, values increasing).</summary>
    public static FrequencySpectrum Thin(long[] values, long[] types, int count, double p, Xoshiro rng)
    {
        if (!(p > 0 && p <= 1)) throw new ArgumentOutOfRangeException(nameof(p), p, "the keep probability must be in (0, 1]");
        if (p == 1) return new FrequencySpectrum(values[..count], types[..count]);
        var kept = new Dictionary<long, long>();
        double[] pmf = [], suffix = [];
        for (int i = 0; i < count; i++)
        {
            long c = values[i], m = types[i];
            if (m <= 16 || c >= m)
            {
                for (long t = 0; t < m; t++)
                {
                    long k = BinomialSampler.Draw(rng, c, p);
                    if (k > 0) kept[k] = kept.GetValueOrDefault(k) + 1;
                }
                continue;
            }
            // here c < m, so the pmf table is no longer than the number of types it serves
            if (pmf.Length < c + 2) { pmf = new double[c + 2]; suffix = new double[c + 2]; }
            double lp = Math.Log(p), lq = Math.Log(1 - p), lnC = SpecialFunctions.GammaLn(c + 1);
            for (long k = 0; k <= c; k++)
                pmf[k] = Math.Exp(lnC - SpecialFunctions.GammaLn(k + 1) - SpecialFunctions.GammaLn(c - k + 1) + k * lp + (c - k) * lq);
            suffix[c + 1] = 0;
            for (long k = c; k >= 0; k--) suffix[k] = suffix[k + 1] + pmf[k];
            long remaining = m;
            for (long k = 0; k <= c && remaining > 0; k++)
            {
                long x = k == c ? remaining : BinomialSampler.Draw(rng, remaining, Math.Min(1, pmf[k] / suffix[k]));
                if (k > 0 && x > 0) kept[k] = kept.GetValueOrDefault(k) + x;
                remaining -= x;
            }
        }
        var keys = kept.Keys.ToArray();
        Array.Sort(keys);
        var mult = new long[keys.Length];
        for (int i = 0; i < keys.Length; i++) mult[i] = kept[keys[i]];
        return new FrequencySpectrum(keys, mult);
    }
}
