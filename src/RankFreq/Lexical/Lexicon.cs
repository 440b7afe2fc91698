using System.Globalization;
using MathNet.Numerics;
using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Lexical;

/// <summary>Computes lexical figures and growth curves from a spectrum.</summary>
public static class Lexicon
{
    /// <summary>The figures of <see cref="LexicalSummary"/>.</summary>
    public static LexicalSummary Summarize(FrequencySpectrum s)
    {
        long n = s.TokenCount, v = s.TypeCount, v1 = 0, v2 = 0;
        double sumF2 = 0, h = 0, r = 0;
        const double order = 2.5;
        for (int i = 0; i < s.Values.Length; i++)
        {
            long f = s.Values[i], m = s.Types[i];
            if (f == 1) v1 = m;
            if (f == 2) v2 = m;
            sumF2 += (double)f * f * m;
            double p = f / (double)n;
            h -= m * p * Math.Log2(p);
            r += m * Math.Pow(p, order);
        }
        double chao = v2 > 0 ? v + v1 * (double)v1 / (2.0 * v2) : v + v1 * (v1 - 1) / 2.0;
        double renyi = Math.Log2(r) / (1 - order);
        return new LexicalSummary(n, v, v / (double)n, v1, v2, v1 / (double)v, v2 / (double)v, v1 / (double)n, chao,
            1e4 * (sumF2 - n) / ((double)n * n), h, h + (v - 1) / (2.0 * n * Math.Log(2)), v > 1 ? renyi / Math.Log2(v) : double.NaN);
    }

    /// <summary>E[V(M)] for a random sample of M tokens without replacement: V − Σ_f V_f C(N−f, M)/C(N, M).</summary>
    /// <remarks>
    /// ln C(N−f, M)/C(N, M) = Σ_(j&lt;f) ln(1 − M/(N − j)), summed with log1p from one spectrum value to the next
    /// (most spectra hold long runs of consecutive values); across a gap of more than 64 it is recomputed from ln Γ.
    /// The terms fall as f grows, so the sum stops once one is below the smallest double. Agrees with the
    /// probability C(N − f, M)/C(N, M) from MathNet.Numerics 5.0.0's <c>BinomialLn</c> to 1e-9 of V
    /// (LexicalTests; the result is V minus the expected missing types, so its error scales with V).
    /// </remarks>
    public static double ExpectedTypes(FrequencySpectrum s, long m)
    {
        long n = s.TokenCount;
        if (m >= n) return s.TypeCount;
        double lnDen = SpecialFunctions.GammaLn(n + 1) - SpecialFunctions.GammaLn(n - m + 1);
        double absent = 0, ln = 0;
        long at = 0; // ln holds the sum for f = at
        for (int i = 0; i < s.Values.Length; i++)
        {
            long f = s.Values[i];
            if (n - f < m) break; // such a type (and every more frequent one) is always present
            if (f - at <= 64)
                for (long j = at; j < f; j++) ln += LogMath.Log1p(-(double)m / (n - j));
            else ln = SpecialFunctions.GammaLn(n - f + 1) - SpecialFunctions.GammaLn(n - f - m + 1) - lnDen;
            at = f;
            if (ln < -746) break; // e^ln is 0 in double precision, and so is every later term
            absent += s.Types[i] * Math.Exp(ln);
        }
        return s.TypeCount - absent;
    }

    /// <summary>Baayen's binomial interpolation V − Σ_f V_f (1 − M/N)^f.</summary>
    public static double BinomialTypes(FrequencySpectrum s, long m)
    {
        double q = 1 - m / (double)s.TokenCount, absent = 0;
        for (int i = 0; i < s.Values.Length; i++) absent += s.Types[i] * Math.Pow(q, s.Values[i]);
        return s.TypeCount - absent;
    }

    /// <summary>Share of the tokens after which Heaps' law is fitted: the upper part of the growth curve.</summary>
    public const double HeapsFromShare = 0.1;

    /// <summary>
    /// Growth curves and Heaps' law V = K·N^β, fitted by ordinary least squares of ln V on ln N over the observed
    /// checkpoints with N ≥ <see cref="HeapsFromShare"/> of the tokens (all checkpoints when fewer than three lie there).
    /// </summary>
    /// <remarks>
    /// Heaps' law describes the upper growth curve; the first few hundred tokens of a text add a new type at almost
    /// every token, and a fit over the whole log-spaced curve, where such early points are as many as the late ones,
    /// sits well below the curve where it matters. Fitting from 10% of N is our choice, stated in
    /// <see cref="GrowthAnalysis.HeapsMethod"/> and <see cref="GrowthAnalysis.HeapsFrom"/>.
    /// </remarks>
    public static GrowthAnalysis Growth(FrequencySpectrum s, GrowthCurve observed)
    {
        var tokens = observed.Tokens;
        var exp = tokens.Select(t => ExpectedTypes(s, t)).ToArray();
        var bin = tokens.Select(t => BinomialTypes(s, t)).ToArray();
        var all = tokens.Select((t, i) => (t, v: observed.Types[i])).Where(p => p.v > 0).ToList();
        long total = tokens.Length > 0 ? tokens[^1] : 0;
        var pts = all.Where(p => p.t >= HeapsFromShare * total).ToList();
        bool upper = pts.Count >= 3;
        if (!upper) pts = all;
        double k = double.NaN, beta = double.NaN;
        if (pts.Count >= 2)
        {
            var (a, b) = Fit.Line(pts.Select(p => Math.Log(p.t)).ToArray(), pts.Select(p => Math.Log(p.v)).ToArray());
            k = Math.Exp(a); beta = b;
        }
        long from = pts.Count > 0 ? pts[0].t : 0;
        var ic = CultureInfo.InvariantCulture;
        string share = string.Create(ic, $"{HeapsFromShare * 100:F0}%");
        string range = pts.Count == 0 ? "no checkpoints"
            : string.Create(ic, $"the {pts.Count} observed checkpoints from N = {from:N0} to N = {pts[^1].t:N0}");
        string method = $"ordinary least squares of ln V on ln N over {range}"
            + (upper ? $" (the upper growth curve, from {share} of the tokens on)"
                : $" (all of them: fewer than three lie beyond {share} of the tokens)");
        return new GrowthAnalysis(tokens, observed.Types, exp, bin, k, beta, method) { HeapsFrom = from };
    }
}
