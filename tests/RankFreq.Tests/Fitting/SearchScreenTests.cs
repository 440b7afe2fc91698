using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

/// <summary>
/// The screening bound of the pruned xmin search (TailSearch.Screen.cs): a lower bound on the KS distance at the
/// fitted α that lets most candidates be dropped after one ζ evaluation. Its exactness is checked against the
/// point-by-point reference scan (the definition of Clauset, Shalizi &amp; Newman 2009, §3.3) on random spectra.
/// </summary>
public class SearchScreenTests
{
    /// <summary>Spectra shaped like word counts: a noisy head, then a power-law tail drawn as a spectrum with many types
    /// (dense values over a long range, a sparse far tail), or a lognormal-like bump that no power law fits.</summary>
    private static SpectrumBuffer ZipfLike(ulong seed)
    {
        var rng = new Xoshiro(seed, 47, 0);
        var buf = new SpectrumBuffer();
        long head = 2 + rng.NextLong(40);
        double alpha = 1.5 + 1.2 * rng.NextDouble();
        for (long x = 1; x < head; x++) buf.Add(x, (long)(200_000 * Math.Pow(x, -alpha) * (0.5 + rng.NextDouble())));
        if (seed % 5 == 4)
        {
            // no power law: counts spread around a bump in ln x
            for (long x = head; x < head + 3000; x++)
            {
                double z = (Math.Log(x) - 5) / 0.6;
                buf.Add(x, Samplers.Binomial(rng, 5000, Math.Min(1, Math.Exp(-0.5 * z * z))));
            }
            return buf;
        }
        Synthetic.PowerLawTail(rng, alpha, head, 20_000 + rng.NextLong(300_000), buf);
        return buf;
    }

    [Fact]
    public void ScreenedSearchEqualsTheFullScanOnManySpectra()
    {
        // exactness of the screen (TailSearch.Screen.cs remarks): the same status, xmin, α (to the Newton tolerance)
        // and KS distance as the unscreened point-by-point scan, on 120 word-count-like spectra and several --min-tail
        for (ulong seed = 1; seed <= 120; seed++)
        {
            var buf = ZipfLike(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            int minTail = seed % 3 == 0 ? 5 : 50;
            XminSearchTests.AssertSameFit(s.SearchFullScan(minTail), s.Search(minTail), seed);
        }
    }

    [Fact]
    public void ScreenBoundNeverExceedsTheDistanceAtTheFittedAlpha()
    {
        // the bound itself, over every point of the tail, for starts on both sides of α̂ (far, near, and within the
        // tiny step where both sides count): never above the KS distance at the fitted α, and reaching it often enough
        // to be of use
        int tested = 0, tight = 0;
        for (ulong seed = 1; seed <= 30; seed++)
        {
            var buf = ZipfLike(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            for (int i = 0; i < buf.Count - 2; i += 1 + buf.Count / 40)
            {
                var f = s.FitAt(i);
                if (f.Status != FitStatus.Ok) continue;
                double d = s.KsFullScan(i, f.Alpha);
                foreach (double delta in new[] { -0.3, -1e-3, -1e-6, -1e-9, 1e-9, 1e-6, 1e-3, 0.3 })
                {
                    double a0 = f.Alpha * (1 + delta);
                    if (a0 <= 1.0001 || a0 >= TailSearch.MaxAlpha) continue;
                    double b = s.ScreenBound(i, a0);
                    if (double.IsNaN(b)) continue;
                    tested++;
                    Assert.True(b <= d, $"seed {seed}, candidate {i}, start α·(1{delta:+0.0e0;-0.0e0}): bound {b:R} > KS {d:R}");
                    if (b >= 0.5 * d) tight++;
                }
            }
        }
        Assert.True(tested > 500, $"only {tested} bounds were applied");
        Assert.True(tight > tested / 4, $"only {tight} of {tested} bounds reach half the distance");
    }
}
