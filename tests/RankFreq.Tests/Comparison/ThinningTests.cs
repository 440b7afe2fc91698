using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using Xunit;

namespace RankFreq.Tests.Comparison;

public class ThinningTests
{
    // Binomial thinning keeps each token with probability p, so a type seen c times keeps Binomial(c, p) tokens:
    // E[kept] = p·c and Var = c·p(1−p) (the binomial mean and variance, common practice). Tolerances are 4.5 standard
    // errors of the replicate mean with a fixed seed: a correct sampler passes, and a bias of 1% in the kept share fails
    // the three large cases (4.5 standard errors are below 0.2% of their means there).
    [Theory]
    [InlineData(50_000L, 1L, 0.3)]    // one large count: the per-type path
    [InlineData(37L, 5L, 0.05)]       // few types: the per-type path
    [InlineData(10L, 10_000L, 0.3)]   // many types sharing a small count: the multinomial path
    [InlineData(3L, 200_000L, 0.7)]
    public void KeepsExpectedCounts(long c, long m, double p)
    {
        var s = new FrequencySpectrum([c], [m]);
        const int reps = 400;
        double sum = 0;
        for (int r = 0; r < reps; r++) sum += SpectrumThinning.Thin(s, p, new Xoshiro(11, 5, (ulong)r)).TokenCount;
        double mean = sum / reps;
        double expected = p * c * m;
        double se = Math.Sqrt(c * m * p * (1 - p) / reps);
        Assert.True(Math.Abs(mean - expected) < 4.5 * se, $"mean kept {mean}, expected {expected} ± {4.5 * se}");
    }

    [Fact]
    public void KeptCountHistogramFollowsTheBinomialPmf()
    {
        // 20,000 types of count 10 thinned with p = 0.4: the number of types keeping k tokens is ~ 20,000·C(10,k)·0.4^k·0.6^(10−k)
        // (k = 0 types vanish, so their number is 20,000 − V). Pearson's χ² over k = 0..10 with 10 degrees of freedom stays
        // below 29.59, the 0.999 quantile of χ²(10) (standard χ² table value, from memory).
        const long m = 20_000;
        const double p = 0.4;
        var t = SpectrumThinning.Thin(new FrequencySpectrum([10], [m]), p, new Xoshiro(3));
        var observed = new double[11];
        for (int i = 0; i < t.Values.Length; i++) observed[t.Values[i]] = t.Types[i];
        observed[0] = m - t.TypeCount;
        double chi2 = 0;
        for (int k = 0; k <= 10; k++)
        {
            double e = m * Binom(10, k) * Math.Pow(p, k) * Math.Pow(1 - p, 10 - k);
            chi2 += (observed[k] - e) * (observed[k] - e) / e;
        }
        Assert.True(chi2 < 29.59, $"χ² = {chi2}");
        Assert.InRange(chi2, 0.5, 29.59); // an exact match of expectations would mean no randomness at all
    }

    private static double Binom(int n, int k)
    {
        double r = 1;
        for (int i = 0; i < k; i++) r = r * (n - i) / (i + 1);
        return r;
    }

    [Fact]
    public void SameStreamSameResultAndPOneIsIdentity()
    {
        var s = FrequencySpectrum.FromCounts([1, 1, 1, 2, 2, 5, 9, 40, 40, 700]);
        Assert.Equal(SpectrumThinning.Thin(s, 0.3, new Xoshiro(7, 1, 2)), SpectrumThinning.Thin(s, 0.3, new Xoshiro(7, 1, 2)));
        Assert.Equal(s, SpectrumThinning.Thin(s, 1, new Xoshiro(7)));
        Assert.Throws<ArgumentOutOfRangeException>(() => SpectrumThinning.Thin(s, 0, new Xoshiro(7)));
    }
}
