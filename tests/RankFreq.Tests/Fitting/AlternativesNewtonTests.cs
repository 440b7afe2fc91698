using System.Globalization;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;
using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

/// <summary>
/// The Newton fits of the two-parameter alternatives: analytic derivatives against central differences of the value,
/// and maxima against a Nelder–Mead simplex (MathNet.Numerics, from NuGet) run on the family's log-pmf.
/// </summary>
public class AlternativesNewtonTests
{
    private static (long Xmin, long[] V, long[] M) Tail(string file)
    {
        var lines = File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Data", file));
        long xmin = long.Parse(lines[0].Split("xmin=")[1].Split(' ')[0], CultureInfo.InvariantCulture);
        var rows = lines.Skip(1).Where(l => l.Length > 0).Select(l => l.Split(',')).ToArray();
        return (xmin, rows.Select(r => long.Parse(r[0])).ToArray(), rows.Select(r => long.Parse(r[1])).ToArray());
    }

    /// <summary>Central differences of f's value (common practice); the tolerance is a relative 1e-4 (truncation) plus
    /// the value's rounding noise (taken as 1e-11·|f|, sums of thousands of logarithms) divided by h or h².</summary>
    private static void CheckDerivatives(Func<double, double, Quadratic2> f, double x0, double x1, string what)
    {
        var q = f(x0, x1);
        double F(double a, double b) => f(a, b).F;
        const double hg = 1e-3, hh = 1e-2;
        double g0 = (F(x0 + hg, x1) - F(x0 - hg, x1)) / (2 * hg), g1 = (F(x0, x1 + hg) - F(x0, x1 - hg)) / (2 * hg);
        // second differences with Richardson's extrapolation (4·D(h/2) − D(h))/3, which removes the h² error term
        double D00(double h) => (F(x0 + h, x1) - 2 * q.F + F(x0 - h, x1)) / (h * h);
        double D11(double h) => (F(x0, x1 + h) - 2 * q.F + F(x0, x1 - h)) / (h * h);
        double D01(double h) => (F(x0 + h, x1 + h) - F(x0 + h, x1 - h) - F(x0 - h, x1 + h) + F(x0 - h, x1 - h)) / (4 * h * h);
        double h00 = (4 * D00(hh / 2) - D00(hh)) / 3, h11 = (4 * D11(hh / 2) - D11(hh)) / 3, h01 = (4 * D01(hh / 2) - D01(hh)) / 3;
        double noise = 1e-11 * (Math.Abs(q.F) + 1);
        void Near(double analytic, double numeric, double scale, double slack, string name) =>
            Assert.True(Math.Abs(analytic - numeric) <= 1e-4 * scale + slack,
                $"{what} {name}: analytic {analytic:R} vs numeric {numeric:R}");
        Near(q.G0, g0, Math.Abs(g0), noise / hg, "∂0");
        Near(q.G1, g1, Math.Abs(g1), noise / hg, "∂1");
        Near(q.H00, h00, Math.Abs(h00), 32 * noise / (hh * hh), "∂00");
        Near(q.H11, h11, Math.Abs(h11), 32 * noise / (hh * hh), "∂11");
        Near(q.H01, h01, Math.Sqrt(Math.Abs(h00 * h11)), 32 * noise / (hh * hh), "∂01");
        // the checks have teeth: the gradient is far from zero at these points
        Assert.True(Math.Abs(q.G0) + Math.Abs(q.G1) > 100 * noise / hg, $"{what}: gradient too small to test");
    }

    [Theory]
    [InlineData("tail-kjv-words.csv", -9.0, 1.4)]    // near the interior optimum (μ ≈ −10.1, σ ≈ 4.5)
    [InlineData("tail-kjv-words.csv", 2.0, 0.2)]     // wide cells
    [InlineData("tail-sotu-words.csv", -1300, 3.5)]  // near the power-law limit: narrow cells, z ≈ 40
    public void LognormalDerivativesMatchDifferences(string file, double mu, double s)
    {
        var (xmin, v, m) = Tail(file);
        var t = new Alternatives.LognormalTail(v, m, xmin);
        CheckDerivatives((a, b) => Alternatives.LognormalNll(t, a, b), mu, s, $"{file} lognormal");
    }

    [Theory]
    [InlineData("tail-kjv-words.csv", 2.0, -2.7)]   // near the KJV optimum (λ ≈ 10.9, β ≈ 0.056)
    [InlineData("tail-sotu-words.csv", -3.0, -1.0)]
    [InlineData("tail-sotu-words.csv", 9.0, -8.5)]  // near the β floor
    public void WeibullDerivativesMatchDifferences(string file, double u, double v)
    {
        var (xmin, x, m) = Tail(file);
        CheckDerivatives((a, b) => Alternatives.WeibullNll(x, m, xmin, a, b), u, v, $"{file} Weibull");
    }

    /// <summary>The best log-likelihood a tight simplex finds from two starts (the Newton optimum and a default one).</summary>
    private static double SimplexBest(string family, long[] x, long[] m, long xmin, double[] start1, double[] start2,
        Func<double[], Dictionary<string, double>> pars)
    {
        double best = double.NegativeInfinity;
        foreach (var st in new[] { start1, start2 })
        {
            double Nll(Vector<double> p)
            {
                var lp = Alternatives.LogPmf(family, pars(p.ToArray()), xmin);
                double ll = 0;
                for (int i = 0; i < x.Length; i++) ll += m[i] * lp(x[i]);
                return double.IsFinite(ll) ? -ll : 1e300;
            }
            try
            {
                var r = new NelderMeadSimplex(1e-12, 20000).FindMinimum(ObjectiveFunction.Value(Nll),
                    Vector<double>.Build.DenseOfArray(st), Vector<double>.Build.DenseOfArray([0.3, 0.3]));
                best = Math.Max(best, -r.FunctionInfoAtMinimum.Value);
            }
            catch (MaximumIterationsException) { }
        }
        return best;
    }

    private static FrequencySpectrum Lognormal(ulong seed, int n, double mu, double sigma)
    {
        var rng = new Xoshiro(seed);
        return FrequencySpectrum.FromCounts(Enumerable.Range(0, n).Select(_ => 1 + (long)Math.Floor(Math.Exp(mu + sigma * rng.NextNormal()))));
    }

    public static TheoryData<string> Cases => ["kjv", "sotu", "lognormal-data", "power-law-data"];

    [Theory]
    [MemberData(nameof(Cases))]
    public void NewtonReachesTheSimplexMaximum(string which)
    {
        long xmin;
        long[] v, m;
        if (which is "kjv" or "sotu") (xmin, v, m) = Tail(which == "kjv" ? "tail-kjv-words.csv" : "tail-sotu-words.csv");
        else
        {
            FrequencySpectrum s;
            if (which == "lognormal-data") s = Lognormal(5, 20_000, 2.5, 1.1);
            else
            {
                var buf = new SpectrumBuffer();
                Synthetic.PowerLawTail(new Xoshiro(6), 2.1, 3, 20_000, buf);
                s = new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
            }
            (xmin, v, m) = (s.Values[0], s.Values, s.Types);
        }
        var pl = new TailSearch(v, m, v.Length).Search(2, xmin);
        foreach (var alt in Alternatives.Compare(v, m, 0, v.Length, pl, ["discrete_lognormal", "discrete_weibull"]))
        {
            Assert.True(alt.Status is FitStatus.Ok or FitStatus.AtBound, $"{which} {alt.Name}: {alt.Status} {alt.Message}");
            double ll = alt.LogLikelihood;
            double simplex = alt.Name == "discrete_lognormal"
                ? SimplexBest(alt.Name, v, m, xmin, [alt.Parameters["mu"], Math.Log(alt.Parameters["sigma"])], [0, 0],
                    p => new() { ["mu"] = p[0], ["sigma"] = Math.Exp(p[1]) })
                : SimplexBest(alt.Name, v, m, xmin, [Math.Log(alt.Parameters["lambda"]), Math.Log(alt.Parameters["beta"])], [-1, Math.Log(0.5)],
                    p => new() { ["lambda"] = Math.Exp(p[0]), ["beta"] = Math.Clamp(Math.Exp(p[1]), 1e-4, 20) });
            // the task's criterion: equal maxima within 1e-6 relative log-likelihood (the simplex may not do better)
            Assert.True(ll >= simplex - 1e-6 * Math.Abs(simplex), $"{which} {alt.Name}: Newton {ll:R} vs simplex {simplex:R}");
        }
    }

    [Fact]
    public void WeibullFloorShortcutMatchesTheWalkDownTheRidge()
    {
        // power-law data: the Weibull optimum is the β → 0 floor (Alternatives.cs). The fit tries the floor first; its
        // maximum must equal the one the projected Newton reaches walking down the ridge from the interior start
        // (β = ½, λ from the mean; the earlier procedure), within the fits' 1e-9 relative tolerance
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(12), 1.95, 40, 300_000, buf);
        var (v, m) = (buf.Values[..buf.Count], buf.Mult[..buf.Count]);
        var pl = new TailSearch(v, m, v.Length).Search(2, 40);
        var wb = Alternatives.Compare(v, m, 0, v.Length, pl, ["discrete_weibull"]).Single();
        Assert.Equal(FitStatus.AtBound, wb.Status);
        double mean = 0;
        for (int i = 0; i < v.Length; i++) mean += m[i] * (double)v[i];
        mean /= m.Sum();
        var walk = Newton2.Minimize((w, b) => Alternatives.WeibullNllSlope(v, m, 40, w, b), -0.5 * Math.Log(mean) + Math.Log(0.5),
            Math.Log(0.5), Math.Log(1e-4), 1e-12);
        Assert.NotNull(walk);
        double walkLl = -walk.Value.At.F;
        Assert.True(Math.Abs(wb.LogLikelihood - walkLl) <= 1e-9 * Math.Abs(walkLl), $"floor {wb.LogLikelihood:R} vs walk {walkLl:R}");
        Assert.Equal(1e-4, wb.Parameters["beta"], 1e-12);
    }

    [Fact]
    public void LognormalAtItsPowerLawLimitIsAtBound()
    {
        // power-law data: the lognormal's best fit runs to the κ = 1/(2σ²) → 0 edge (Alternatives.Newton.cs remarks)
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(11), 2.0, 5, 100_000, buf);
        var (v, m) = (buf.Values[..buf.Count], buf.Mult[..buf.Count]);
        var pl = new TailSearch(v, m, v.Length).Search(2, 5);
        var ln = Alternatives.Compare(v, m, 0, v.Length, pl, ["discrete_lognormal"]).Single();
        Assert.Equal(FitStatus.AtBound, ln.Status);
        Assert.Equal("inconclusive", ln.Favours);
        // and clearly lognormal data keep an interior fit with status ok
        var s = Lognormal(5, 20_000, 2.5, 1.1);
        var pl2 = new TailSearch(s.Values, s.Types, s.Values.Length).Search(2, 1);
        var ln2 = Alternatives.Compare(s.Values, s.Types, 0, s.Values.Length, pl2, ["discrete_lognormal"]).Single();
        Assert.Equal(FitStatus.Ok, ln2.Status);
        Assert.Equal(2.5, ln2.Parameters["mu"], 0.15);
    }
}
