using MathNet.Numerics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace RankFreq.Fitting;

/// <summary>
/// Alternatives to the power law, each a proper distribution on the integers x ≥ xmin fitted by maximum likelihood
/// over the tail's spectrum (Clauset et al. 2009, §5 and Table 2 for the continuous forms; discretised here):
/// discrete lognormal p(x) ∝ Φ(z(x+½)) − Φ(z(x−½)); exponential (geometric) p(x) = (1−e^−λ) e^−λ(x−xmin);
/// stretched exponential p(x) ∝ e^−λx^β − e^−λ(x+1)^β; power law with cut-off p(x) ∝ x^−α e^−λx.
/// </summary>
public static class Alternatives
{
    /// <summary>Names accepted by <c>--alternatives</c>.</summary>
    public static readonly string[] Names = ["lognormal", "exponential", "stretched_exponential", "power_law_cutoff"];

    /// <summary>Fits the named alternatives on the tail and compares each with the power law fit.</summary>
    public static IReadOnlyList<AlternativeComparison> Compare(long[] values, long[] mult, int from, int count, PowerLawFit pl, IEnumerable<string> names)
    {
        var tv = values[from..count];
        var tm = mult[from..count];
        long xmin = pl.Xmin;
        double lnZ = Math.Log(HurwitzZeta.Value(pl.Alpha, xmin));
        var plLog = tv.Select(x => -pl.Alpha * Math.Log(x) - lnZ).ToArray();
        var list = new List<AlternativeComparison>();
        foreach (var name in names)
        {
            (Func<long, double>? logPmf, Dictionary<string, double> pars, FitStatus st, string msg) fitted = name switch
            {
                "lognormal" => Lognormal(tv, tm, xmin),
                "exponential" => Exponential(tv, tm, xmin),
                "stretched_exponential" => Stretched(tv, tm, xmin),
                "power_law_cutoff" => Cutoff(tv, tm, xmin, pl.Alpha),
                _ => throw new FitInputException($"unknown alternative '{name}' (choose from {string.Join(", ", Names)})"),
            };
            var (logPmf, pars, st, msg) = fitted;
            if (logPmf is null)
            {
                list.Add(new AlternativeComparison(name, pars, double.NaN, double.NaN, double.NaN, double.NaN, "inconclusive", st, msg));
                continue;
            }
            double n = 0, llr = 0, llAlt = 0;
            var d = new double[tv.Length];
            for (int i = 0; i < tv.Length; i++)
            {
                double la = logPmf(tv[i]);
                d[i] = plLog[i] - la;
                llAlt += tm[i] * la;
                llr += tm[i] * d[i];
                n += tm[i];
            }
            double mean = llr / n, var = 0;
            for (int i = 0; i < tv.Length; i++) var += tm[i] * (d[i] - mean) * (d[i] - mean);
            var /= n;
            double sigma = Math.Sqrt(var);
            double norm = sigma > 0 ? llr / (sigma * Math.Sqrt(n)) : 0;
            double p;
            if (name == "power_law_cutoff")
            {
                // nested: the power law is the cut-off family at λ = 0, on the boundary of its range
                double stat = Math.Max(0, -2 * llr);
                p = 0.5 * SpecialFunctions.Erfc(Math.Sqrt(stat / 2));
                if (stat == 0) p = 1;
            }
            else p = sigma > 0 ? SpecialFunctions.Erfc(Math.Abs(norm) / Math.Sqrt(2)) : 1;
            string favours = Verdicts.Favours(name, llr, p, nested: name == "power_law_cutoff");
            list.Add(new AlternativeComparison(name, pars, llAlt, llr, norm, p, favours, st, msg));
        }
        return list;
    }

    private static (Func<long, double>?, Dictionary<string, double>, FitStatus, string) Exponential(long[] x, long[] m, long xmin)
    {
        double n = m.Sum(), mean = 0;
        for (int i = 0; i < x.Length; i++) mean += m[i] * (x[i] - xmin);
        mean /= n;
        if (mean <= 0) return (null, new(), FitStatus.AllEqual, "all tail values equal xmin");
        double lambda = Math.Log(1 + 1 / mean);                 // closed-form MLE of the geometric law
        double c = Math.Log(-double.ExpM1(-lambda));
        return (v => c - lambda * (v - xmin), new() { ["lambda"] = lambda }, FitStatus.Ok, "");
    }

    private static double LogPhiDiff(double z1, double z2)
    {
        // ln(Φ(z2) − Φ(z1)) for z1 < z2, using upper tails where they are more accurate
        double d = z1 > 0
            ? 0.5 * (SpecialFunctions.Erfc(z1 / Math.Sqrt(2)) - SpecialFunctions.Erfc(z2 / Math.Sqrt(2)))
            : 0.5 * (SpecialFunctions.Erfc(-z2 / Math.Sqrt(2)) - SpecialFunctions.Erfc(-z1 / Math.Sqrt(2)));
        return d > 0 ? Math.Log(d) : double.NegativeInfinity;
    }

    private static double LogUpper(double z) => Math.Log(0.5 * SpecialFunctions.Erfc(z / Math.Sqrt(2)));

    private static (Func<long, double>?, Dictionary<string, double>, FitStatus, string) Lognormal(long[] x, long[] m, long xmin)
    {
        double n = m.Sum(), mu0 = 0, s0 = 0;
        for (int i = 0; i < x.Length; i++) mu0 += m[i] * Math.Log(x[i]);
        mu0 /= n;
        for (int i = 0; i < x.Length; i++) s0 += m[i] * Math.Pow(Math.Log(x[i]) - mu0, 2);
        s0 = Math.Sqrt(Math.Max(s0 / n, 1e-4));
        double lo = Math.Log(xmin - 0.5);
        double LogPmf(long v, double mu, double sigma) =>
            LogPhiDiff((Math.Log(v - 0.5) - mu) / sigma, (Math.Log(v + 0.5) - mu) / sigma) - LogUpper((lo - mu) / sigma);
        double Nll(Vector<double> p)
        {
            double mu = p[0], sigma = Math.Exp(p[1]);
            if (!(sigma > 1e-6 && sigma < 1e3) || Math.Abs(mu) > 1e4) return 1e300;
            double ll = 0;
            for (int i = 0; i < x.Length; i++) ll += m[i] * LogPmf(x[i], mu, sigma);
            return double.IsFinite(ll) ? -ll : 1e300;
        }
        var (best, st, msg) = Minimize(Nll, [mu0, Math.Log(s0)], [1, 0.5]);
        double bm = best[0], bs = Math.Exp(best[1]);
        return (v => LogPmf(v, bm, bs), new() { ["mu"] = bm, ["sigma"] = bs }, st, msg);
    }

    private static (Func<long, double>?, Dictionary<string, double>, FitStatus, string) Stretched(long[] x, long[] m, long xmin)
    {
        double n = m.Sum(), mean = 0;
        for (int i = 0; i < x.Length; i++) mean += m[i] * x[i];
        mean /= n;
        double LogPmf(long v, double lambda, double beta)
        {
            double a = Math.Pow(v, beta), b = Math.Pow(v + 1, beta), c = Math.Pow(xmin, beta);
            double step = -double.ExpM1(-lambda * (b - a));
            return -lambda * (a - c) + Math.Log(step);
        }
        double Nll(Vector<double> p)
        {
            double lambda = Math.Exp(p[0]), beta = Math.Exp(p[1]);
            if (!(beta > 1e-4 && beta < 20)) return 1e300;
            double ll = 0;
            for (int i = 0; i < x.Length; i++) ll += m[i] * LogPmf(x[i], lambda, beta);
            return double.IsFinite(ll) ? -ll : 1e300;
        }
        var (best, st, msg) = Minimize(Nll, [-0.5 * Math.Log(mean), Math.Log(0.5)], [1, 0.5]);
        double bl = Math.Exp(best[0]), bb = Math.Exp(best[1]);
        return (v => LogPmf(v, bl, bb), new() { ["lambda"] = bl, ["beta"] = bb }, st, msg);
    }

    /// <summary>C(α, λ) = Σ_{k≥xmin} k^−α e^−λk: direct terms, then midpoint-rule integrals over doubling blocks.</summary>
    internal static double CutoffNormalizer(double alpha, double lambda, long xmin)
    {
        double f(double t) => Math.Exp(-alpha * Math.Log(t) - lambda * t);
        double sum = 0;
        long k = xmin, end = xmin + 4000;
        for (; k < end; k++)
        {
            double t = f(k);
            sum += t;
            if (lambda * k > 40 && t < 1e-17 * sum) return sum;
        }
        if (lambda == 0 && alpha > 1) return sum + HurwitzZeta.Value(alpha, k);
        double a = k - 0.5;
        for (int blk = 0; blk < 80; blk++)
        {
            double b = 2 * a, h = (b - a) / 64, s = f(a) + f(b);
            for (int i = 1; i < 64; i++) s += (i % 2 == 1 ? 4 : 2) * f(a + i * h);
            double part = s * h / 3;
            sum += part;
            if (part < 1e-16 * sum) break;
            a = b;
        }
        return sum;
    }

    private static (Func<long, double>?, Dictionary<string, double>, FitStatus, string) Cutoff(long[] x, long[] m, long xmin, double alpha0)
    {
        double sumLn = 0, sumX = 0, n = m.Sum();
        for (int i = 0; i < x.Length; i++) { sumLn += m[i] * Math.Log(x[i]); sumX += m[i] * x[i]; }
        double Nll(Vector<double> p)
        {
            double alpha = p[0], lambda = Math.Exp(p[1]);
            if (Math.Abs(alpha) > 50) return 1e300;
            double c = CutoffNormalizer(alpha, lambda, xmin);
            double ll = -alpha * sumLn - lambda * sumX - n * Math.Log(c);
            return double.IsFinite(ll) ? -ll : 1e300;
        }
        double startLambda = Math.Log(1 / (100 * sumX / n));
        var (best, st, msg) = Minimize(Nll, [alpha0, startLambda], [0.2, 2]);
        // compare with λ → 0, where the family meets the plain power law
        double ba = best[0], bl = Math.Exp(best[1]);
        double lnC = Math.Log(CutoffNormalizer(ba, bl, xmin));
        return (v => -ba * Math.Log(v) - bl * v - lnC, new() { ["alpha"] = ba, ["lambda"] = bl }, st, msg);
    }

    private static (double[] Best, FitStatus Status, string Message) Minimize(Func<Vector<double>, double> f, double[] start, double[] step)
    {
        var obj = ObjectiveFunction.Value(f);
        try
        {
            var r = new NelderMeadSimplex(1e-10, 4000).FindMinimum(obj, Vector<double>.Build.DenseOfArray(start), Vector<double>.Build.DenseOfArray(step));
            return (r.MinimizingPoint.ToArray(), FitStatus.Ok, "");
        }
        catch (MaximumIterationsException)
        {
            return (start, FitStatus.NotConverged, "maximum-likelihood search did not converge in 4000 iterations");
        }
    }
}
