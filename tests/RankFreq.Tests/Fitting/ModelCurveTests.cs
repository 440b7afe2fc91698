using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

/// <summary>The fitted model's expected spectrum, the log-binned observed spectrum and the kept bootstrap α values.</summary>
public class ModelCurveTests
{
    private static PowerLawFit Fit(double alpha, long xmin, long nTail) =>
        new(alpha, 0.01, alpha, xmin, nTail, 0.01, 0, 1, FitStatus.Ok, "");

    [Fact]
    public void ExpectedSpectrumAtXminOneIsTheBaselFormula()
    {
        // ζ(2, 1) = ζ(2) = π²/6 (Euler's Basel sum): expected types at x are n·6/(π² x²).
        var (x, e) = TailModelCurves.Spectrum(Fit(2.0, 1, 600), 10_000);
        Assert.True(x.Length > 100);
        Assert.Equal(1, x[0]);
        for (int i = 0; i < x.Length; i++)
            Assert.Equal(600 * 6 / (Math.PI * Math.PI * x[i] * x[i]), e[i], 1e-10 * e[i]);
    }

    [Fact]
    public void ExpectedSpectrumAboveXminUsesTheHurwitzNormaliser()
    {
        // ζ(2.5, 5) = 0.069310532044321880377764293877737937285428450498298 (mpmath, Data/hurwitz-mpmath.csv).
        const double z = 0.069310532044321880377764293877737937285428450498298;
        var (x, e) = TailModelCurves.Spectrum(Fit(2.5, 5, 1234), 5_000);
        Assert.Equal(5, x[0]);
        Assert.Equal(5_000, x[^1]);
        for (int i = 0; i < x.Length; i++) Assert.Equal(1234 * Math.Pow(x[i], -2.5) / z, e[i], 1e-10 * e[i]);
        // the floor stops the curve where fewer types than that are expected
        var (xf, ef) = TailModelCurves.Spectrum(Fit(2.5, 5, 1234), 5_000, floor: 0.5);
        Assert.True(xf.Length < x.Length && ef[^1] >= 0.5);
    }

    [Fact]
    public void LogBinsKeepEveryTypeAndAverageOverTheirWidth()
    {
        var s = FrequencySpectrum.FromPairs([(1, 900), (2, 300), (10, 7), (11, 3), (12, 2), (40, 1), (41, 1), (1000, 1), (1500, 1)]);
        var (x, avg, width) = SpectrumBins.LogBinned(s, 10, perDecade: 5);
        // edges ⌈10·10^(k/5)⌉: [10,15], [16,25], [26,39], [40,63], [64,99], ..., [631,999], [1000,1584]
        Assert.Equal(15 - 10 + 1, width[0]);
        Assert.Equal(12.0 / 6, avg[0], 12);
        Assert.Equal(Math.Sqrt(10 * 15.0), x[0], 12);
        Assert.Equal(s.Types.Where((_, i) => s.Values[i] >= 10).Sum(), avg.Zip(width, (a, w) => a * w).Sum(), 9);
        Assert.All(avg, a => Assert.True(a > 0)); // empty bins left out
        Assert.Equal(3, x.Length); // [10,15], [40,63] and [1000,1584] hold types
        Assert.Equal(2.0 / 585, avg[2], 12);
    }

    [Fact]
    public void BootstrapAlphaValuesAreKeptBehindTheInterval()
    {
        var pairs = Enumerable.Range(1, 40).Select(f => ((long)f, (long)Math.Round(4000.0 / (f * f)))).Where(p => p.Item2 > 0).ToList();
        pairs.AddRange(new long[] { 55, 80, 130, 260, 700, 2100 }.Select(f => (f, 1L)));
        var s = FrequencySpectrum.FromPairs(pairs);
        var fit = TailFitter.Fit(s, new FitOptions(MinTail: 10, Reps: 0, CiReps: 120, Seed: 3, Threads: 2));
        Assert.Equal(FitStatus.Ok, fit.PowerLaw.Status);
        var a = fit.AlphaReplicates.ToArray();
        Assert.Equal(fit.CiReps, a.Length);
        Assert.Equal(a.Order().ToArray(), a);
        // type-7 percentiles (Hyndman & Fan 1996, the default of R and NumPy: common practice) of the kept values
        static double Q(double[] v, double q)
        {
            double h = (v.Length - 1) * q;
            int lo = (int)h;
            return v[lo] + (h - lo) * (v[Math.Min(lo + 1, v.Length - 1)] - v[lo]);
        }
        Assert.Equal(fit.AlphaLo, Q(a, 0.025), 12);
        Assert.Equal(fit.AlphaHi, Q(a, 0.975), 12);
        double mean = a.Average();
        Assert.Equal(fit.AlphaSd, Math.Sqrt(a.Sum(v => (v - mean) * (v - mean)) / (a.Length - 1)), 12);
        // without the bootstrap nothing is kept
        Assert.Empty(TailFitter.Fit(s, new FitOptions(MinTail: 10, Reps: 0, CiReps: 0)).AlphaReplicates);
    }
}
