using RankFreq.Counting;

namespace RankFreq.Lexical;

/// <summary>Rényi entropy of a unigram distribution and the efficiency built on it.</summary>
/// <remarks>
/// H_α(p) = log₂(Σ pᵢ^α) / (1 − α) for α ≠ 1, and the Shannon entropy −Σ pᵢ log₂ pᵢ at α = 1 (its limit). Rényi
/// efficiency is H_α(p) / log₂|V| (Zouhar et al. 2023, ACL, "Tokenization and the Noiseless Channel", who find order
/// 2.5 tracks downstream quality best); it is 1 for a uniform distribution over V entries. Sums run over the frequency
/// spectrum, so types sharing a count cost one term. Tested against hand-computed values to 1e-12.
/// </remarks>
public static class Renyi
{
    /// <summary>The order Zouhar et al. (2023) recommend.</summary>
    public const double DefaultOrder = 2.5;

    /// <summary>H_α of the plug-in distribution of <paramref name="s"/>, in bits; NaN for an empty spectrum.</summary>
    public static double EntropyBits(FrequencySpectrum s, double order)
    {
        if (s.TokenCount == 0 || !(order >= 0) || double.IsInfinity(order)) return double.NaN;
        double n = s.TokenCount, sum = 0;
        bool shannon = Math.Abs(order - 1) < 1e-12;
        for (int i = 0; i < s.Values.Length; i++)
        {
            double p = s.Values[i] / n;
            sum += shannon ? -s.Types[i] * p * Math.Log2(p) : s.Types[i] * Math.Pow(p, order);
        }
        return shannon ? sum : Math.Log2(sum) / (1 - order);
    }

    /// <summary>H_α / log₂ <paramref name="vocabulary"/>; NaN when the vocabulary has fewer than two entries.</summary>
    public static double Efficiency(FrequencySpectrum s, double order, long vocabulary) =>
        vocabulary > 1 ? EntropyBits(s, order) / Math.Log2(vocabulary) : double.NaN;
}
