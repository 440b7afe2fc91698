using MathNet.Numerics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace RankFreq.Fitting;

/// <summary>
/// Alternatives to the power law, each a proper distribution on the integers x ≥ xmin fitted by maximum likelihood
/// over the tail's spectrum (Clauset et al. 2009, §5 and Table 2 for the continuous forms; discretised here), named
/// after the discrete form actually fitted:
/// <c>discrete_lognormal</c> (the lognormal) p(x) ∝ Φ(z(x+½)) − Φ(z(x−½)), z(t) = (ln t − μ)/σ;
/// <c>geometric</c> (the exponential) p(x) = (1−e^−λ) e^−λ(x−xmin);
/// <c>discrete_weibull</c> (the stretched exponential) p(x) ∝ e^−λx^β − e^−λ(x+1)^β;
/// <c>power_law_cutoff</c> (power law with exponential cut-off) p(x) ∝ x^−α e^−λx.
/// </summary>
/// <remarks>
/// Every log-probability is computed in log space: normal cell probabilities through <see cref="GaussLog.LogDiff"/>
/// (no erfc difference is formed in the far tail, where erfc is subnormal or zero), Weibull steps through
/// x^β·expm1(β·log1p(1/x)), the cut-off normaliser relative to its first term. Tested against a 25-digit mpmath
/// evaluation on the KJV and addresses tails (tests/RankFreq.Tests/Data/alternatives_reference.py): log-likelihood
/// ratio within 1e-4 at the reference parameters. A parameter on a bound of its range gives status
/// <see cref="FitStatus.AtBound"/>: the family then tends to a limit (for the lognormal and the Weibull, the power law
/// itself) and its comparison carries no evidence either way.
/// </remarks>
public static partial class Alternatives
{
    /// <summary>Names accepted by <c>--alternatives</c> and written in results.</summary>
    public static readonly string[] Names = ["discrete_lognormal", "geometric", "discrete_weibull", "power_law_cutoff"];

    /// <summary>Older names still accepted as input: lognormal, exponential, stretched_exponential.</summary>
    public static readonly IReadOnlyDictionary<string, string> Aliases = new Dictionary<string, string>
    {
        ["lognormal"] = "discrete_lognormal",
        ["exponential"] = "geometric",
        ["stretched_exponential"] = "discrete_weibull",
    };

    /// <summary>The name written in results for an accepted name or alias; null if unknown.</summary>
    public static string? Canonical(string name) =>
        Names.Contains(name) ? name : Aliases.TryGetValue(name, out var c) ? c : null;

    private const double MinBeta = 1e-4, MaxBeta = 20, MinSigma = 1e-6, MaxSigma = 1e3, MaxAbsMu = 1e4;

    /// <summary>Fits the named alternatives on the tail and compares each with the power law fit.</summary>
    public static IReadOnlyList<AlternativeComparison> Compare(long[] values, long[] mult, int from, int count, PowerLawFit pl, IEnumerable<string> names)
    {
        var tv = values[from..count];
        var tm = mult[from..count];
        long xmin = pl.Xmin;
        double lnZ = HurwitzZeta.LogValue(pl.Alpha, xmin);
        var plLog = tv.Select(x => -pl.Alpha * Math.Log(x) - lnZ).ToArray();
        var list = new List<AlternativeComparison>();
        foreach (var given in names)
        {
            string name = Canonical(given) ?? throw new FitInputException($"unknown alternative '{given}' (choose from {string.Join(", ", Names)})");
            var (pars, st, msg) = Fit(name, tv, tm, xmin, pl.Alpha);
            if (pars is null)
            {
                list.Add(new AlternativeComparison(name, new Dictionary<string, double>(),
                    double.NaN, double.NaN, double.NaN, double.NaN, "inconclusive", st, msg));
                continue;
            }
            var logPmf = LogPmf(name, pars, xmin);
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
            // a fit on a bound is a limit of the family, not a member: no verdict from it
            string favours = st == FitStatus.Ok ? Verdicts.Favours(name, llr, p, nested: name == "power_law_cutoff") : "inconclusive";
            list.Add(new AlternativeComparison(name, pars, llAlt, llr, norm, p, favours, st, msg));
        }
        return list;
    }

    /// <summary>ln p(x) of a family (canonical name) at the given parameters, normalised over x ≥ xmin.</summary>
    internal static Func<long, double> LogPmf(string name, IReadOnlyDictionary<string, double> p, long xmin) => name switch
    {
        "geometric" => GeometricLogPmf(p["lambda"], xmin),
        "discrete_lognormal" => LognormalLogPmf(p["mu"], p["sigma"], xmin),
        "discrete_weibull" => WeibullLogPmf(p["lambda"], p["beta"], xmin),
        "power_law_cutoff" => CutoffLogPmf(p["alpha"], p["lambda"], xmin),
        _ => throw new ArgumentException($"unknown family {name}", nameof(name)),
    };

    private static (Dictionary<string, double>? Pars, FitStatus Status, string Message) Fit(
        string name, long[] x, long[] m, long xmin, double alpha) => name switch
        {
            "geometric" => Geometric(x, m, xmin),
            "discrete_lognormal" => Lognormal(x, m, xmin),
            "discrete_weibull" => Weibull(x, m, xmin, alpha),
            _ => Cutoff(x, m, xmin, alpha),
        };

    private static double LogLik(Func<long, double> logPmf, long[] x, long[] m)
    {
        double ll = 0;
        for (int i = 0; i < x.Length; i++) ll += m[i] * logPmf(x[i]);
        return ll;
    }

    private static Func<long, double> GeometricLogPmf(double lambda, long xmin)
    {
        double c = Math.Log(-LogMath.Expm1(-lambda));
        return v => c - lambda * (v - xmin);
    }

    private static (Dictionary<string, double>?, FitStatus, string) Geometric(long[] x, long[] m, long xmin)
    {
        double n = m.Sum(), mean = 0;
        for (int i = 0; i < x.Length; i++) mean += m[i] * (x[i] - xmin);
        mean /= n;
        if (mean <= 0) return (null, FitStatus.AllEqual, $"all tail counts equal xmin = {xmin:N0}: the geometric law has no finite maximum");
        double lambda = LogMath.Log1p(1 / mean);                 // closed-form MLE of the geometric law
        return (new() { ["lambda"] = lambda }, FitStatus.Ok, "");
    }

    private static Func<long, double> LognormalLogPmf(double mu, double sigma, long xmin)
    {
        double norm = GaussLog.LogQ((Math.Log(xmin - 0.5) - mu) / sigma);
        return v => GaussLog.LogDiff((Math.Log(v - 0.5) - mu) / sigma, (Math.Log(v + 0.5) - mu) / sigma) - norm;
    }

    private static (Dictionary<string, double>?, FitStatus, string) Lognormal(long[] x, long[] m, long xmin)
    {
        double n = m.Sum(), mu0 = 0, s0 = 0;
        for (int i = 0; i < x.Length; i++) mu0 += m[i] * Math.Log(x[i]);
        mu0 /= n;
        for (int i = 0; i < x.Length; i++) s0 += m[i] * Math.Pow(Math.Log(x[i]) - mu0, 2);
        s0 = Math.Sqrt(Math.Max(s0 / n, 1e-4));
        // ln(x ± ½) once, not at every step of the search
        var lo = x.Select(v => Math.Log(v - 0.5)).ToArray();
        var hi = x.Select(v => Math.Log(v + 0.5)).ToArray();
        double lnX0 = Math.Log(xmin - 0.5);
        double Nll(Vector<double> p)
        {
            double mu = p[0], sigma = Math.Exp(p[1]);
            if (!(sigma > MinSigma && sigma < MaxSigma) || Math.Abs(mu) > MaxAbsMu) return 1e300;
            double inv = 1 / sigma, ll = 0;
            for (int i = 0; i < x.Length; i++) ll += m[i] * GaussLog.LogDiff((lo[i] - mu) * inv, (hi[i] - mu) * inv);
            ll -= n * GaussLog.LogQ((lnX0 - mu) * inv);
            return double.IsFinite(ll) ? -ll : 1e300;
        }
        // Newton with analytic derivatives (Alternatives.Newton.cs); the simplex only if that fails
        var tail = new LognormalTail(x, m, xmin);
        double k0 = 0.5 / (s0 * s0), kMin = 0.5 / (MaxSigma * MaxSigma);
        var nt = Newton2.Minimize((e, k) => LognormalNllNatural(tail, e, k), mu0 * 2 * k0, k0, kMin);
        var (best, st, msg) = nt is { } r
            ? ([r.X0 / (2 * r.X1), -0.5 * Math.Log(2 * r.X1)], FitStatus.Ok, "")
            : Minimize(Nll, [mu0, Math.Log(s0)], [1, 0.5]);
        double bm = best[0], bs = Math.Exp(best[1]);
        if (st == FitStatus.Ok && LognormalCurvatureZ(tail, bs) is var z && z < CurvatureZ)
            return (new() { ["mu"] = bm, ["sigma"] = bs }, FitStatus.AtBound,
                $"the lognormal fit lies at its power-law limit (μ = {bm:G4}, σ = {bs:G4}): its curvature 1/(2σ²) is "
                + $"{z:G2} standard errors from 0, so the data cannot tell it from a power law; no evidence either way");
        if (st == FitStatus.Ok)
        {
            // μ → −∞ with σ → ∞ is the lognormal's power-law limit: over the tail's range of ln x the curvature
            // (ln x − μ)²/2σ² is then spent on a straight line; a fit drifting there has no interior maximum
            double spread = Math.Log((double)x[^1] / xmin);
            if (bs > 0.99 * MaxSigma || Math.Abs(bm) > 0.99 * MaxAbsMu || bs > 20 * Math.Max(spread, 1) && bm < Math.Log(xmin) - 10 * bs)
                return (new() { ["mu"] = bm, ["sigma"] = bs }, FitStatus.AtBound,
                    $"the lognormal fit drifts to its power-law limit (μ = {bm:G4}, σ = {bs:G4}): no interior maximum, no evidence either way");
            if (bs < 1.01 * MinSigma)
                return (new() { ["mu"] = bm, ["sigma"] = bs }, FitStatus.AtBound, $"σ reached its floor {MinSigma}: the tail is concentrated on one value");
        }
        return (new() { ["mu"] = bm, ["sigma"] = bs }, st, msg);
    }

    private static Func<long, double> WeibullLogPmf(double lambda, double beta, long xmin)
    {
        double lnXmin = Math.Log(xmin), cb = Math.Exp(beta * lnXmin);
        return v =>
        {
            double lv = Math.Log(v), a = Math.Exp(beta * lv);
            double above = cb * LogMath.Expm1(beta * (lv - lnXmin));               // v^β − xmin^β
            double step = a * LogMath.Expm1(beta * LogMath.Log1p(1.0 / v));           // (v+1)^β − v^β
            return -lambda * above + Math.Log(-LogMath.Expm1(-lambda * step));
        };
    }

    private static (Dictionary<string, double>?, FitStatus, string) Weibull(long[] x, long[] m, long xmin, double alpha = double.NaN)
    {
        double n = m.Sum(), mean = 0;
        for (int i = 0; i < x.Length; i++) mean += m[i] * x[i];
        mean /= n;
        double Nll(Vector<double> p)
        {
            double lambda = Math.Exp(p[0]), beta = Math.Exp(p[1]);
            if (!(beta > MinBeta && beta < MaxBeta)) return 1e300;
            double ll = LogLik(WeibullLogPmf(lambda, beta, xmin), x, m);
            return double.IsFinite(ll) ? -ll : 1e300;
        }
        double u0 = -0.5 * Math.Log(mean), v0 = Math.Log(0.5);
        // its value has no cancelling sums, so it can be followed far down the flat ridge to the β floor (relTol 1e-12)
        // The β floor first, from the power-law limit (w = ln λβ = ln(α − 1)): the projected Newton holds v there while
        // the gradient pushes outwards and fits w alone (a few passes instead of ~30 down the ridge). Kept only when it
        // ends on the floor with the gradient still pushing outwards — the first-order (KKT) condition of a minimum on
        // the bound, which is where the walk from the interior start ends on power-law-like tails; else that walk runs.
        // Both are local searches: a likelihood with an interior maximum as well as such a floor point would now be
        // reported at the floor where the walk might have found the interior one (no such tail seen in the tests).
        Func<double, double, Quadratic2> slope = (w, v) => WeibullNllSlope(x, m, xmin, w, v);
        double vMin = Math.Log(MinBeta);
        var nt = double.IsFinite(alpha) && alpha > 1 ? Newton2.Minimize(slope, Math.Log(alpha - 1), vMin, vMin, 1e-12) : null;
        if (nt is not { } fl || fl.X1 > vMin || !(fl.At.G1 > 0))
            nt = Newton2.Minimize(slope, u0 + v0, v0, vMin, 1e-12);
        var (best, st, msg) = nt is { } r ? ([r.X0 - r.X1, r.X1], FitStatus.Ok, "") : Minimize(Nll, [u0, v0], [1, 0.5]);
        double bl = Math.Exp(best[0]), bb = Math.Exp(best[1]);
        var pars = new Dictionary<string, double> { ["lambda"] = bl, ["beta"] = bb };
        if (st == FitStatus.Ok && bb < 1.5 * MinBeta)
            return (pars, FitStatus.AtBound, $"β reached its floor {MinBeta} (β = {bb:G4}): the optimum is the β → 0 limit, "
                + "where the discrete Weibull becomes the power law itself; no evidence either way");
        if (st == FitStatus.Ok && bb > MaxBeta / 1.5)
            return (pars, FitStatus.AtBound, $"β reached its cap {MaxBeta} (β = {bb:G4}): the tail is too short to fix the shape");
        return (pars, st, msg);
    }

    /// <summary>ln C(α, λ), C = Σ_{k≥xmin} k^−α e^−λk: direct terms, then Simpson's rule over doubling blocks, all
    /// relative to the first term so nothing underflows.</summary>
    internal static double LogCutoffNormalizer(double alpha, double lambda, long xmin)
    {
        double lx = Math.Log(xmin);
        double f(double t) => Math.Exp(-alpha * (Math.Log(t) - lx) - lambda * (t - xmin));
        double sum = 0;
        long k = xmin, end = xmin + 4000;
        double shift = -alpha * lx - lambda * xmin;
        for (; k < end; k++)
        {
            double t = f(k);
            sum += t;
            if (lambda * (k - xmin) > 40 && t < 1e-17 * sum) return Math.Log(sum) + shift;
        }
        if (lambda == 0 && alpha > 1) return Math.Log(sum + Math.Exp(HurwitzZeta.LogValue(alpha, k) + alpha * lx)) + shift;
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
        return Math.Log(sum) + shift;
    }

    private static Func<long, double> CutoffLogPmf(double alpha, double lambda, long xmin)
    {
        double lnC = LogCutoffNormalizer(alpha, lambda, xmin);
        return v => -alpha * Math.Log(v) - lambda * v - lnC;
    }

    private static (Dictionary<string, double>?, FitStatus, string) Cutoff(long[] x, long[] m, long xmin, double alpha0)
    {
        double sumLn = 0, sumX = 0, n = m.Sum();
        for (int i = 0; i < x.Length; i++) { sumLn += m[i] * Math.Log(x[i]); sumX += m[i] * x[i]; }
        double Nll(Vector<double> p)
        {
            double alpha = p[0], lambda = Math.Exp(p[1]);
            if (Math.Abs(alpha) > 50) return 1e300;
            double ll = -alpha * sumLn - lambda * sumX - n * LogCutoffNormalizer(alpha, lambda, xmin);
            return double.IsFinite(ll) ? -ll : 1e300;
        }
        double startLambda = Math.Log(1 / (100 * sumX / n));
        var (best, st, msg) = Minimize(Nll, [alpha0, startLambda], [0.2, 2]);
        double ba = best[0], bl = Math.Exp(best[1]);
        var pars = new Dictionary<string, double> { ["alpha"] = ba, ["lambda"] = bl };
        // λ → 0 is the plain power law, the edge of the family's range
        if (st == FitStatus.Ok && bl * x[^1] < 1e-6)
            return (pars, FitStatus.AtBound, $"λ → 0 (λ = {bl:G3}): the best cut-off lies far beyond the largest count; "
                + "the family reduces to the power law, no evidence of a cut-off");
        return (pars, st, msg);
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
