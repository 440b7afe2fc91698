using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

public class PowerLawTests
{
    private static FrequencySpectrum Sample(double alpha, long xmin, long n, ulong seed)
    {
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(seed), alpha, xmin, n, buf);
        return new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
    }

    [Theory]
    [InlineData(1.5, 1)]
    [InlineData(2.5, 5)]
    [InlineData(3.0, 20)]
    public void SamplersFollowTheExactPmf(double alpha, long xmin)
    {
        // both samplers against p(x) = x^-α/ζ(α, xmin): each of the first cells within 4.5 standard errors
        const int n = 200_000;
        var rng = new Xoshiro(99);
        var single = new long[6];
        for (int i = 0; i < n; i++) { long x = Samplers.PowerLaw(rng, alpha, xmin) - xmin; if (x < 6) single[x]++; }
        var spec = Sample(alpha, xmin, n, 5);
        double z = HurwitzZeta.Value(alpha, xmin);
        for (int k = 0; k < 6; k++)
        {
            double p = Math.Pow(xmin + k, -alpha) / z, sd = Math.Sqrt(n * p * (1 - p));
            long fromSpec = spec.Values.Contains(xmin + k) ? spec.Types[Array.IndexOf(spec.Values, xmin + k)] : 0;
            Assert.True(Math.Abs(single[k] - n * p) < 4.5 * sd, $"rejection-inversion x={xmin + k}: {single[k]} vs {n * p:F0}");
            Assert.True(Math.Abs(fromSpec - n * p) < 4.5 * sd, $"spectrum sampler x={xmin + k}: {fromSpec} vs {n * p:F0}");
        }
        Assert.Equal(n, spec.TypeCount);
    }

    [Fact]
    public void BinomialSamplerMeanAndVariance()
    {
        var rng = new Xoshiro(3);
        foreach (var (n, p) in new[] { (1_000_000L, 0.3), (5000L, 0.001), (60L, 0.5), (10_000_000L, 2e-6) })
        {
            const int reps = 4000;
            double sum = 0, sum2 = 0;
            for (int i = 0; i < reps; i++) { double k = Samplers.Binomial(rng, n, p); sum += k; sum2 += k * k; }
            double mean = sum / reps, var = sum2 / reps - mean * mean, ev = n * p * (1 - p);
            Assert.True(Math.Abs(mean - n * p) < 5 * Math.Sqrt(ev / reps), $"n={n} p={p}: mean {mean}");
            Assert.True(Math.Abs(var / ev - 1) < 0.15, $"n={n} p={p}: variance {var} vs {ev}");
        }
    }

    [Fact]
    public void MleRecoversAlphaWithoutBiasAndHonestIntervals()
    {
        // 200 repeats per (α, xmin), n_tail = 10^4, xmin fixed: mean bias < 0.01, 95% Fisher intervals cover 92–98%
        foreach (var alpha in new[] { 1.5, 2.0, 2.5, 3.0 })
            foreach (var xmin in new long[] { 1, 5, 20 })
            {
                double bias = 0;
                int covered = 0;
                const int repeats = 200;
                for (int r = 0; r < repeats; r++)
                {
                    var s = Sample(alpha, xmin, 10_000, (ulong)(r + 1000 * xmin + (int)(alpha * 10)));
                    var f = new TailSearch(s.Values, s.Types, s.Values.Length).Search(50, xmin);
                    Assert.Equal(FitStatus.Ok, f.Status);
                    bias += f.Alpha - alpha;
                    if (Math.Abs(f.Alpha - alpha) <= 1.96 * f.AlphaSe) covered++;
                }
                bias /= repeats;
                Assert.True(Math.Abs(bias) < 0.01, $"α={alpha} xmin={xmin}: bias {bias:F4}");
                Assert.InRange(covered / (double)repeats, 0.92, 0.98);
            }
    }

    [Fact]
    public void AgreesWithMpmathOptimiserAtFixedXmin()
    {
        // Reference: Data/alpha_reference.py (mpmath 1.3.0, findroot on the score at 30 digits) → Data/alpha-reference.csv
        var counts = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Data",
            "alpha-reference-counts.txt")).Where(l => l.Length > 0).Select(long.Parse);
        var s = FrequencySpectrum.FromCounts(counts);
        var search = new TailSearch(s.Values, s.Types, s.Values.Length);
        foreach (var line in File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Data", "alpha-reference.csv")).Where(l => !l.StartsWith('#')))
        {
            var p = line.Split(',');
            long xmin = long.Parse(p[0]);
            double expected = double.Parse(p[2], CultureInfo.InvariantCulture);
            var f = search.Search(2, xmin);
            Assert.Equal(long.Parse(p[1]), f.NTail);
            Assert.True(Math.Abs(f.Alpha - expected) < 1e-6, $"xmin={xmin}: {f.Alpha:R} vs {expected:R}");
        }
    }

    [Fact]
    public void XminSearchFindsTheTailOfAMixture()
    {
        // below 30 the counts are geometric-ish, above it a power law with α = 2.3
        var rng = new Xoshiro(11);
        var buf = new SpectrumBuffer();
        var head = new long[29];
        for (int i = 0; i < 20000; i++) head[Math.Min(28, (int)Math.Floor(Math.Log(rng.NextOpen()) / Math.Log(0.8)))]++;
        for (int x = 1; x <= 29; x++) buf.Add(x, head[x - 1]);
        Synthetic.PowerLawTail(rng, 2.3, 30, 5000, buf);
        var f = new TailSearch(buf.Values, buf.Mult, buf.Count).Search(50);
        Assert.InRange(f.Xmin, 25, 45);
        Assert.InRange(f.Alpha, 2.15, 2.45);
    }

    [Fact]
    public void FailuresAreStatusesNotNaNs()
    {
        var allEqual = TailFitter.Fit(new FrequencySpectrum([7], [500]), new FitOptions(Reps: 0, CiReps: 0));
        Assert.Equal(FitStatus.AllEqual, allEqual.PowerLaw.Status);
        var fixedEqual = TailFitter.Fit(new FrequencySpectrum([3, 7], [10, 500]), new FitOptions(Xmin: 7, Reps: 0, CiReps: 0));
        Assert.Equal(FitStatus.AllEqual, fixedEqual.PowerLaw.Status);
        Assert.Contains("no finite maximum", fixedEqual.PowerLaw.Message);
        var few = TailFitter.Fit(FrequencySpectrum.FromCounts([1, 2, 3, 5, 8]), new FitOptions(Reps: 0, CiReps: 0));
        Assert.Equal(FitStatus.TooFewPoints, few.PowerLaw.Status);
        Assert.Contains("--min-tail", few.PowerLaw.Message);
    }

    [Fact]
    public void ResultsDoNotDependOnThreadCount()
    {
        var s = Sample(2.2, 3, 5000, 77);
        var a = TailFitter.Fit(s, new FitOptions(Reps: 60, CiReps: 40, Seed: 5, Threads: 1));
        var b = TailFitter.Fit(s, new FitOptions(Reps: 60, CiReps: 40, Seed: 5, Threads: 2));
        Assert.Equal(a.GofP, b.GofP);
        Assert.Equal(a.AlphaLo, b.AlphaLo);
        Assert.Equal(a.AlphaHi, b.AlphaHi);
        var c = TailFitter.Fit(s, new FitOptions(Reps: 60, CiReps: 40, Seed: 6, Threads: 2));
        Assert.NotEqual(a.AlphaLo, c.AlphaLo); // the seed matters
    }
}
