using MathNet.Numerics;
using RankFreq.Counting;

namespace RankFreq.Lexical;

/// <summary>Vocabulary growth: observed in corpus order, expected under random order, and Heaps' law.</summary>
/// <param name="Tokens">Checkpoints N.</param>
/// <param name="Observed">V(N) in corpus order.</param>
/// <param name="Expected">E[V(N)] under random order, exact hypergeometric: V − Σ_f V_f C(N_total−f, N)/C(N_total, N).</param>
/// <param name="Binomial">Baayen's (2001, §2.6) binomial interpolation V − Σ_f V_f (1 − N/N_total)^f, which the exact
/// form approaches for large N.</param>
/// <param name="HeapsK">K of V = K N^β.</param>
/// <param name="HeapsBeta">β of V = K N^β.</param>
/// <param name="HeapsMethod">How Heaps' law was fitted.</param>
public sealed record GrowthAnalysis(long[] Tokens, long[] Observed, double[] Expected, double[] Binomial, double HeapsK, double HeapsBeta, string HeapsMethod)
{
    /// <summary>Heaps' law at <paramref name="tokens"/>: K·N^β.</summary>
    public double HeapsAt(double tokens) => HeapsK * Math.Pow(tokens, HeapsBeta);

    /// <summary>The first checkpoint N of the Heaps fit (0 when there was none): the law is fitted from here to the end.</summary>
    public long HeapsFrom { get; init; }
}
