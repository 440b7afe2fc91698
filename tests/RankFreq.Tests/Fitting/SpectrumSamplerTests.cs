using MathNet.Numerics.Distributions;
using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

/// <summary>
/// The bootstraps' samplers against exact distributions. Each χ² check is Pearson's goodness-of-fit test (common
/// practice) with cells pooled to expected counts ≥ 5, its p-value from MathNet.Numerics' χ² distribution; a check fails
/// below p = 1e-4, so an exact sampler raises a false alarm with probability 1e-4 per check (the draws are seeded, so a
/// run either always passes or always fails).
/// </summary>
public class SpectrumSamplerTests
{
    private const double FalseAlarm = 1e-4;

    /// <summary>Pearson's χ² p-value of observed counts against expected ones, cells pooled left to right to ≥ 5.</summary>
    private static double PearsonP(IReadOnlyList<double> observed, IReadOnlyList<double> expected)
    {
        var o = new List<double>();
        var e = new List<double>();
        double so = 0, se = 0;
        for (int i = 0; i < expected.Count; i++)
        {
            so += observed[i]; se += expected[i];
            if (se >= 5) { o.Add(so); e.Add(se); so = 0; se = 0; }
        }
        if (se > 0 || so > 0)
        {
            if (e.Count == 0) { o.Add(so); e.Add(se); }
            else { o[^1] += so; e[^1] += se; }
        }
        double stat = 0;
        for (int i = 0; i < e.Count; i++) stat += (o[i] - e[i]) * (o[i] - e[i]) / e[i];
        return 1 - ChiSquared.CDF(e.Count - 1, stat);
    }

    [Theory]
    [InlineData(20L, 0.3)]             // inversion
    [InlineData(1_000L, 0.3)]          // BTRS
    [InlineData(50L, 0.93)]            // reflected
    [InlineData(1_000_000_000L, 2e-8)] // BTRS, mean 20, n huge
    [InlineData(300_000_000L, 0.4)]    // BTRS, sd ≈ 8,500
    [InlineData(3_000_000L, 1e-6)]     // inversion, mean 3
    public void BinomialMatchesExactPmf(long n, double p)
    {
        // exact pmf: MathNet.Numerics.Distributions.Binomial (a reference implementation from NuGet)
        const int draws = 200_000;
        var rng = new Xoshiro(7, 3, (ulong)n);
        var counts = new Dictionary<long, double>();
        for (int i = 0; i < draws; i++)
        {
            long k = BinomialSampler.Draw(rng, n, p);
            Assert.InRange(k, 0, n);
            counts[k] = counts.GetValueOrDefault(k) + 1;
        }
        double mean = n * p, sd = Math.Sqrt(n * p * (1 - p));
        long lo = Math.Max(0, (long)(mean - 8 * sd - 5)), hi = Math.Min(n, (long)(mean + 8 * sd + 5));
        var obs = new List<double>();
        var exp = new List<double>();
        for (long k = lo; k <= hi; k++)
        {
            obs.Add(counts.GetValueOrDefault(k));
            exp.Add(draws * Math.Exp(Binomial.PMFLn(p, (int)n, (int)k)));
        }
        Assert.Equal(draws, obs.Sum()); // nothing drawn beyond 8 sd
        double pv = PearsonP(obs, exp);
        Assert.True(pv > FalseAlarm, $"Binomial({n}, {p}): χ² p = {pv:G3}");
    }

    /// <summary>ζ(α, x) by direct summation to 10^6 plus the Euler–Maclaurin remainder (independent of HurwitzZeta).</summary>
    private static double ZetaDirect(double alpha, long x)
    {
        const long end = 1_000_000;
        double s = 0;
        for (long k = end - 1; k >= x; k--) s += Math.Pow(k, -alpha);
        return s + Math.Pow(end, 1 - alpha) / (alpha - 1) + 0.5 * Math.Pow(end, -alpha) + alpha / 12 * Math.Pow(end, -alpha - 1);
    }

    [Theory]
    [InlineData(2.2, 3L, 200_000L)]
    [InlineData(1.9, 66L, 400_000L)]   // near the 10^9-token spectrum's fit
    [InlineData(3.5, 1L, 100_000L)]
    public void PowerLawTailMatchesExactPmf(double alpha, long xmin, long n)
    {
        // exact pmf x^−α / ζ(α, xmin) with ζ summed directly; cells x = xmin … xmin + 3,000, then the tail mass beyond
        for (ulong seed = 1; seed <= 3; seed++)
        {
            var buf = new SpectrumBuffer();
            Synthetic.PowerLawTail(new Xoshiro(seed, 1, 0), alpha, xmin, n, buf);
            Assert.Equal(n, buf.Mult.Take(buf.Count).Sum());
            Assert.True(buf.Values[0] >= xmin);
            long last = xmin + 3000;
            double z = ZetaDirect(alpha, xmin);
            var obs = new double[last - xmin + 1];
            var exp = new double[obs.Length];
            for (int i = 0; i < buf.Count; i++) obs[Math.Min(buf.Values[i], last) - xmin] += buf.Mult[i];
            for (long x = xmin; x < last; x++) exp[x - xmin] = n * Math.Pow(x, -alpha) / z;
            exp[^1] = n * ZetaDirect(alpha, last) / z;
            double pv = PearsonP(obs, exp);
            Assert.True(pv > FalseAlarm, $"α = {alpha}, xmin = {xmin}, seed {seed}: χ² p = {pv:G3}");
        }
    }

    [Fact]
    public void IndividualsAreAddedInOrderAsByASort()
    {
        // SpectrumBuffer.AddIndividuals (histogram near the smallest value, radix sort of the far ones) must give the
        // buffer that sorting and grouping every value gives: heavy tails of 1 to 50,000 values spanning 1 to 60 bits
        var rng = new Xoshiro(5, 9, 0);
        foreach (int count in new[] { 1, 3, 100, 200, 1000, 7000, 50_000 })
            foreach (double alpha in new[] { 1.05, 1.5, 2.5 })
            {
                var xs = new long[count];
                Samplers.PowerLaw(rng, alpha, 1 + rng.NextLong(10_000), xs);
                if (count > 3) xs[^1] = (1L << 60) + rng.NextLong(1000); // a value far past four radix digits
                var expected = new SpectrumBuffer();
                foreach (var g in xs.Order().GroupBy(x => x)) expected.Add(g.Key, g.Count());
                var buf = new SpectrumBuffer();
                buf.AddIndividuals(xs.ToArray());
                Assert.Equal(expected.Values[..expected.Count], buf.Values[..buf.Count]);
                Assert.Equal(expected.Mult[..expected.Count], buf.Mult[..buf.Count]);
                // without the far value the range fits the radix passes (1 to 4 of them)
                var near = xs.Where(x => x < 1L << 40).ToArray();
                var expectedNear = new SpectrumBuffer();
                foreach (var g in near.Order().GroupBy(x => x)) expectedNear.Add(g.Key, g.Count());
                var bufNear = new SpectrumBuffer();
                bufNear.AddIndividuals(near);
                Assert.Equal(expectedNear.Values[..expectedNear.Count], bufNear.Values[..bufNear.Count]);
                Assert.Equal(expectedNear.Mult[..expectedNear.Count], bufNear.Mult[..bufNear.Count]);
            }
    }

    [Theory]
    [InlineData(1.94, 66L, 400_000L, 400_000L)]
    [InlineData(2.5, 3L, 50_000L, 1_000L)]      // more points than the table was made for: it runs out, then computes
    [InlineData(1.3, 1L, 2_000_000L, 2_100_000L)] // past 256 steps: the running ζ's refreshes come from the table
    public void PowerLawTailWithCellTableDrawsTheSameNumbers(double alpha, long xmin, long n, long tableFor)
    {
        // the table holds the loop's own probabilities, so a seeded draw must be the same spectrum with or without it
        var cells = new PowerLawCells(alpha, xmin, tableFor);
        for (ulong seed = 1; seed <= 3; seed++)
        {
            var a = new SpectrumBuffer();
            var b = new SpectrumBuffer();
            Synthetic.PowerLawTail(new Xoshiro(seed, 1, 0), alpha, xmin, n, a);
            Synthetic.PowerLawTail(new Xoshiro(seed, 1, 0), alpha, xmin, n, b, cells);
            Assert.Equal(a.Values[..a.Count], b.Values[..b.Count]);
            Assert.Equal(a.Mult[..a.Count], b.Mult[..b.Count]);
        }
    }

    [Fact]
    public void MultinomialMatchesItsCellProbabilities()
    {
        // one multinomial draw's Pearson statistic is χ² with cells − 1 degrees of freedom (common practice)
        long[] v = Enumerable.Range(1, 40).Select(i => (long)i * 3).ToArray();
        long[] m = v.Select(x => 1 + 1_000_000_000L / (x * x)).ToArray();
        double total = m.Sum();
        for (ulong seed = 1; seed <= 5; seed++)
        {
            var buf = new SpectrumBuffer();
            const long n = 50_000_000;
            Synthetic.Multinomial(new Xoshiro(seed, 2, 0), v, m, 0, v.Length, n, buf);
            var obs = v.Select(x => { int i = Array.IndexOf(buf.Values, x, 0, buf.Count); return i < 0 ? 0.0 : buf.Mult[i]; }).ToArray();
            Assert.Equal(n, obs.Sum());
            var exp = m.Select(c => n * c / total).ToArray();
            double pv = PearsonP(obs, exp);
            Assert.True(pv > FalseAlarm, $"seed {seed}: χ² p = {pv:G3}");
        }
    }

    [Fact]
    public void PlannedMultinomialMatchesItsCellProbabilities()
    {
        // The interval bootstrap's resample (sparse suffix placed type by type). 300 draws, each of as many points as
        // types (as in the bootstrap); the summed Pearson statistics of independent draws are χ² with the summed
        // degrees of freedom (common practice). The cells are pooled to expectations ≥ 5 as in PearsonP, so pooled
        // runs of the suffix's one-type cells are checked too.
        long[] v = Enumerable.Range(1, 3000).Select(i => (long)i).ToArray();
        long[] m = v.Select(x => 1 + 2_000_000L / (x * x)).ToArray();
        long n = m.Sum();
        var plan = new MultinomialPlan(v, m, 0, v.Length);
        Assert.InRange(plan.Split, 100, 2990); // both parts are exercised
        var exp = m.Select(c => (double)c).ToArray();
        double stat = 0;
        int df = 0;
        var buf = new SpectrumBuffer();
        for (ulong seed = 1; seed <= 300; seed++)
        {
            buf.Clear();
            Synthetic.Multinomial(new Xoshiro(seed, 2, 0), plan, n, buf);
            var obs = new double[v.Length];
            for (int i = 0; i < buf.Count; i++) obs[buf.Values[i] - 1] += buf.Mult[i];
            Assert.Equal(n, obs.Sum());
            var (s, cells) = PearsonStat(obs, exp);
            stat += s; df += cells - 1;
        }
        double pv = 1 - ChiSquared.CDF(df, stat);
        Assert.True(pv > FalseAlarm && pv < 1 - FalseAlarm, $"χ² = {stat:F1} on {df} df: p = {pv:G3}");
    }

    [Fact]
    public void PlannedMultinomialTakesTheSameNumbersAsOnePointAtATime()
    {
        // the suffix's points are drawn in batches (Synthetic.Multinomial with a plan): the same spectrum, and the same
        // numbers left in the generator, as the head's binomials followed by one UniformBelow call per point, for draws
        // of fewer points than a batch and of many batches
        long[] v = Enumerable.Range(1, 3000).Select(i => (long)i).ToArray();
        long[] m = v.Select(x => 1 + 2_000_000L / (x * x)).ToArray();
        var plan = new MultinomialPlan(v, m, 0, v.Length);
        foreach (long n in new[] { m.Sum(), m.Sum() / 3, 7L, 300L })
            for (ulong seed = 1; seed <= 20; seed++)
            {
                var got = new SpectrumBuffer();
                var rng = new Xoshiro(seed, 2, 0);
                Synthetic.Multinomial(rng, plan, n, got);
                var want = new SpectrumBuffer();
                var reference = new Xoshiro(seed, 2, 0);
                double mass = plan.Mass;
                long remaining = n;
                int j = plan.From;
                for (; j < plan.Split && remaining > 0; j++)
                {
                    long k = j == plan.To - 1 ? remaining : BinomialSampler.Draw(reference, remaining, Math.Min(1, m[j] / mass));
                    want.Add(v[j], k);
                    remaining -= k;
                    mass -= m[j];
                }
                if (remaining > 0 && j < plan.To)
                {
                    var counts = new long[plan.To - plan.Split];
                    for (long p = 0; p < remaining; p++)
                        counts[plan.CellOf[Synthetic.UniformBelow(reference, (ulong)plan.CellOf.Length)]]++;
                    for (int c = 0; c < counts.Length; c++)
                        if (counts[c] != 0) want.Add(v[plan.Split + c], counts[c]);
                }
                Assert.Equal(want.Values.AsSpan(0, want.Count).ToArray(), got.Values.AsSpan(0, got.Count).ToArray());
                Assert.Equal(want.Mult.AsSpan(0, want.Count).ToArray(), got.Mult.AsSpan(0, got.Count).ToArray());
                Assert.Equal(reference.NextUInt64(), rng.NextUInt64());
            }
    }

    [Fact]
    public void FillGivesTheNumbersOfNextUInt64InOrder()
    {
        var a = new Xoshiro(9, 3, 4);
        var b = new Xoshiro(9, 3, 4);
        var run = new ulong[1000];
        a.Fill(run.AsSpan(0, 1));
        a.Fill(run.AsSpan(1));
        foreach (ulong x in run) Assert.Equal(b.NextUInt64(), x);
        Assert.Equal(b.NextUInt64(), a.NextUInt64());
    }

    [Fact]
    public void UniformBelowIsUniform()
    {
        // Lemire's bounded integers against the uniform law on 7 cells (an s that does not divide 2^64)
        var rng = new Xoshiro(5);
        var obs = new double[7];
        for (int i = 0; i < 70_000; i++) obs[Synthetic.UniformBelow(rng, 7)]++;
        double pv = PearsonP(obs, Enumerable.Repeat(10_000.0, 7).ToArray());
        Assert.True(pv > FalseAlarm, $"χ² p = {pv:G3}");
    }

    /// <summary>Pearson's statistic and the number of cells after pooling as in <see cref="PearsonP"/>.</summary>
    private static (double Stat, int Cells) PearsonStat(IReadOnlyList<double> observed, IReadOnlyList<double> expected)
    {
        double stat = 0, so = 0, se = 0;
        int cells = 0;
        for (int i = 0; i < expected.Count; i++)
        {
            so += observed[i]; se += expected[i];
            bool last = i == expected.Count - 1;
            if (se >= 5 || last) { stat += (so - se) * (so - se) / se; cells++; so = 0; se = 0; }
        }
        return (stat, cells);
    }

    [Fact]
    public void GoodnessOfFitPIsRoughlyUniformOnModelData()
    {
        // Under the null the semi-parametric bootstrap p (Clauset et al. 2009, §4.1) is close to uniform; with xmin
        // estimated it leans conservative. 30 data sets of 1,000 draws from (α 2.5, xmin 1) plus 100 replicates each:
        // a uniform p has mean 0.5 ± 0.053 and about 3 ± 1.6 values below 0.1; the bounds are about 3.5 sd wide.
        var ps = new List<double>();
        for (ulong r = 0; r < 30; r++)
        {
            var buf = new SpectrumBuffer();
            Synthetic.PowerLawTail(new Xoshiro(900 + r), 2.5, 1, 1000, buf);
            var s = new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
            var f = TailFitter.Fit(s, new FitOptions(Reps: 100, CiReps: 0, Seed: r, Alternatives: []));
            Assert.Equal(FitStatus.Ok, f.PowerLaw.Status);
            ps.Add(f.GofP);
        }
        Assert.InRange(ps.Average(), 0.32, 0.72);
        Assert.True(ps.Count(p => p < 0.1) <= 9, string.Join(", ", ps.Select(p => p.ToString("F2"))));
        Assert.True(ps.Count(p => p > 0.9) <= 9, string.Join(", ", ps.Select(p => p.ToString("F2"))));
    }
}
