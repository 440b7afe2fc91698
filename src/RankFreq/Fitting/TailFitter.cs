using System.Diagnostics;
using RankFreq.Counting;

namespace RankFreq.Fitting;

/// <summary>
/// The tail fit of Clauset, Shalizi &amp; Newman (2009, SIAM Review 51:661–703) on a frequency spectrum: discrete
/// power-law MLE with xmin chosen by the KS criterion, semi-parametric bootstrap goodness of fit (§4.1) with the
/// full xmin search on every synthetic set, nonparametric bootstrap uncertainty, and likelihood-ratio comparisons
/// with alternative families (§5). Replicate r draws from a generator seeded by (seed, r), so results are the same
/// for any thread count. A goodness-of-fit replicate with a free xmin only asks whether its search's distance reaches
/// the data's (<see cref="TailSearch.ReachesLevel"/>), which gives the same p-value as comparing the searched distance.
/// </summary>
public static class TailFitter
{
    private const ulong GofStream = 1, CiStream = 2;

    /// <summary>Fits the spectrum.</summary>
    public static TailFitResult Fit(FrequencySpectrum spectrum, FitOptions options, IProgress<FitProgress>? progress = null, CancellationToken ct = default)
    {
        var sw = Stopwatch.StartNew();
        var v = spectrum.Values;
        var m = spectrum.Types;
        if (v.Length == 0) throw new FitInputException("nothing to fit: the spectrum is empty");
        if (v[0] <= 0) throw new FitInputException($"counts must be positive integers (found {v[0]})");
        var search = new TailSearch(v, m, v.Length);
        var pl = search.Search(options.MinTail, options.Xmin);
        long nTypes = spectrum.TypeCount;
        double nan = double.NaN;
        double lsq = LeastSquaresSlope(spectrum);
        if (pl.Status != FitStatus.Ok)
            return new TailFitResult(pl, nTypes, nan, nan, nan, nan, nan, nan, nan, 0, 0, nan, nan, lsq, options.Seed, options, [], sw.Elapsed.TotalSeconds);

        int from = search.IndexOf(pl.Xmin);
        var alts = Alternatives.Compare(v, m, from, v.Length, pl, options.EffectiveAlternatives);

        var po = new ParallelOptions { MaxDegreeOfParallelism = options.EffectiveThreads, CancellationToken = ct };
        double gofP = nan;
        if (options.Reps > 0)
        {
            var above = new sbyte[options.Reps]; // 1: distance ≥ the data's, 0: below, −1: the replicate's fit failed
            int done = 0;
            // enough cells for any tail count a replicate draws in practice (mean + 10 sd + 100); beyond, computed
            long maxTail = pl.NTail + 10 * (long)Math.Ceiling(Math.Sqrt(pl.NTail)) + 100;
            var cells = new PowerLawCells(pl.Alpha, pl.Xmin, maxTail);
            Parallel.For(0, options.Reps, po, () => new SpectrumBuffer(), (r, _, buf) =>
            {
                var rng = new Xoshiro(options.Seed, GofStream, (ulong)r);
                buf.Clear();
                long nTail = options.Xmin > 0 ? pl.NTail : BinomialSampler.Draw(rng, nTypes, pl.NTail / (double)nTypes);
                if (options.Xmin <= 0) Synthetic.Multinomial(rng, v, m, 0, from, nTypes - nTail, buf);
                Synthetic.PowerLawTail(rng, pl.Alpha, pl.Xmin, nTail, buf, cells);
                var s = buf.NewSearch();
                if (options.Xmin > 0)
                {
                    var f = s.Search(options.MinTail, options.Xmin, pl.Xmin);
                    above[r] = (sbyte)(f.Status == FitStatus.Ok ? (f.KsDistance >= pl.KsDistance ? 1 : 0) : -1);
                }
                else
                {
                    // only "ok, and at or above the data's distance?" counts: asked of the search directly, most
                    // replicates need no fit of their own best candidate (TailSearch.ReachesLevel)
                    above[r] = (sbyte)(s.ReachesLevel(options.MinTail, pl.Xmin, pl.KsDistance) switch
                    {
                        TailSearch.ReplicateVerdict.AtOrAbove => 1,
                        TailSearch.ReplicateVerdict.Below => 0,
                        _ => -1,
                    });
                }
                int k = Interlocked.Increment(ref done);
                if ((k & 63) == 0) progress?.Report(new FitProgress("goodness of fit", k, options.Reps));
                return buf;
            }, _ => { });
            int valid = above.Count(x => x >= 0);
            gofP = valid == 0 ? nan : above.Count(x => x == 1) / (double)valid;
        }

        double aSd = nan, aLo = nan, aHi = nan, xLo = nan, xHi = nan, nSd = nan;
        int ciDone = 0;
        double[] alphaReps = [];
        if (options.CiReps > 0)
        {
            var alpha = new double[options.CiReps];
            var xmin = new double[options.CiReps];
            var ntail = new double[options.CiReps];
            int done = 0;
            var plan = new MultinomialPlan(v, m, 0, v.Length);
            Parallel.For(0, options.CiReps, po, () => new SpectrumBuffer(), (r, _, buf) =>
            {
                var rng = new Xoshiro(options.Seed, CiStream, (ulong)r);
                buf.Clear();
                Synthetic.Multinomial(rng, plan, nTypes, buf);
                var f = buf.NewSearch().Search(options.MinTail, options.Xmin, pl.Xmin);
                bool ok = f.Status == FitStatus.Ok;
                alpha[r] = ok ? f.Alpha : nan; xmin[r] = ok ? f.Xmin : nan; ntail[r] = ok ? f.NTail : nan;
                int k = Interlocked.Increment(ref done);
                if ((k & 63) == 0) progress?.Report(new FitProgress("uncertainty", k, options.CiReps));
                return buf;
            }, _ => { });
            var a = alpha.Where(double.IsFinite).Order().ToArray();
            var x = xmin.Where(double.IsFinite).Order().ToArray();
            ciDone = a.Length;
            alphaReps = a;
            if (a.Length > 1)
            {
                aSd = Sd(a); aLo = Percentile(a, 0.025); aHi = Percentile(a, 0.975);
                xLo = Percentile(x, 0.025); xHi = Percentile(x, 0.975);
                nSd = Sd(ntail.Where(double.IsFinite).ToArray());
            }
        }
        double zs = 1 / (pl.Alpha - 1);
        double zsSe = pl.AlphaSe / ((pl.Alpha - 1) * (pl.Alpha - 1));
        return new TailFitResult(pl, nTypes, aSd, aLo, aHi, xLo, xHi, nSd, gofP, options.Reps, ciDone, zs, zsSe, lsq,
            options.Seed, options, alts, sw.Elapsed.TotalSeconds)
        { AlphaReplicates = alphaReps };
    }

    private static double Sd(double[] x)
    {
        double mean = x.Average();
        return Math.Sqrt(x.Sum(t => (t - mean) * (t - mean)) / Math.Max(1, x.Length - 1));
    }

    /// <summary>Linear-interpolation percentile of sorted data (the common "type 7" definition).</summary>
    internal static double Percentile(double[] sorted, double q)
    {
        if (sorted.Length == 0) return double.NaN;
        double h = (sorted.Length - 1) * q;
        int lo = (int)Math.Floor(h);
        int hi = Math.Min(lo + 1, sorted.Length - 1);
        return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
    }

    /// <summary>
    /// Ordinary least-squares slope of log10 frequency on log10 rank over every type (the folk log–log line; biased,
    /// shown only for comparison). Ranks of the types sharing a count form a block; sums over blocks of more than 64
    /// ranks use closed forms (<see cref="RankLogSums"/>).
    /// </summary>
    public static double LeastSquaresSlope(FrequencySpectrum s)
    {
        double n = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
        long rank = 1;
        for (int i = s.Values.Length - 1; i >= 0; i--)
        {
            long cnt = s.Types[i];
            double y = Math.Log(s.Values[i]);
            long a = rank, b = rank + cnt - 1;
            var (sumL, sumL2) = RankLogSums(a, b);
            n += cnt; sx += sumL; sxx += sumL2; sy += cnt * y; sxy += y * sumL;
            rank = b + 1;
        }
        double cov = sxy - sx * sy / n, var = sxx - sx * sx / n;
        return var > 0 ? cov / var : double.NaN;
    }

    /// <summary>Σ ln r and Σ ln² r over the ranks a..b.</summary>
    /// <remarks>
    /// Up to 64 ranks, ranks below 65 and blocks shorter than a/2^16, term by term; else Σ ln r = lnΓ(b+1) − lnΓ(a)
    /// and Euler–Maclaurin for ln² r (DLMF §2.10.1):
    /// ∫_a^b ln² x dx + (ln² a + ln² b)/2 + (B₂/2!)(f′(b) − f′(a)), f′(x) = 2 ln x / x, with ∫ ln² x = x(ln² x − 2 ln x + 2).
    /// The first term left out is (B₄/4!)|f‴| ≤ (4 ln a + 6)/(720 a³) (f‴(x) = (8 ln x − 12)/x³, B₄/4! = −1/720), below
    /// 1e-7 for a ≥ 65 against a sum of more than 64 terms. Tested against the sums term by term for blocks of 65 to
    /// 5,000 ranks starting anywhere from 1 to 10^10 (Fitting/GoodnessOfFitTests.cs): within 1e-10 relative. The term
    /// by term loop above 64 ranks had cost ~0.5 s of the point fit of a 10^11-token spectrum (~10^7 logarithms).
    /// </remarks>
    internal static (double SumL, double SumL2) RankLogSums(long a, long b)
    {
        // term by term also where the closed forms would cancel: their terms are ~a ln² a against a sum of ~len ln² a,
        // so rounding costs ~1e-16·a/len relative; a/len ≤ 2^16 keeps that near 1e-11
        // ranks below 1 mean the types' running total overflowed: no slope (and no endless split of the head below)
        if (a < 1) return (double.NaN, double.NaN);
        long len = b - a + 1;
        if (len <= 64 || len < 1L << 47 && len << 16 < a)
        {
            double sumL = 0, sumL2 = 0;
            for (long r = a; r <= b; r++) { double l = Math.Log(r); sumL += l; sumL2 += l * l; }
            return (sumL, sumL2);
        }
        if (a < 65)
        {
            // the first ranks term by term, where the left-out Euler–Maclaurin terms are not small
            var (h1, h2) = RankLogSums(a, 64);
            var (t1, t2) = RankLogSums(65, b);
            return (h1 + t1, h2 + t2);
        }
        static double F(double x) { double l = Math.Log(x); return x * (l * l - 2 * l + 2); }
        double la = Math.Log(a), lb = Math.Log(b);
        return (MathNet.Numerics.SpecialFunctions.GammaLn(b + 1) - MathNet.Numerics.SpecialFunctions.GammaLn(a),
            F(b) - F(a) + 0.5 * (la * la + lb * lb) + (lb / b - la / a) / 6.0);
    }
}
