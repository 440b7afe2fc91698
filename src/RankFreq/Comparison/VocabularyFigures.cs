using MathNet.Numerics;
using RankFreq.Counting;
using RankFreq.Lexical;

namespace RankFreq.Comparison;

/// <summary>The lexical figures a contrast reports for one spectrum (raw, or one thinned replicate).</summary>
/// <param name="Tokens">N.</param>
/// <param name="Types">V.</param>
/// <param name="HapaxShare">V₁ / V.</param>
/// <param name="GoodTuringUnseen">N₁ / N (Good 1953): probability that the next token is a new type.</param>
/// <param name="EntropyBits">Shannon entropy per token with the Miller–Madow correction, in bits.</param>
/// <param name="RenyiEfficiency">Rényi entropy of the given order over log V (Zouhar et al. 2023).</param>
/// <param name="HeapsBeta">β of V = K·N^β fitted to the expected random-order growth curve (see <see cref="VocabularyFigures.Of"/>).</param>
public sealed record VocabularyFigureSet(long Tokens, long Types, double HapaxShare, double GoodTuringUnseen, double EntropyBits,
    double RenyiEfficiency, double HeapsBeta);

/// <summary>Computes <see cref="VocabularyFigureSet"/> from a spectrum.</summary>
public static class VocabularyFigures
{
    /// <summary>The figures of <paramref name="s"/>; <paramref name="renyiOrder"/> is the order of the Rényi entropy.</summary>
    /// <remarks>
    /// Rényi efficiency follows Zouhar et al. (2023, ACL, "Tokenization and the Noiseless Channel"):
    /// H_a(p) / log V with H_a(p) = log(Σ p^a) / (1 − a), here with V the number of types observed (the paper divides
    /// by the vocabulary size of the tokenizer; for word types there is no fixed vocabulary). Order 2.5 reproduces
    /// <see cref="Lexicon.Summarize"/>. Heaps' β is fitted by least squares of ln V on ln M over 40 log-spaced sizes
    /// M from min(100, N/10) to N of Baayen's (2001) binomial interpolation V(M) = V − Σ_f V_f (1 − M/N)^f, the
    /// expected growth under random token order: a thinned replicate has no corpus order, so raw and matched β are
    /// measured the same way (it differs from the observed-order β of a profile).
    /// </remarks>
    public static VocabularyFigureSet Of(FrequencySpectrum s, double renyiOrder = 2.5)
    {
        long n = s.TokenCount, v = s.TypeCount;
        if (n == 0) return new VocabularyFigureSet(0, 0, double.NaN, double.NaN, double.NaN, double.NaN, double.NaN);
        long v1 = s.Values.Length > 0 && s.Values[0] == 1 ? s.Types[0] : 0;
        double h = 0, r = 0;
        for (int i = 0; i < s.Values.Length; i++)
        {
            double p = s.Values[i] / (double)n;
            h -= s.Types[i] * p * Math.Log2(p);
            r += s.Types[i] * Math.Pow(p, renyiOrder);
        }
        double mm = h + (v - 1) / (2.0 * n * Math.Log(2));
        double renyi = Math.Abs(renyiOrder - 1) < 1e-12 ? h : Math.Log2(r) / (1 - renyiOrder);
        return new VocabularyFigureSet(n, v, v1 / (double)v, v1 / (double)n, mm, v > 1 ? renyi / Math.Log2(v) : double.NaN, HeapsBeta(s));
    }

    private static double HeapsBeta(FrequencySpectrum s)
    {
        long n = s.TokenCount;
        double from = Math.Min(100, n / 10.0);
        if (from < 2 || s.TypeCount < 3) return double.NaN;
        const int points = 40;
        var x = new double[points];
        var y = new double[points];
        for (int i = 0; i < points; i++)
        {
            double m = Math.Exp(Math.Log(from) + (Math.Log(n) - Math.Log(from)) * i / (points - 1));
            x[i] = Math.Log(m);
            y[i] = Math.Log(Lexicon.BinomialTypes(s, (long)Math.Round(m)));
        }
        var (_, beta) = Fit.Line(x, y);
        return beta;
    }
}
