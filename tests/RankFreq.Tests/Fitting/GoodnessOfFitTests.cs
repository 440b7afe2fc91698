using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;
using RankFreq.Jobs;

namespace RankFreq.Tests.Fitting;

public class GoodnessOfFitTests
{
    private static FrequencySpectrum Geometric(ulong seed, int n, double q)
    {
        var rng = new Xoshiro(seed);
        return FrequencySpectrum.FromCounts(Enumerable.Range(0, n).Select(_ => 1 + (long)Math.Floor(Math.Log(rng.NextOpen()) / Math.Log(q))));
    }

    private static FrequencySpectrum Lognormal(ulong seed, int n, double mu, double sigma)
    {
        var rng = new Xoshiro(seed);
        return FrequencySpectrum.FromCounts(Enumerable.Range(0, n).Select(_ => 1 + (long)Math.Floor(Math.Exp(mu + sigma * rng.NextNormal()))));
    }

    private static FrequencySpectrum PowerLaw(ulong seed, int n, double alpha, long xmin)
    {
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(seed), alpha, xmin, n, buf);
        return new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
    }

    [Fact]
    public void RejectsGeometricData()
    {
        var f = TailFitter.Fit(Geometric(1, 5000, 0.9), new FitOptions(Reps: 200, CiReps: 0, Seed: 2));
        Assert.True(f.GofP < 0.1, $"p = {f.GofP}");
    }

    [Fact]
    public void RejectsLognormalDataWithEnoughPoints()
    {
        // the KS-chosen xmin can retreat into the sparse far tail, where a lognormal looks locally straight; asking for a tail of
        // at least 5,000 points keeps the curved part in the test
        var f = TailFitter.Fit(Lognormal(3, 50_000, 3, 1), new FitOptions(MinTail: 5000, Reps: 200, CiReps: 0, Seed: 2));
        Assert.True(f.GofP < 0.1, $"p = {f.GofP}");
    }

    [Fact]
    public void RarelyRejectsTruePowerLaws()
    {
        int rejected = 0;
        const int repeats = 40;
        for (int r = 0; r < repeats; r++)
        {
            var f = TailFitter.Fit(PowerLaw((ulong)(500 + r), 2000, 2.5, 1), new FitOptions(Reps: 100, CiReps: 0, Seed: (ulong)r, Alternatives: []));
            if (f.GofP < 0.1) rejected++;
        }
        Assert.True(rejected <= 0.15 * repeats, $"{rejected} of {repeats} rejected at p < 0.1");
    }

    [Fact]
    public void LikelihoodRatiosFavourTheGeneratingFamily()
    {
        var ln = TailFitter.Fit(Lognormal(8, 50_000, 2, 1.2), new FitOptions(Xmin: 1, Reps: 0, CiReps: 0));
        Assert.Equal("discrete_lognormal", ln.Alternatives.Single(a => a.Name == "discrete_lognormal").Favours);

        var pl = TailFitter.Fit(PowerLaw(9, 20_000, 2.0, 1), new FitOptions(Xmin: 1, Reps: 0, CiReps: 0));
        Assert.Equal("power_law", pl.Alternatives.Single(a => a.Name == "geometric").Favours);
        Assert.NotEqual("discrete_weibull", pl.Alternatives.Single(a => a.Name == "discrete_weibull").Favours);

        var ex = TailFitter.Fit(Geometric(10, 20_000, 0.7), new FitOptions(Xmin: 1, Reps: 0, CiReps: 0));
        Assert.Equal("geometric", ex.Alternatives.Single(a => a.Name == "geometric").Favours);
        Assert.True(ex.Alternatives.Single(a => a.Name == "geometric").Llr < 0);

        // power law with an exponential cut-off: the nested test prefers the cut-off
        var rng = new Xoshiro(12);
        var counts = new List<long>();
        while (counts.Count < 20_000) { long x = Samplers.PowerLaw(rng, 1.7, 1); if (rng.NextDouble() < Math.Exp(-0.01 * x)) counts.Add(x); }
        var co = TailFitter.Fit(FrequencySpectrum.FromCounts(counts), new FitOptions(Xmin: 1, Reps: 0, CiReps: 0));
        Assert.Equal("power_law_cutoff", co.Alternatives.Single(a => a.Name == "power_law_cutoff").Favours);
    }

    [CorpusTheory]
    [InlineData("kjv-bible.txt")]
    [InlineData("reina-valera-1909.txt")]
    public void BibleWordTailsHaveZipfLikeExponents(string file)
    {
        // Zipf's rank exponent near 1 for word frequencies (α near 2) is common practice, no single source.
        using var r = CountJob.Count([Corpora.File(file)], new CountSettings());
        var f = TailFitter.Fit(r.Spectrum, new FitOptions(Reps: 0, CiReps: 0));
        Assert.Equal(FitStatus.Ok, f.PowerLaw.Status);
        Assert.InRange(f.PowerLaw.Alpha, 1.7, 2.1);
        Assert.True(f.LsqSlope < 0);
    }

    [Fact]
    public void RankLogSumsMatchTheSumsTermByTerm()
    {
        // the closed forms of TailFitter.RankLogSums (lnΓ differences, Euler–Maclaurin for ln² r) against the plain sums
        // (compensated) for blocks of 1 to 5,000 ranks starting from 1 to 10^10
        foreach (long a in new long[] { 1, 2, 65, 1000, 12_345, 1_000_000, 100_000_000, 10_000_000_000 })
            foreach (long len in new long[] { 1, 64, 65, 200, 2000, 5000 })
            {
                long b = a + len - 1;
                double s1 = 0, c1 = 0, s2 = 0, c2 = 0;
                for (long r = a; r <= b; r++)
                {
                    double l = Math.Log(r);
                    (s1, c1) = Add(s1, c1, l);
                    (s2, c2) = Add(s2, c2, l * l);
                }
                var (sumL, sumL2) = TailFitter.RankLogSums(a, b);
                Assert.True(Math.Abs(sumL - s1) <= 1e-10 * Math.Max(1, s1), $"a {a}, {len} ranks: Σ ln r {sumL:R} vs {s1:R}");
                Assert.True(Math.Abs(sumL2 - s2) <= 1e-10 * Math.Max(1, s2), $"a {a}, {len} ranks: Σ ln² r {sumL2:R} vs {s2:R}");
            }

        static (double, double) Add(double sum, double c, double x)
        {
            double y = x - c, t = sum + y;
            return (t, (t - sum) - y);
        }
    }
}
