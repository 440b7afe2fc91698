using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using Xunit;

namespace RankFreq.Tests.Lexical;

/// <summary>
/// Binomial thinning against the binomial distribution's own moments: every token is kept with probability p
/// independently, so a type seen m times survives with probability q_m = 1 − (1 − p)^m and keeps Binomial(m, p) tokens
/// (textbook facts of the binomial distribution). Types are independent, so E[V'] = Σ V_m q_m with variance
/// Σ V_m q_m (1 − q_m), and E[N'] = pN with variance Σ V_m m p (1 − p). Whole spectra with both drawing paths;
/// single classes and the kept-count histogram are in Comparison/ThinningTests.
/// </summary>
public class SpectrumThinningTests
{
    // a spectrum with both kinds of class: many types at small m (drawn as a multinomial) and few at large m (per type)
    private static readonly FrequencySpectrum Spectrum = new([1, 2, 3, 5, 8, 40, 300, 5000, 120000],
        [30000, 9000, 4000, 1500, 700, 80, 6, 2, 1]);

    [Theory]
    [InlineData(0.1)]
    [InlineData(0.5)]
    [InlineData(0.93)]
    public void MeansOfTypesAndTokensMatchTheBinomialFormulas(double p)
    {
        const int reps = 200;
        double eV = 0, varV = 0, eN = 0, varN = 0;
        for (int i = 0; i < Spectrum.Values.Length; i++)
        {
            double m = Spectrum.Values[i], t = Spectrum.Types[i], q = -double.ExpM1(m * double.LogP1(-p));
            eV += t * q; varV += t * q * (1 - q);
            eN += t * m * p; varN += t * m * p * (1 - p);
        }
        double sumV = 0, sumN = 0;
        for (int r = 0; r < reps; r++)
        {
            var thin = SpectrumThinning.Thin(Spectrum, p, new Xoshiro(42, 9, (ulong)r));
            Assert.All(thin.Values, v => Assert.InRange(v, 1, 120000));
            sumV += thin.TypeCount; sumN += thin.TokenCount;
        }
        // means of 200 independent draws: 4.5 standard errors (false alarm about 1e-5 per check)
        Assert.True(Math.Abs(sumV / reps - eV) < 4.5 * Math.Sqrt(varV / reps), $"V: {sumV / reps:F1} vs {eV:F1}");
        Assert.True(Math.Abs(sumN / reps - eN) < 4.5 * Math.Sqrt(varN / reps), $"N: {sumN / reps:F1} vs {eN:F1}");
    }

    [Fact]
    public void BinomialWithATinyProbabilityStaysInRange()
    {
        // p below the double spacing at 1 (1 − p == 1): Binomial(n, p) must stay in 0 … n with mean n·p; a class of 80
        // types seen 40 times, thinned at 0.93, reaches such cells (b(0) = 0.07^40) and once lost every type
        var rng = new Xoshiro(11, 2, 0);
        long sum = 0;
        for (int i = 0; i < 10000; i++)
        {
            long k = Samplers.Binomial(rng, 1_000_000_000_000L, 1e-17);
            Assert.InRange(k, 0, 1_000_000_000_000L);
            sum += k;
        }
        Assert.InRange(sum, 0, 10); // mean 1e-5 per draw: more than a few is impossible in practice
        var thin = SpectrumThinning.Thin(new FrequencySpectrum([40], [80]), 0.93, new Xoshiro(1, 1, 0));
        Assert.Equal(80, thin.TypeCount);
    }
}
