using System.Globalization;
using MathNet.Numerics.LinearAlgebra;
using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Lexical;

/// <summary>
/// Forecasts vocabulary figures for larger (or smaller) samples from LNRE models fitted to a spectrum. Intervals come
/// from a parametric bootstrap over the fitted model: (V, V_1 … V_k) is drawn from the multivariate normal with the
/// model's expectations and Poisson-sampling covariance (<see cref="LnreModel.SpectrumCovariance"/>), the model is
/// refitted to each draw, and the 2.5% and 97.5% quantiles of its predictions are reported. Replicate r draws from
/// Xoshiro(seed, stream 0x4C4E5245, r), so results do not depend on the number of threads.
/// </summary>
public static class Forecaster
{
    private const ulong Stream = 0x4C4E5245;

    /// <summary>How a forecast can mislead, in the words every output uses.</summary>
    public static readonly IReadOnlyList<string> Cautions =
    [
        "Extrapolation assumes the larger collection is drawn like the sample: more text of the same kind, in random order. "
            + "Text order, topic drift, new sources and deduplication all break that assumption.",
        "Intervals cover the uncertainty of the fitted model's parameters only, and they widen fast beyond about ten times "
            + "the sample; far beyond it the choice of model matters more than the interval shows.",
        "Vocabulary models usually fail the goodness-of-fit test on large samples (p near 0): a small p says the model is "
            + "not exact, not that its forecast is useless. Held-out checks on real text are in the documentation.",
        "The models disagree beyond the sample: the Zipf–Mandelbrot model (infinitely many types) tends to forecast too "
            + "many types, the finite models (fZM, GIGP) too few; types_models_min and types_models_max give the spread.",
        "Hapaxes are the least reliable figure. Real text keeps adding rare types (names, rare forms) below the "
            + "frequencies a sample can show, and the finite models cut them off: forecasting the full size from a random "
            + "15% of two real corpora, the chosen model gave 31–37% too few hapaxes (and 6–9% too few types), the "
            + "Zipf–Mandelbrot model about 32% too many. Treat the hapax forecast as a lower bound, and "
            + "hapax_models_min to hapax_models_max (the range over all models, where the truth lay) as its uncertainty.",
    ];

    /// <summary>Fits the models and computes the curve.</summary>
    public static ForecastResult Run(FrequencySpectrum s, ForecastOptions o, CancellationToken ct = default)
    {
        long v1 = s.Values.Length > 0 && s.Values[0] == 1 ? s.Types[0] : 0;
        var families = o.Family == "auto" ? LnreFitter.Families : [o.Family];
        var fits = LnreFitter.Families.Select(f => families.Contains(f) ? LnreFitter.Fit(s, f)
            : LnreFit.Failed(f, LnreStatus.Skipped, "not fitted: another model was asked for")).ToList();
        var tried = fits.Where(f => families.Contains(f.Family)).ToList();
        var chosen = LnreFitter.Best(tried);
        string reason = Reason(tried, chosen, o.Family);
        if (chosen?.Model is not { } model)
            return new ForecastResult(s.TokenCount, s.TypeCount, v1, fits, null, reason, [], o, 0, Cautions);
        ct.ThrowIfCancellationRequested();

        double n = s.TokenCount;
        var tokens = Grid(n, o);
        int p = tokens.Length;
        var types = new double[o.Reps][]; var hapax = new double[o.Reps][]; var cover = new double[o.Reps][];
        var head = SpectrumHead.Of(s, chosen.SpectrumElements);
        int k = head.Head.Length;
        var mean = new double[k + 1];
        var e = model.ExpectedSpectrum(n, k);
        mean[0] = model.ExpectedTypes(n);
        for (int m = 1; m <= k; m++) mean[m] = e[m];
        // a covariance that is not positive definite (a model at the edge of its range) gives no draws: the curve
        // is still given, with its intervals missing (reps_used 0), rather than failing the run
        Matrix<double>? chol;
        try { chol = Matrix<double>.Build.DenseOfArray(model.SpectrumCovariance(n, k)).Cholesky().Factor; }
        catch (ArgumentException) { chol = null; }
        Parallel.For(0, chol is null ? 0 : o.Reps, new ParallelOptions { MaxDegreeOfParallelism = o.Threads > 0 ? o.Threads : -1, CancellationToken = ct }, r =>
        {
            var rng = new Xoshiro(o.Seed, Stream, (ulong)r);
            var z = new double[k + 1];
            for (int i = 0; i <= k; i++) z[i] = rng.NextNormal();
            var draw = new double[k + 1];
            for (int i = 0; i <= k; i++)
            {
                double x = mean[i];
                for (int j = 0; j <= i; j++) x += chol![i, j] * z[j];
                draw[i] = Math.Max(i == 0 ? 1 : 0, x);
            }
            var h = new SpectrumHead(n, Math.Max(draw[0], draw.Skip(1).Sum() + 1), draw[1..]);
            var refit = LnreFitter.Fit(h, chosen.Family, model);
            if (refit.Model is not { } rm) return;
            var (t, hx, c) = (new double[p], new double[p], new double[p]);
            for (int i = 0; i < p; i++)
            {
                t[i] = rm.ExpectedTypes(tokens[i]);
                hx[i] = rm.ExpectedSpectrum(tokens[i], 1)[1];
                c[i] = rm.CoverageTypes(o.Coverage, tokens[i]);
            }
            types[r] = t; hapax[r] = hx; cover[r] = c;
        });
        var ok = Enumerable.Range(0, o.Reps).Where(r => types[r] is not null).ToList();
        // the exact in-sample expectation costs a pass over the spectrum per point: spread the points over the threads
        var exact = new double[p];
        Parallel.For(0, p, new ParallelOptions { MaxDegreeOfParallelism = o.Threads > 0 ? o.Threads : -1, CancellationToken = ct },
            i => exact[i] = tokens[i] <= n ? Lexicon.ExpectedTypes(s, (long)Math.Round(tokens[i])) : double.NaN);
        var fitted = fits.Where(f => f.Model is not null).Select(f => f.Model!).ToList();
        var points = new ForecastPoint[p];
        for (int i = 0; i < p; i++)
        {
            double x = tokens[i];
            var es = model.ExpectedSpectrum(x, 2);
            double ev = model.ExpectedTypes(x);
            var (tl, th) = Band(ok.Select(r => types[r][i]));
            var (hl, hh) = Band(ok.Select(r => hapax[r][i]));
            var (cl, ch) = Band(ok.Select(r => cover[r][i]));
            string region = x < n ? "interpolation" : x == n ? "sample" : "extrapolation";
            var hapaxByModel = fitted.Select(f => f.ExpectedSpectrum(x, 1)[1]).ToList();
            points[i] = new ForecastPoint(x, region, ev, tl, th, Math.Sqrt(Math.Max(0, model.ExpectedTypes(2 * x) - ev)),
                exact[i], es[1], hl, hh, es[2],
                model.CoverageTypes(o.Coverage, x), cl, ch, fitted.Min(f => f.ExpectedTypes(x)), fitted.Max(f => f.ExpectedTypes(x)),
                hapaxByModel.Min(), hapaxByModel.Max());
        }
        ct.ThrowIfCancellationRequested();
        var selfCheck = ForecastSelfCheck.Run(s, o, families);
        return new ForecastResult(s.TokenCount, s.TypeCount, v1, fits, chosen, reason, points, o, ok.Count, Cautions, selfCheck);
    }

    /// <summary>The sample's own vocabulary covering a share q of its tokens: types taken from the most frequent down,
    /// the last frequency class counted in part (the quantity <see cref="LnreModel.CoverageTypes"/> forecasts).</summary>
    public static double ObservedCoverageTypes(FrequencySpectrum s, double q)
    {
        double need = q * s.TokenCount, tokens = 0, types = 0;
        for (int i = s.Values.Length - 1; i >= 0; i--)
        {
            double t = (double)s.Values[i] * s.Types[i];
            if (tokens + t >= need) return types + s.Types[i] * (need - tokens) / t;
            tokens += t; types += s.Types[i];
        }
        return types;
    }

    /// <summary>Log-spaced sizes from N/1000 (at least 10 tokens) to the largest target, with N and every target.</summary>
    public static double[] Grid(double n, ForecastOptions o)
    {
        double hi = Math.Max(n, o.Targets.Count == 0 ? 10 * n : o.Targets.Max(t => t.TokensFor(n)));
        double lo = Math.Max(10, n / 1000);
        var set = new SortedSet<double> { n };
        foreach (var t in o.Targets) set.Add(Math.Round(t.TokensFor(n)));
        int pts = Math.Max(2, o.Points);
        for (int i = 0; i < pts; i++) set.Add(Math.Round(Math.Exp(Math.Log(lo) + (Math.Log(hi) - Math.Log(lo)) * i / (pts - 1))));
        return set.Where(x => x >= 1).ToArray();
    }

    private static (double Lo, double Hi) Band(IEnumerable<double> values)
    {
        var v = values.Where(double.IsFinite).Order().ToArray();
        if (v.Length < 10) return (double.NaN, double.NaN);
        return (Quantile(v, 0.025), Quantile(v, 0.975));
    }

    private static double Quantile(double[] sorted, double q)
    {
        double h = (sorted.Length - 1) * q;
        int i = (int)Math.Floor(h);
        return i + 1 < sorted.Length ? sorted[i] + (h - i) * (sorted[i + 1] - sorted[i]) : sorted[i];
    }

    private static string Reason(IReadOnlyList<LnreFit> tried, LnreFit? chosen, string family)
    {
        static string Describe(LnreFit f) => f.Status == LnreStatus.Ok
            ? string.Create(CultureInfo.InvariantCulture, $"{f.Family} χ² = {f.ChiSquared:F1} on {f.DegreesOfFreedom} df")
            : $"{f.Family} {LnreStatusNames.Of(f.Status)}";
        if (chosen is null) return "no model fitted: " + string.Join("; ", tried.Select(f => $"{Describe(f)} ({f.Message})"));
        if (family != "auto") return $"{chosen.Family} as asked ({Describe(chosen)})";
        var others = tried.Where(f => f != chosen).Select(Describe).ToList();
        return $"{chosen.Family}: the smallest standardised χ² excess (χ² − df)/√(2·df) on the first {chosen.SpectrumElements} "
            + $"spectrum elements ({Describe(chosen)}{(others.Count > 0 ? "; " + string.Join(", ", others) : "")})";
    }
}
