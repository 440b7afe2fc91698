namespace RankFreq.Lexical;

/// <summary>An LNRE model fitted to a spectrum, with its goodness of fit.</summary>
/// <param name="Family">"zm", "fzm" or "gigp".</param>
/// <param name="Model">The fitted model, or null unless <paramref name="Status"/> is ok.</param>
/// <param name="Status">Outcome.</param>
/// <param name="Message">What went wrong, in words (empty when ok).</param>
/// <param name="SpectrumElements">k: the spectrum elements V_1 … V_k used (each observed at least 5 times).</param>
/// <param name="DegreesOfFreedom">k + 1 − parameters: the test vector is (V, V_1 … V_k).</param>
/// <param name="ChiSquared">Multivariate χ² = dᵀ Σ⁻¹ d, d = observed − expected (V, V_1 … V_k), Σ their
/// covariance under the model (Baayen 2001, §3.3).</param>
/// <param name="P">Upper χ² tail probability of <paramref name="ChiSquared"/>. With large samples every LNRE model is
/// rejected: p near 0 is the rule for corpora of a million tokens, and is no reason to distrust interpolation.</param>
/// <param name="Cost">Σ (V_m − E[V_m])²/E[V_m] over m ≤ k, the quantity the parameters minimise.</param>
public sealed record LnreFit(string Family, LnreModel? Model, LnreStatus Status, string Message, int SpectrumElements,
    int DegreesOfFreedom, double ChiSquared, double P, double Cost)
{
    /// <summary>Standardised excess (χ² − df)/√(2 df): how models with different df are ranked.</summary>
    public double Excess => DegreesOfFreedom > 0 ? (ChiSquared - DegreesOfFreedom) / Math.Sqrt(2.0 * DegreesOfFreedom) : double.NaN;

    internal static LnreFit Failed(string family, LnreStatus status, string message, int k = 0) =>
        new(family, null, status, message, k, 0, double.NaN, double.NaN, double.NaN);
}
