using MathNet.Numerics;
using RankFreq.Counting;

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
    public static double ExpectedTypes(FrequencySpectrum s, long m)
    {
        long n = s.TokenCount;
        if (m >= n) return s.TypeCount;
        double lnDen = SpecialFunctions.GammaLn(n + 1) - SpecialFunctions.GammaLn(n - m + 1);
        double absent = 0;
        for (int i = 0; i < s.Values.Length; i++)
        {
            long f = s.Values[i];
            if (n - f < m) continue; // such a type is always present
            double ln = SpecialFunctions.GammaLn(n - f + 1) - SpecialFunctions.GammaLn(n - f - m + 1) - lnDen;
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

    /// <summary>Growth curves and Heaps' law, fitted by ordinary least squares of ln V on ln N over the observed checkpoints with N ≥ 100.</summary>
    public static GrowthAnalysis Growth(FrequencySpectrum s, GrowthCurve observed)
    {
        var tokens = observed.Tokens;
        var exp = tokens.Select(t => ExpectedTypes(s, t)).ToArray();
        var bin = tokens.Select(t => BinomialTypes(s, t)).ToArray();
        var pts = tokens.Select((t, i) => (t, v: observed.Types[i])).Where(p => p.t >= 100 && p.v > 0).ToList();
        if (pts.Count < 3) pts = tokens.Select((t, i) => (t, v: observed.Types[i])).Where(p => p.v > 0).ToList();
        double k = double.NaN, beta = double.NaN;
        if (pts.Count >= 2)
        {
            var (a, b) = Fit.Line(pts.Select(p => Math.Log(p.t)).ToArray(), pts.Select(p => Math.Log(p.v)).ToArray());
            k = Math.Exp(a); beta = b;
        }
        return new GrowthAnalysis(tokens, observed.Types, exp, bin, k, beta,
            "ordinary least squares of ln V on ln N over log-spaced checkpoints of the observed growth curve (N ≥ 100)");
    }
}
