namespace RankFreq.Fitting;

/// <summary>The discrete power law p(x) = x^−α / ζ(α, xmin) fitted to the tail x ≥ xmin.</summary>
/// <param name="Alpha">Maximum-likelihood α.</param>
/// <param name="AlphaSe">Standard error from the observed Fisher information, 1/√(n (ζ''/ζ − (ζ'/ζ)²)).</param>
/// <param name="AlphaApprox">Closed-form approximation 1 + n / Σ ln(x / (xmin − ½)) (Clauset et al. 2009, eq. 3.7), for comparison.</param>
/// <param name="Xmin">Lower cut-off.</param>
/// <param name="NTail">Types with count ≥ xmin.</param>
/// <param name="KsDistance">Kolmogorov–Smirnov distance over every integer of the tail.</param>
/// <param name="LogLikelihood">Log-likelihood of the tail at α.</param>
/// <param name="Iterations">Newton iterations.</param>
/// <param name="Status">Whether the fit can be trusted.</param>
/// <param name="Message">What to do when it cannot.</param>
public sealed record PowerLawFit(double Alpha, double AlphaSe, double AlphaApprox, long Xmin, long NTail, double KsDistance,
    double LogLikelihood, int Iterations, FitStatus Status, string Message);
