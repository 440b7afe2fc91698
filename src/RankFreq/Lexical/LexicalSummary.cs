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
