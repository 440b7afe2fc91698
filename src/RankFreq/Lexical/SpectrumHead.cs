using RankFreq.Counting;

namespace RankFreq.Lexical;

/// <summary>What an LNRE fit uses of a spectrum: N, V and the first spectrum elements V_1 … V_k.</summary>
/// <param name="Tokens">N.</param>
/// <param name="Types">V.</param>
/// <param name="Head">V_m at index m − 1, m = 1 … k (real-valued so that bootstrap draws can be refitted).</param>
public sealed record SpectrumHead(double Tokens, double Types, double[] Head)
{
    /// <summary>N, V and V_1 … V_k of <paramref name="s"/>, k = <paramref name="k"/>.</summary>
    public static SpectrumHead Of(FrequencySpectrum s, int k)
    {
        var head = new double[k];
        for (int i = 0; i < s.Values.Length && s.Values[i] <= k; i++) head[s.Values[i] - 1] = s.Types[i];
        return new SpectrumHead(s.TokenCount, s.TypeCount, head);
    }
}
