using MathNet.Numerics;
using MathNet.Numerics.LinearAlgebra;
using MathNet.Numerics.Optimization;

namespace RankFreq.Fitting;

/// <summary>Comparison of the power law with another heavy-tailed family on the same tail x ≥ xmin.</summary>
/// <param name="Name">discrete_lognormal, geometric, discrete_weibull or power_law_cutoff (see <see cref="Alternatives"/>).</param>
/// <param name="Parameters">Maximum-likelihood parameters of the alternative.</param>
/// <param name="LogLikelihood">Its log-likelihood on the tail.</param>
/// <param name="Llr">Σ (ln p_power_law − ln p_alternative): positive favours the power law.</param>
/// <param name="NormalizedLlr">Vuong's statistic Llr / (σ √n).</param>
/// <param name="P">Two-sided p-value (Vuong 1989) or, for the nested cut-off, ½·P(χ²₁ &gt; 2|Llr|) (the boundary-corrected LR test).</param>
/// <param name="Favours">power_law, the alternative's name, or inconclusive when p &gt; 0.1.</param>
/// <param name="Status">Whether the alternative's fit converged.</param>
/// <param name="Message">What went wrong, if anything.</param>
public sealed record AlternativeComparison(string Name, IReadOnlyDictionary<string, double> Parameters, double LogLikelihood,
    double Llr, double NormalizedLlr, double P, string Favours, FitStatus Status, string Message);
