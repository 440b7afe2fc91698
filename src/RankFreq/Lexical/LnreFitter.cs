using MathNet.Numerics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.RootFinding;
using RankFreq.Counting;

namespace RankFreq.Lexical;

/// <summary>
/// Fits LNRE models to the low end of a frequency spectrum. Every model is held to E[V(N)] = V exactly (one
/// parameter is solved for that by Brent's method), and its remaining parameters minimise
/// Σ_(m ≤ k) (V_m − E[V_m(N)])²/E[V_m(N)] by Nelder–Mead from a few starting points; k is the number of leading
/// spectrum elements each observed at least 5 times (at most 15; common practice for χ² cells). The fit is then
/// tested by Baayen's (2001, §3.3) multivariate χ² on (V, V_1 … V_k) with k + 1 − (parameters) degrees of freedom.
/// </summary>
public static class LnreFitter
{
    /// <summary>The families, in the order they are reported.</summary>
    public static readonly IReadOnlyList<string> Families = ["zm", "fzm", "gigp"];

    /// <summary>Most spectrum elements used.</summary>
    public const int MaxElements = 15;

    /// <summary>Fewest types for a fit.</summary>
    public const int MinTypes = 50;

    /// <summary>Checks a spectrum for what no LNRE model can describe; null when it can be fitted.</summary>
    public static (LnreStatus Status, string Message)? Degenerate(FrequencySpectrum s)
    {
        long v = s.TypeCount, n = s.TokenCount, v1 = s.Values.Length > 0 && s.Values[0] == 1 ? s.Types[0] : 0;
        if (v < MinTypes)
            return (LnreStatus.TooFewTypes, $"{v:N0} types in {n:N0} tokens: at least {MinTypes} types are needed to fit a vocabulary model");
        if (v1 == v)
            return (LnreStatus.AllHapax, "every type occurs once, so the sample says nothing about how often types repeat; collect more text");
        if (v1 == 0)
            return (LnreStatus.NoHapax, "no type occurs once: the sample looks complete or was filtered (e.g. a minimum count), and LNRE models do not apply");
        return null;
    }

    /// <summary>Elements k: the leading run of spectrum elements with at least 5 types each, at most 15.</summary>
    public static int ElementsOf(FrequencySpectrum s)
    {
        int k = 0;
        for (int i = 0; i < s.Values.Length && k < MaxElements; i++)
        {
            if (s.Values[i] != k + 1 || s.Types[i] < 5) break;
            k++;
        }
        return k;
    }

    /// <summary>Fits <paramref name="family"/> ("zm", "fzm", "gigp") to <paramref name="s"/>.</summary>
    public static LnreFit Fit(FrequencySpectrum s, string family)
    {
        if (Degenerate(s) is { } d) return LnreFit.Failed(family, d.Status, d.Message);
        int k = ElementsOf(s);
        return Fit(SpectrumHead.Of(s, k), family, null);
    }

    /// <summary>Fits all three families.</summary>
    public static IReadOnlyList<LnreFit> FitAll(FrequencySpectrum s) => Families.Select(f => Fit(s, f)).ToList();

    /// <summary>
    /// The best fitted model: the smallest standardised excess (χ² − df)/√(2 df), which orders models with different
    /// degrees of freedom like their p-values do while p is not yet lost to underflow. Null when none fitted.
    /// </summary>
    public static LnreFit? Best(IReadOnlyList<LnreFit> fits) =>
        fits.Where(f => f.Status == LnreStatus.Ok).OrderBy(f => f.Excess).FirstOrDefault();

    /// <summary>Fits a family to N, V and V_1 … V_k; <paramref name="start"/> (a fitted model of the same family)
    /// seeds the search, as bootstrap refits do.</summary>
    public static LnreFit Fit(SpectrumHead h, string family, LnreModel? start)
    {
        int k = h.Head.Length;
        int p = family switch { "zm" => 2, "fzm" or "gigp" => 3, _ => throw new ArgumentException($"unknown LNRE family '{family}'", nameof(family)) };
        if (k < p)
            return LnreFit.Failed(family, LnreStatus.TooFewSpectrumElements,
                $"only {k} leading spectrum element(s) hold at least 5 types; the {family} model needs {p} for a test with 1 degree of freedom", k);
        Func<double[], LnreModel?> build = family switch
        {
            "zm" => t => BuildZm(h, Logistic(t[0]), (start as ZipfMandelbrotModel)?.B),
            "fzm" => t => BuildFzm(h, Logistic(t[0]), Math.Exp(t[1]) / h.Tokens, (start as FiniteZipfMandelbrotModel)?.B),
            _ => t => BuildGigp(h, -1.5 + 2 * Logistic(t[0]), Math.Exp(t[1]), (start as GigpModel)?.C),
        };
        double Cost(double[] t) => build(t) is { } m ? CostOf(h, m) : double.MaxValue;
        var starts = Starts(h, family, start);
        double[]? best = null;
        double bestCost = double.MaxValue;
        foreach (var s0 in starts)
        {
            double c = Cost(s0);
            if (c < bestCost) { bestCost = c; best = s0; }
        }
        if (best is null)
            return LnreFit.Failed(family, LnreStatus.NoSolution, $"no {family} parameters reproduce V = {h.Types:N0} at N = {h.Tokens:N0}", k);
        // a bootstrap refit starts at the fitted model and stops at 1e-5 in the (logit, log) parameters: its forecasts
        // then agree with a 1e-7 stop to about 1e-6 relative, far inside the spread the bootstrap measures
        var (xmin, fmin, converged) = start is null ? NelderMead(Cost, best, 0.5, 600, 1e-9, 1e-7) : NelderMead(Cost, best, 0.1, 200, 1e-7, 1e-5);
        var model = build(xmin);
        if (model is null || fmin >= double.MaxValue)
            return LnreFit.Failed(family, LnreStatus.NoSolution, $"no {family} parameters reproduce V = {h.Types:N0} at N = {h.Tokens:N0}", k);
        if (!converged)
            return new LnreFit(family, null, LnreStatus.NotConverged, "the minimiser did not converge within its iteration limit", k, 0,
                double.NaN, double.NaN, fmin);
        var (chi, df) = ChiSquared(h, model);
        double pv = df > 0 && double.IsFinite(chi) ? SpecialFunctions.GammaUpperRegularized(df / 2.0, Math.Max(0, chi) / 2) : double.NaN;
        return new LnreFit(family, model, LnreStatus.Ok, "", k, df, chi, pv, fmin);
    }

    /// <summary>Baayen's multivariate χ² of (V, V_1 … V_k) against the model, and its degrees of freedom.</summary>
    public static (double ChiSquared, int Df) ChiSquared(SpectrumHead h, LnreModel model)
    {
        int k = h.Head.Length;
        var e = model.ExpectedSpectrum(h.Tokens, k);
        var d = Vector<double>.Build.Dense(k + 1);
        d[0] = h.Types - model.ExpectedTypes(h.Tokens);
        for (int m = 1; m <= k; m++) d[m] = h.Head[m - 1] - e[m];
        var cov = Matrix<double>.Build.DenseOfArray(model.SpectrumCovariance(h.Tokens, k));
        double chi;
        try { chi = d.DotProduct(cov.Cholesky().Solve(d)); }
        catch (ArgumentException) { chi = d.DotProduct(cov.PseudoInverse() * d); }
        return (chi, k + 1 - model.ParameterCount);
    }

    private static double CostOf(SpectrumHead h, LnreModel m)
    {
        var e = m.ExpectedSpectrum(h.Tokens, h.Head.Length);
        double c = 0;
        for (int i = 1; i <= h.Head.Length; i++)
        {
            if (!(e[i] > 0) || !double.IsFinite(e[i])) return double.MaxValue;
            double r = h.Head[i - 1] - e[i];
            c += r * r / e[i];
        }
        return c;
    }

    private static List<double[]> Starts(SpectrumHead h, string family, LnreModel? start)
    {
        double ratio = Math.Clamp(h.Head[0] / h.Types, 0.05, 0.95);
        switch (start, family)
        {
            case (ZipfMandelbrotModel z, _): return [[Logit(z.Alpha)]];
            case (FiniteZipfMandelbrotModel f, _): return [[Logit(f.Alpha), Math.Log(f.A * h.Tokens)]];
            case (GigpModel g, _): return [[Logit((g.Gamma + 1.5) / 2), Math.Log(g.B)]];
        }
        return family switch
        {
            "zm" => [[Logit(ratio)], [Logit(0.5)], [Logit(0.8)]],
            "fzm" => [.. from a in new[] { ratio, 0.5, 0.8 } from la in new[] { -6.0, -3.0, -1.0, 1.0 } select new[] { Logit(a), la }],
            _ => [.. from g in new[] { -0.8, -0.5, -0.2 } from lb in new[] { -7.0, -5.0, -3.0, -1.0 } select new[] { Logit((g + 1.5) / 2), lb }],
        };
    }

    // a refit passes the fitted model's scale as "near": the root is searched from there in small steps, which saves
    // most of the bracketing (a bootstrap draw moves it little)
    private static ZipfMandelbrotModel? BuildZm(SpectrumHead h, double alpha, double? near)
    {
        if (alpha is <= 0.001 or >= 0.999) return null;
        double lnB = SolveScale(lb => new ZipfMandelbrotModel(alpha, Math.Exp(lb)).ExpectedTypes(h.Tokens) - h.Types,
            near is { } b0 ? Math.Log(b0) : ZmGuess(h, alpha), double.NegativeInfinity, 0, near is null ? 1 : 0.05);
        return double.IsNaN(lnB) ? null : new ZipfMandelbrotModel(alpha, Math.Exp(lnB));
    }

    private static FiniteZipfMandelbrotModel? BuildFzm(SpectrumHead h, double alpha, double a, double? near)
    {
        if (alpha is <= 0.001 or >= 0.999 || !(a > 0)) return null;
        double lnA = Math.Log(a);
        if (lnA >= -1e-9) return null;
        double lnB = SolveScale(lb => new FiniteZipfMandelbrotModel(alpha, a, Math.Exp(lb)).ExpectedTypes(h.Tokens) - h.Types,
            near is { } b0 ? Math.Max(Math.Log(b0), lnA + 1e-6) : Math.Max(ZmGuess(h, alpha), lnA + 1), lnA + 1e-9, 0, near is null ? 1 : 0.05);
        return double.IsNaN(lnB) ? null : new FiniteZipfMandelbrotModel(alpha, a, Math.Exp(lnB));
    }

    private static GigpModel? BuildGigp(SpectrumHead h, double gamma, double b, double? near)
    {
        if (!(b > 1e-12) || b > 1e6) return null;
        // E[V(N)] falls as c grows (S ∝ 1/c); start where S·(1 − …) is about V, i.e. c ≈ 1/N
        double lnC = SolveScale(lc => new GigpModel(gamma, b, Math.Exp(lc)).ExpectedTypes(h.Tokens) - h.Types,
            near is { } c0 ? Math.Log(c0) : -Math.Log(h.Tokens), double.NegativeInfinity, double.PositiveInfinity, near is null ? 1 : 0.05);
        return double.IsNaN(lnC) ? null : new GigpModel(gamma, b, Math.Exp(lnC));
    }

    /// <summary>Large-NB approximation of the ZM scale: V ≈ (1 − α) B^(α−1) N^α Γ(1 − α)/α.</summary>
    private static double ZmGuess(SpectrumHead h, double alpha) =>
        Math.Min(-1e-6, (Math.Log(h.Types * alpha / (1 - alpha)) - alpha * Math.Log(h.Tokens) - SpecialFunctions.GammaLn(1 - alpha)) / (alpha - 1));

    /// <summary>Root of a decreasing function f on (lo, hi], bracketed by stepping from x0; NaN when none.</summary>
    private static double SolveScale(Func<double, double> f, double x0, double lo, double hi, double step)
    {
        x0 = Math.Min(x0, hi);
        if (x0 <= lo) x0 = lo + 1e-6;
        double fx = f(x0);
        if (!double.IsFinite(fx)) return double.NaN;
        double a = x0, b = x0, fa = fx, fb = fx;
        for (int i = 0; i < 60 && fa * fb > 0; i++)
        {
            if (fx > 0) { a = b; fa = fb; b = Math.Min(hi, b + step); if (b == a) return double.NaN; fb = f(b); }
            else { b = a; fb = fa; a = Math.Max(lo + 1e-12, a - step); if (a == b) return double.NaN; fa = f(a); }
            if (!double.IsFinite(fa) || !double.IsFinite(fb)) return double.NaN;
            step *= 1.6;
        }
        if (fa * fb > 0) return double.NaN;
        return Brent.TryFindRoot(f, a, b, 1e-11, 200, out double root) ? root : double.NaN;
    }

    /// <summary>Plain Nelder–Mead (standard coefficients 1, 2, ½, ½); converged when the simplex's values agree to
    /// <paramref name="fTol"/> relative and its points to <paramref name="xTol"/>.</summary>
    private static (double[] X, double F, bool Converged) NelderMead(Func<double[], double> f, double[] x0, double step, int maxIter,
        double fTol, double xTol)
    {
        int n = x0.Length;
        var pts = new double[n + 1][];
        var val = new double[n + 1];
        for (int i = 0; i <= n; i++)
        {
            pts[i] = (double[])x0.Clone();
            if (i > 0) pts[i][i - 1] += step;
            val[i] = f(pts[i]);
        }
        for (int it = 0; it < maxIter; it++)
        {
            Array.Sort(val, pts);
            double spread = 0;
            for (int i = 1; i <= n; i++) for (int j = 0; j < n; j++) spread = Math.Max(spread, Math.Abs(pts[i][j] - pts[0][j]));
            if (Math.Abs(val[n] - val[0]) <= fTol * (Math.Abs(val[0]) + 1e-12) && spread < xTol) return (pts[0], val[0], true);
            var c = new double[n];
            for (int i = 0; i < n; i++) for (int j = 0; j < n; j++) c[j] += pts[i][j] / n;
            double[] At(double t) { var x = new double[n]; for (int j = 0; j < n; j++) x[j] = c[j] + t * (pts[n][j] - c[j]); return x; }
            var r = At(-1); double fr = f(r);
            if (fr < val[0])
            {
                var e = At(-2); double fe = f(e);
                if (fe < fr) { pts[n] = e; val[n] = fe; } else { pts[n] = r; val[n] = fr; }
            }
            else if (fr < val[n - 1]) { pts[n] = r; val[n] = fr; }
            else
            {
                var ct = fr < val[n] ? At(-0.5) : At(0.5); double fc = f(ct);
                if (fc < Math.Min(fr, val[n])) { pts[n] = ct; val[n] = fc; }
                else
                    for (int i = 1; i <= n; i++)
                    {
                        for (int j = 0; j < n; j++) pts[i][j] = pts[0][j] + 0.5 * (pts[i][j] - pts[0][j]);
                        val[i] = f(pts[i]);
                    }
            }
        }
        Array.Sort(val, pts);
        // a flat valley (a parameter the data do not pin down) still leaves a usable minimum
        return (pts[0], val[0], Math.Abs(val[n] - val[0]) <= 1e-6 * (Math.Abs(val[0]) + 1));
    }

    private static double Logistic(double t) => 1 / (1 + Math.Exp(-t));
    private static double Logit(double p) => Math.Log(p / (1 - p));
}
