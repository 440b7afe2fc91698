using MathNet.Numerics;
using RankFreq.Counting;

namespace RankFreq.Lexical;

/// <summary>Vocabulary figures of a spectrum. All of them depend on sample size: compare collections only at equal N.</summary>
/// <param name="Tokens">N, tokens.</param>
/// <param name="Types">V, types.</param>
/// <param name="TypeTokenRatio">V / N.</param>
/// <param name="Hapax">V₁, types seen once (hapax legomena).</param>
/// <param name="Dis">V₂, types seen twice (dis legomena).</param>
/// <param name="HapaxShare">V₁ / V.</param>
/// <param name="DisShare">V₂ / V.</param>
/// <param name="GoodTuringUnseen">N₁ / N: Good (1953) estimate of the probability that the next token is a new type.</param>
/// <param name="Chao1">Chao (1984) lower bound on vocabulary size: V + V₁²/(2V₂), or V + V₁(V₁−1)/2 when V₂ = 0 (bias-corrected form).</param>
/// <param name="YuleK">Yule's K = 10⁴ (Σ f² V_f − N) / N² (Yule 1944), a richness figure far less size-dependent than V/N.</param>
/// <param name="EntropyBits">Plug-in Shannon entropy −Σ p log₂ p per token.</param>
/// <param name="EntropyMillerMadowBits">Plug-in entropy plus the Miller–Madow correction (V − 1)/(2N ln 2).</param>
/// <param name="RenyiEfficiency">Rényi entropy of order 2.5 divided by log V (Zouhar et al. 2023, "Tokenization and the noiseless channel").</param>
public sealed record LexicalSummary(long Tokens, long Types, double TypeTokenRatio, long Hapax, long Dis, double HapaxShare, double DisShare,
    double GoodTuringUnseen, double Chao1, double YuleK, double EntropyBits, double EntropyMillerMadowBits, double RenyiEfficiency);

/// <summary>Vocabulary growth: observed in corpus order, expected under random order, and Heaps' law.</summary>
/// <param name="Tokens">Checkpoints N.</param>
/// <param name="Observed">V(N) in corpus order.</param>
/// <param name="Expected">E[V(N)] under random order, exact hypergeometric: V − Σ_f V_f C(N_total−f, N)/C(N_total, N).</param>
/// <param name="Binomial">Baayen's (2001, §2.6) binomial interpolation V − Σ_f V_f (1 − N/N_total)^f, which the exact form approaches for large N.</param>
/// <param name="HeapsK">K of V = K N^β.</param>
/// <param name="HeapsBeta">β of V = K N^β.</param>
/// <param name="HeapsMethod">How Heaps' law was fitted.</param>
public sealed record GrowthAnalysis(long[] Tokens, long[] Observed, double[] Expected, double[] Binomial, double HeapsK, double HeapsBeta, string HeapsMethod);

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
