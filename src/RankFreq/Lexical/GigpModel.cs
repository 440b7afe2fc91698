using MathNet.Numerics;
using RankFreq.Fitting;

namespace RankFreq.Lexical;

/// <summary>
/// The generalized inverse Gauss–Poisson LNRE model (Sichel 1975, JASA 70:542–547; Baayen 2001, "Word Frequency
/// Distributions", §3.2): type density g(π) = Z π^(γ−1) exp(−π/c − b²c/(4π)), a generalized inverse Gaussian in π,
/// with Z = 1/(2 (bc/2)^(γ+1) K_(γ+1)(b)) from ∫ π g = 1 and population vocabulary S = 2 K_γ(b)/(bc K_(γ+1)(b)).
/// </summary>
/// <remarks>
/// From ∫_0^∞ π^(λ−1) exp(−pπ − q/π) dπ = 2 (q/p)^(λ/2) K_λ(2√(pq)) with p = 1/c + N, q = b²c/4, writing
/// x = b√(1 + Nc):
/// E[V(N)] = S [1 − (1 + Nc)^(−γ/2) K_γ(x)/K_γ(b)];
/// E[V_m(N)] = (2/(bc)) (bcN/2)^m/m! (1 + Nc)^(−(m+γ)/2) K_(m+γ)(x)/K_(γ+1)(b).
/// The spectrum is computed by the ratio t_ν = K_(ν+1)(x)/K_ν(x), t_ν = 1/t_(ν−1) + 2ν/x (the upward recurrence
/// K_(ν+1) = K_(ν−1) + (2ν/x) K_ν, stable upwards), so E[V_m] = E[V_(m−1)] · (bcN/2)/(m √(1+Nc)) · t_(m−1+γ).
/// K_ν of real order comes from MathNet.Numerics 5.0.0 (<c>SpecialFunctions.BesselKScaled</c>, e^x K_ν(x), an
/// Amos-algorithm port), with K_(−ν) = K_ν; tested against mpmath 1.3.0 <c>besselk</c> to 1e-12 relative, and the
/// model against direct quadrature of the LNRE integrals (tests/RankFreq.Tests/Data/lnre_reference.py). For
/// γ = −1/2 (Sichel's inverse Gauss–Poisson) K_(1/2)(x) = √(π/(2x)) e^(−x) gives E[V(N)] = S (1 − e^(−b(√(1+Nc) − 1))).
/// </remarks>
/// <param name="Gamma">γ (words: usually between −1 and 0).</param>
/// <param name="B">b &gt; 0.</param>
/// <param name="C">c &gt; 0.</param>
public sealed record GigpModel(double Gamma, double B, double C) : LnreModel
{
    /// <summary>ln K_ν(x) for real ν, x &gt; 0.</summary>
    public static double LogBesselK(double nu, double x) =>
        Math.Log(SpecialFunctions.BesselKScaled(Math.Abs(nu), x)) - x;

    /// <inheritdoc/>
    public override string Name => "gigp";

    /// <inheritdoc/>
    public override IReadOnlyDictionary<string, double> Parameters =>
        new Dictionary<string, double> { ["gamma"] = Gamma, ["b"] = B, ["c"] = C, ["S"] = PopulationTypes };

    /// <inheritdoc/>
    public override int ParameterCount => 3;

    /// <inheritdoc/>
    public override double PopulationTypes => 2 / (B * C) * Math.Exp(LogBesselK(Gamma, B) - LogBesselK(Gamma + 1, B));

    /// <inheritdoc/>
    public override double ExpectedTypes(double n)
    {
        double u = 1 + n * C, x = B * Math.Sqrt(u);
        double lnRatio = -Gamma / 2 * Math.Log(u) + LogBesselK(Gamma, x) - LogBesselK(Gamma, B);
        return PopulationTypes * -LogMath.Expm1(lnRatio);
    }

    /// <inheritdoc/>
    public override double[] ExpectedSpectrum(double n, int maxM)
    {
        var e = new double[maxM + 1];
        double u = 1 + n * C, x = B * Math.Sqrt(u);
        double lnKg = LogBesselK(Gamma, x), lnKg1 = LogBesselK(Gamma + 1, x);
        double ln0 = Math.Log(2 / (B * C)) - Gamma / 2 * Math.Log(u) + lnKg - LogBesselK(Gamma + 1, B);
        e[0] = Math.Exp(ln0);
        double lnW = Math.Log(B * C * n / 2) - 0.5 * Math.Log(u);
        double t = Math.Exp(lnKg1 - lnKg); // t_γ
        double ln = ln0;
        for (int m = 1; m <= maxM; m++)
        {
            double nu = m - 1 + Gamma;
            if (m > 1) t = 1 / t + 2 * nu / x;
            ln += lnW - Math.Log(m) + Math.Log(t);
            e[m] = Math.Exp(ln);
        }
        return e;
    }

    /// <inheritdoc/>
    public override double LogDensity(double p) =>
        -Math.Log(2) - (Gamma + 1) * Math.Log(B * C / 2) - LogBesselK(Gamma + 1, B)
        + (Gamma - 1) * Math.Log(p) - p / C - B * B * C / (4 * p);

    /// <inheritdoc/>
    public override (double Lo, double Hi) Support => (B * B * C / 2800, Math.Min(1, 800 * C));
}
