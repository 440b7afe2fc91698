using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

public class XminSearchTests
{
    /// <summary>Random spectra of several shapes: power-law tails over a noisy head, sparse far tails, flat spectra.</summary>
    private static SpectrumBuffer RandomSpectrum(ulong seed)
    {
        var rng = new Xoshiro(seed, 31, 0);
        var buf = new SpectrumBuffer();
        int shape = (int)(seed % 4);
        if (shape == 3)
        {
            // flat: every value present, multiplicities unrelated to the value (no power law at all)
            long k = 50 + rng.NextLong(2000);
            for (long x = 1; x <= k; x++) buf.Add(x, 1 + rng.NextLong(30));
            return buf;
        }
        long head = 5 + rng.NextLong(60);
        for (long x = 1; x < head; x++) buf.Add(x, rng.NextLong(200));
        double alpha = 1.3 + 2 * rng.NextDouble();
        Synthetic.PowerLawTail(rng, alpha, head, 200 + rng.NextLong(shape == 2 ? 50_000 : 5000), buf);
        return buf;
    }

    [Fact]
    public void PrunedSearchChoosesTheFullScansXminAndAlpha()
    {
        // exactness of the block pruning (TailSearch remarks): the same xmin, α and KS distance as the point-by-point
        // reference scan, on 150 random spectra of different shapes
        for (ulong seed = 1; seed <= 150; seed++)
        {
            var buf = RandomSpectrum(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            var full = s.SearchFullScan(20);
            AssertSameFit(full, s.Search(20), seed);
            // a candidate visited first (as the bootstraps do with the data's xmin): any value, in or out of range
            long firstXmin = (long)(seed * 7919 % (ulong)(buf.Values[buf.Count - 1] + 5));
            AssertSameFit(full, new TailSearch(buf.Values, buf.Mult, buf.Count).Search(20, 0, firstXmin), seed);
            if (full.Status == FitStatus.Ok)
                AssertSameFit(full, new TailSearch(buf.Values, buf.Mult, buf.Count).Search(20, 0, full.Xmin + 1), seed);
        }
    }

    [Fact]
    public void ReplicateSearchesOnSharedScratchChooseTheFullScansFit()
    {
        // the bootstraps' path (TailFitter): replicate spectra drawn as there (goodness of fit: multinomial head plus
        // power-law tail; interval: the planned multinomial resample), each searched on one buffer's reused scratch
        // arrays, spectra of changing sizes one after another; each fit must equal the full scan on fresh arrays
        var gof = new SpectrumBuffer();
        var ci = new SpectrumBuffer();
        for (ulong seed = 1; seed <= 40; seed++)
        {
            var baseBuf = RandomSpectrum(seed);
            long[] v = baseBuf.Values[..baseBuf.Count], m = baseBuf.Mult[..baseBuf.Count];
            var pl = new TailSearch(v, m, v.Length).Search(20);
            if (pl.Status != FitStatus.Ok) continue;
            var rng = new Xoshiro(seed, 1, 0);
            long nTypes = m.Sum();
            int from = new TailSearch(v, m, v.Length).IndexOf(pl.Xmin);
            gof.Clear();
            long nTail = BinomialSampler.Draw(rng, nTypes, pl.NTail / (double)nTypes);
            Synthetic.Multinomial(rng, v, m, 0, from, nTypes - nTail, gof);
            Synthetic.PowerLawTail(rng, pl.Alpha, pl.Xmin, nTail, gof);
            ci.Clear();
            Synthetic.Multinomial(new Xoshiro(seed, 2, 0), new MultinomialPlan(v, m, 0, v.Length), nTypes, ci);
            foreach (var buf in new[] { gof, ci })
            {
                var fast = buf.NewSearch().Search(20);
                var full = new TailSearch(buf.Values[..buf.Count], buf.Mult[..buf.Count], buf.Count).SearchFullScan(20);
                AssertSameFit(full, fast, seed);
            }
        }
    }

    /// <summary>The pruned search's fit equals the full scan's: status, xmin, α and KS distance.</summary>
    internal static void AssertSameFit(PowerLawFit full, PowerLawFit fast, ulong seed)
    {
        Assert.Equal(full.Status, fast.Status);
        Assert.Equal(full.Xmin, fast.Xmin);
        // α to the Newton tolerance (1e-11 relative): the two orders warm-start the iteration from different neighbours
        Assert.True(Math.Abs(full.Alpha - fast.Alpha) <= 1e-10 * full.Alpha, $"seed {seed}: α {fast.Alpha:R} vs {full.Alpha:R}");
        Assert.True(Math.Abs(full.KsDistance - fast.KsDistance) <= 1e-9, $"seed {seed}: KS {fast.KsDistance:R} vs {full.KsDistance:R}");
    }

    [Fact]
    public void PrunedKsEqualsTheFullSupremumAtEveryCandidate()
    {
        // without a give-up level both walks must return the supremum over every integer of the tail
        for (ulong seed = 1; seed <= 40; seed++)
        {
            var buf = RandomSpectrum(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            for (int i = 0; i < buf.Count - 2; i += 1 + buf.Count / 25)
            {
                var f = s.FitAt(i);
                if (f.Status != FitStatus.Ok) continue;
                double a = s.Ks(i, f.Alpha), b = s.KsFullScan(i, f.Alpha);
                Assert.True(Math.Abs(a - b) <= 1e-12, $"seed {seed}, candidate {i}: {a:R} vs {b:R}");
            }
        }
    }

    [Fact]
    public void KsWithAGiveUpLevelDecidesAsTheFullScanAfterEarlierWalks()
    {
        // the walk first probes the value where the previous walk on the same search peaked (TailSearch.KsGiven): any
        // tail point is a lower bound, so with a give-up level the verdict (reaches it or not) must be the full scan's,
        // and a distance below the level must be the supremum itself, bit for bit; candidates walked in order as the
        // search does, levels around each distance, so the probe both stops walks and lets them run
        int probedStops = 0;
        for (ulong seed = 1; seed <= 40; seed++)
        {
            var buf = RandomSpectrum(seed);
            var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
            var reference = new TailSearch(buf.Values, buf.Mult, buf.Count);
            for (int i = 0; i < buf.Count - 2; i++)
            {
                var f = reference.FitAt(i);
                if (f.Status != FitStatus.Ok) continue;
                double sup = reference.Ks(i, f.Alpha);
                double level = sup * (i % 3 == 0 ? 1.5 : i % 3 == 1 ? 0.5 : 0.9);
                double a = s.Ks(i, f.Alpha, level);
                if (sup < level) Assert.Equal(sup, a);
                else
                {
                    Assert.True(a >= level, $"seed {seed}, candidate {i}: {a:R} below the level {level:R} (sup {sup:R})");
                    Assert.True(a <= sup + 1e-12, $"seed {seed}, candidate {i}: {a:R} above the supremum {sup:R}");
                    probedStops++;
                }
            }
        }
        Assert.True(probedStops > 100, $"only {probedStops} walks reached their level");
    }

    [Fact]
    public void KsMatchesADirectSumOverEveryInteger()
    {
        // independent check of the walk: the model CDF summed term by term from x^−α/ζ(α, xmin), empirical CDF counted
        // directly, supremum over every integer up to the largest value (the definition, Clauset et al. 2009, §3.3)
        var buf = RandomSpectrum(6);
        var s = new TailSearch(buf.Values, buf.Mult, buf.Count);
        foreach (int i in new[] { 0, 3, 10 })
        {
            var f = s.FitAt(i);
            long xmin = buf.Values[i], n = 0;
            for (int j = i; j < buf.Count; j++) n += buf.Mult[j];
            double z = HurwitzZeta.Value(f.Alpha, xmin), cdf = 0, d = 0;
            long cum = 0;
            int jj = i;
            for (long x = xmin; x <= buf.Values[buf.Count - 1]; x++)
            {
                cdf += Math.Pow(x, -f.Alpha) / z;
                if (jj < buf.Count && buf.Values[jj] == x) cum += buf.Mult[jj++];
                d = Math.Max(d, Math.Abs(cum / (double)n - cdf));
            }
            Assert.True(Math.Abs(s.Ks(i, f.Alpha) - d) < 1e-9, $"candidate {i}: {s.Ks(i, f.Alpha):R} vs {d:R}");
        }
    }
}

public class ReplicateLevelTests
{
    private static SpectrumBuffer Spectrum(ulong seed)
    {
        var rng = new Xoshiro(seed, 37, 0);
        var buf = new SpectrumBuffer();
        int shape = (int)(seed % 5);
        if (shape == 4)
        {
            // a spike: one value holds nearly every type, so tails there sit near the α cap (the full search decides)
            buf.Add(1, 1 + rng.NextLong(50));
            buf.Add(7, 5000 + rng.NextLong(5000));
            for (long x = 8; x < 8 + 3 + rng.NextLong(5); x++) buf.Add(x, 1);
            return buf;
        }
        long head = 2 + rng.NextLong(40);
        for (long x = 1; x < head; x++) buf.Add(x, rng.NextLong(300));
        double alpha = 1.4 + 1.8 * rng.NextDouble();
        Synthetic.PowerLawTail(rng, alpha, head, 100 + rng.NextLong(shape == 3 ? 40_000 : 4000), buf);
        return buf;
    }

    [Fact]
    public void LevelVerdictIsTheFullScansComparison()
    {
        // TailSearch.ReachesLevel (the goodness-of-fit replicates' question) against the full point-by-point scan:
        // status ok or not, and distance at or above the level, for levels on both sides of each spectrum's distance
        int below = 0, above = 0, invalid = 0;
        for (ulong seed = 1; seed <= 120; seed++)
        {
            var buf = Spectrum(seed);
            var full = new TailSearch(buf.Values, buf.Mult, buf.Count).SearchFullScan(20);
            long first = buf.Values[(int)(seed % (ulong)buf.Count)];
            foreach (double factor in new[] { 0.3, 1 - 1e-6, 1 + 1e-6, 3 })
            {
                double d = full.Status == FitStatus.Ok ? full.KsDistance : 0.05;
                double level = d * factor;
                var verdict = new TailSearch(buf.Values, buf.Mult, buf.Count).ReachesLevel(20, first, level);
                var expected = Expected(full, level);
                Assert.True(expected == verdict,
                    $"seed {seed}, level {level:R}: {verdict} where the full scan says {expected} "
                    + $"({full.Status}, D = {full.KsDistance:R})");
                if (verdict == TailSearch.ReplicateVerdict.Below) below++;
                else if (verdict == TailSearch.ReplicateVerdict.AtOrAbove) above++;
                else invalid++;
            }
        }
        Assert.True(below > 100 && above > 100 && invalid > 0,
            $"{below} below, {above} at or above, {invalid} invalid");
    }

    private static TailSearch.ReplicateVerdict Expected(PowerLawFit full, double level) =>
        full.Status != FitStatus.Ok ? TailSearch.ReplicateVerdict.Invalid
            : full.KsDistance >= level ? TailSearch.ReplicateVerdict.AtOrAbove : TailSearch.ReplicateVerdict.Below;

    [Fact]
    public void LevelVerdictOnSharedScratchMatchesForBootstrapDraws()
    {
        // the goodness-of-fit path of TailFitter: replicate spectra drawn from a fitted law onto one reused buffer, the
        // verdict at the data's distance against the full scan of a fresh copy
        var gof = new SpectrumBuffer();
        int n = 0;
        long dropped = 0;
        for (ulong seed = 1; seed <= 30; seed++)
        {
            var baseBuf = Spectrum(seed);
            long[] v = baseBuf.Values[..baseBuf.Count], m = baseBuf.Mult[..baseBuf.Count];
            var pl = new TailSearch(v, m, v.Length).Search(20);
            if (pl.Status != FitStatus.Ok) continue;
            long nTypes = m.Sum();
            int from = new TailSearch(v, m, v.Length).IndexOf(pl.Xmin);
            for (ulong r = 0; r < 4; r++)
            {
                var rng = new Xoshiro(seed, 1, r);
                gof.Clear();
                long nTail = BinomialSampler.Draw(rng, nTypes, pl.NTail / (double)nTypes);
                Synthetic.Multinomial(rng, v, m, 0, from, nTypes - nTail, gof);
                Synthetic.PowerLawTail(rng, pl.Alpha, pl.Xmin, nTail, gof);
                var search = gof.NewSearch();
                var verdict = search.ReachesLevel(20, pl.Xmin, pl.KsDistance);
                dropped += search.BlockDropped;
                var full = new TailSearch(gof.Values[..gof.Count], gof.Mult[..gof.Count], gof.Count).SearchFullScan(20);
                var expected = Expected(full, pl.KsDistance);
                Assert.True(expected == verdict,
                    $"seed {seed}, replicate {r}: {verdict} where the full scan says {expected}");
                n++;
            }
        }
        Assert.True(n > 60, $"only {n} replicates compared");
        // the block screen (TailSearch.Blocks.cs) took part in the verdicts compared
        Assert.True(dropped > 0, "no candidate was dropped in a run");
    }

    [Fact]
    public void CapBoundExceedsTheMeanLogExcessAtAlpha30()
    {
        // E_30[ln(X/v)] over x ≥ v summed directly (terms in log space, until they vanish) must stay below the bound
        // that lets a replicate skip the cap check (TailSearch.NoneAtCap), for small and large v
        foreach (long v in new long[] { 1, 2, 3, 5, 10, 30, 63, 64, 65, 100, 1000, 100_000 })
        {
            double num = 0, den = 0;
            for (long x = v; x < v + 200_000; x++)
            {
                double w = Math.Exp(-30 * (Math.Log(x) - Math.Log(v)));
                if (w < 1e-300) break;
                num += w * (Math.Log(x) - Math.Log(v));
                den += w;
            }
            double exact = num / den, bound = TailSearch.CapExcessBound(v);
            Assert.True(bound >= exact, $"v = {v}: bound {bound:R} below E_30[ln(X/v)] = {exact:R}");
            Assert.True(bound <= 1.0 / Math.Min(v, 64) + 1.0 / 28 + 1e-12,
                $"v = {v}: bound {bound:R} looser than the large-v one");
        }
    }
}
