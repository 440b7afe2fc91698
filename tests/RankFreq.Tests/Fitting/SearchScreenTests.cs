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
        long dropped = 0, jumped = 0;
        for (ulong seed = 1; seed <= 120; seed++)
        {
            var buf = ZipfLike(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            int minTail = seed % 3 == 0 ? 5 : 50;
            XminSearchTests.AssertSameFit(s.SearchFullScan(minTail), s.Search(minTail), seed);
            dropped += s.BlockDropped;
            jumped += s.JumpDropped;
        }
        // the runs dropped at once by the block screen (TailSearch.Blocks.cs) and the last candidates dropped by the
        // jump at the largest value (JumpDrops) were part of what was compared
        Assert.True(dropped > 10_000, $"only {dropped} candidates were dropped in runs");
        Assert.True(jumped > 1_000, $"only {jumped} candidates were dropped by the jump bound");
    }

    [Fact]
    public void ScreenedSearchEqualsTheFullScanWhereTheBestIsAtTheCap()
    {
        // spectra whose KS-best candidate has α at the cap (near-uniform counts, sometimes under a power-law head): the
        // status then depends on whether any candidate had an interior fit (at_bound) or none (no_maximum), so a
        // candidate the screen drops must not hide an interior fit the full scan sees
        int atCap = 0;
        for (ulong seed = 1; seed <= 60; seed++)
        {
            var rng = new Xoshiro(seed, 53, 0);
            var buf = new SpectrumBuffer();
            long from = 1;
            if (seed % 2 == 0)
            {
                from = 2 + rng.NextLong(30);
                for (long x = 1; x < from; x++) buf.Add(x, (long)(50_000 * Math.Pow(x, -2.0) * (0.5 + rng.NextDouble())));
            }
            long width = 200 + rng.NextLong(3000), most = 1 + rng.NextLong(20);
            for (long x = from; x < from + width; x++) buf.Add(x, 1 + rng.NextLong(most));
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            var full = s.SearchFullScan(10);
            XminSearchTests.AssertSameFit(full, s.Search(10), seed);
            if (full.Status is FitStatus.AtBound or FitStatus.NoMaximum) atCap++;
        }
        Assert.True(atCap >= 20, $"only {atCap} of 60 spectra had their best candidate at the cap");
    }

    [Fact]
    public void BlockBoundNeverExceedsTheDistanceOfAnyCandidateInTheRun()
    {
        // the block screen's bound (TailSearch.Blocks.cs) for runs of 4 to 64 consecutive candidates, with the predicted
        // bracket shifted by several offsets: never above the KS distance of any candidate of the run at its fitted α
        // (point by point), and above a typical level often enough to be of use
        int tested = 0, useful = 0;
        for (ulong seed = 1; seed <= 20; seed++)
        {
            var buf = ZipfLike(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            // each run's candidates fitted and walked point by point (only those: the scan is O(k) per candidate)
            double Distance(int i)
            {
                var f = s.FitAt(i);
                return f.Status is FitStatus.Ok or FitStatus.AtBound ? s.KsFullScan(i, f.Alpha) : double.PositiveInfinity;
            }
            int first = s.IndexOf(64);
            for (int a = first, t = 0; a < buf.Count - 6; a += 1 + (buf.Count - first) / 25, t++)
            {
                int len = 4 << (t % 5);
                int b = Math.Min(a + len, buf.Count - 2) - 1;
                if (b - a + 1 < 4) continue;
                double least = double.NaN;
                foreach (double offset in new[] { double.NaN, 0, 1e-3, -1e-3, 0.05, -0.05 })
                {
                    double bound = s.BlockBound(a, b, offset);
                    if (double.IsNaN(bound)) continue;
                    tested++;
                    if (double.IsNaN(least))
                    {
                        least = double.PositiveInfinity;
                        for (int i = a; i <= b; i++) least = Math.Min(least, Distance(i));
                    }
                    Assert.True(bound <= least, $"seed {seed}, run {a}..{b}, offset {offset}: bound {bound:R} > KS {least:R}");
                    if (bound >= 0.002) useful++;
                }
            }
        }
        Assert.True(tested > 300, $"only {tested} bounds were verified");
        Assert.True(useful > tested / 4, $"only {useful} of {tested} bounds reach 0.002");
    }

    [Fact]
    public void JumpBoundNeverExceedsTheDistanceAtTheFittedAlpha()
    {
        // the bound from the CDF's jump at the largest value (TailSearch.Screen.cs, JumpDrops), which holds for every
        // α at once: never above the KS distance at the fitted α (point by point), for the last 400 candidates of each
        // spectrum (where it is meant to bite) and a sample of the others; and above a typical best distance for many
        int tested = 0, useful = 0;
        for (ulong seed = 1; seed <= 30; seed++)
        {
            var buf = ZipfLike(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            int last = buf.Count - 3;
            for (int i = 0; i <= last; i += i < last - 400 ? 1 + buf.Count / 30 : 1)
            {
                var f = s.FitAt(i);
                if (f.Status is not (FitStatus.Ok or FitStatus.AtBound)) continue;
                double bound = s.JumpBound(i);
                if (double.IsNaN(bound)) continue;
                double d = s.KsFullScan(i, f.Alpha);
                tested++;
                Assert.True(bound <= d, $"seed {seed}, candidate {i} (tail {f.NTail}): bound {bound:R} > KS {d:R}");
                if (bound >= 0.002) useful++;
            }
        }
        Assert.True(tested > 5_000, $"only {tested} bounds were verified");
        Assert.True(useful > tested / 4, $"only {useful} of {tested} bounds reach 0.002");
    }

    [Fact]
    public void JumpBoundsModelTermCoversTheLargestPointMassOverAlpha()
    {
        // the jump bound (TailSearch.Screen.cs, JumpDrops) takes 1/(e·x·L), L = ln(x/v_i), as the largest point mass
        // p(x) = x^−α/ζ(α, v_i) of the model at the largest value x over every α. Checked here against that mass found
        // by a search over α with ζ itself (HurwitzZeta): the bound may never exceed (m_x/n_i − max p)/2, and the term
        // is tight (ζ's integral bound, within 10% where v_i·L ≥ 20), so a weaker term cannot pass. The KS distances
        // (previous test) sit far above the bound and could not tell.
        int tested = 0;
        for (ulong seed = 1; seed <= 30; seed++)
        {
            var buf = ZipfLike(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            int j = buf.Count - 1;
            double x = buf.Values[j];
            long n = buf.Mult[j];
            for (int i = j - 1; i >= Math.Max(0, j - 400); i--)
            {
                n += buf.Mult[i];
                double bound = s.JumpBound(i);
                if (double.IsNaN(bound)) continue;
                double l = Math.Log(x / buf.Values[i]), pMax = 0;
                for (double c = 0.05; c <= 20; c *= 1.02)
                {
                    double alpha = 1 + c / l;
                    if (alpha >= TailSearch.MaxAlpha) break;
                    pMax = Math.Max(pMax, Math.Exp(-alpha * Math.Log(x) - HurwitzZeta.LogValue(alpha, buf.Values[i])));
                }
                double term = 1 / (Math.E * x * l);
                Assert.True(pMax <= term * (1 + 1e-9), $"seed {seed}, candidate {i}: mass {pMax:R} > term {term:R}");
                // ζ(α, v) exceeds its integral bound by a share of about (α − 1)/(2v), so the term is tight only where
                // v·L is large, and the largest mass is reached below the cap only where 1 + 1/L is
                if (buf.Values[i] * l < 20 || 1 + 1 / l > TailSearch.MaxAlpha / 2) continue;
                Assert.True(pMax >= 0.9 * term, $"seed {seed}, candidate {i}: mass {pMax:R} far below {term:R}");
                Assert.True(bound <= (buf.Mult[j] / (double)n - pMax) / 2,
                    $"seed {seed}, candidate {i}: bound {bound:R} above what the largest mass allows");
                tested++;
            }
        }
        Assert.True(tested > 1_000, $"only {tested} bounds were verified");
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
