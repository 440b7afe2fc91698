namespace RankFreq.Lexical;

/// <summary>Expected vocabulary figures at one sample size, with 95% parametric bootstrap intervals.</summary>
/// <param name="Tokens">N.</param>
/// <param name="Region">"interpolation" (below the sample size), "sample" (at it) or "extrapolation".</param>
/// <param name="Types">E[V(N)] under the model.</param>
/// <param name="TypesLo">2.5% bootstrap quantile of E[V(N)].</param>
/// <param name="TypesHi">97.5% bootstrap quantile.</param>
/// <param name="TypesSd">Sampling standard deviation of V(N) given the model, √(E[V(2N)] − E[V(N)]) (Baayen 2001,
/// §3.3): the spread of a real sample about the expectation, not the uncertainty of the model.</param>
/// <param name="TypesExact">Within the sample: the exact hypergeometric expectation of V for a random sub-sample of N
/// tokens, computed from the spectrum without any model (NaN beyond the sample).</param>
/// <param name="Hapax">E[V_1(N)].</param>
/// <param name="HapaxLo">2.5% bootstrap quantile of E[V_1(N)].</param>
/// <param name="HapaxHi">97.5% bootstrap quantile.</param>
/// <param name="Dis">E[V_2(N)].</param>
/// <param name="CoverageTypes">Expected vocabulary (most frequent types first) covering the coverage share of the
/// N tokens.</param>
/// <param name="CoverageLo">2.5% bootstrap quantile.</param>
/// <param name="CoverageHi">97.5% bootstrap quantile.</param>
/// <param name="TypesModelsMin">Smallest E[V(N)] among all fitted models: the finite models (fZM, GIGP) level off
/// towards their population vocabulary and tend to forecast too few types.</param>
/// <param name="TypesModelsMax">Largest E[V(N)] among all fitted models: the Zipf–Mandelbrot model, with infinitely
/// many types, tends to forecast too many. On held-out real text the truth lay between the two.</param>
/// <param name="HapaxModelsMin">Smallest E[V_1(N)] among all fitted models.</param>
/// <param name="HapaxModelsMax">Largest E[V_1(N)] among all fitted models: the spread between models, which says more
/// about the uncertainty of a hapax forecast than the chosen model's bootstrap interval does.</param>
public sealed record ForecastPoint(double Tokens, string Region, double Types, double TypesLo, double TypesHi, double TypesSd,
    double TypesExact, double Hapax, double HapaxLo, double HapaxHi, double Dis, double CoverageTypes, double CoverageLo,
    double CoverageHi, double TypesModelsMin, double TypesModelsMax, double HapaxModelsMin, double HapaxModelsMax);
