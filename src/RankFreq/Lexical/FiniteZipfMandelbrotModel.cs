using MathNet.Numerics;
using RankFreq.Fitting;

namespace RankFreq.Lexical;

/// <summary>
/// The finite Zipf–Mandelbrot LNRE model (Evert 2004, "A simple LNRE model for random character sequences", JADT
/// 2004): type density g(π) = C π^(−α−1) for A ≤ π ≤ B, 0 &lt; α &lt; 1, 0 &lt; A &lt; B ≤ 1, with
/// C = (1 − α)/(B^(1−α) − A^(1−α)) from ∫ π g = 1, and a finite population vocabulary S = C (A^(−α) − B^(−α))/α.
/// With A = 0 it is the plain Zipf–Mandelbrot model (<see cref="ZipfMandelbrotModel"/>), whose S is infinite.
/// </summary>
/// <remarks>
/// Formulas (substituting t = Nπ in the LNRE integrals; γ(a, x) is the lower incomplete gamma function, P its
/// regularized form; integration by parts for V):
/// E[V_m(N)] = (C N^α / m!) Γ(m − α) [P(m − α, NB) − P(m − α, NA)];
/// E[V(N)] = (C/α) { N^α Γ(1 − α) [P(1 − α, NB) − P(1 − α, NA)] + (1 − e^(−NA)) A^(−α) − (1 − e^(−NB)) B^(−α) }.
/// This form has no cancellation between S and the unseen types, so it holds for NA far below 1. Population coverage:
/// the types with π ≥ ρ hold mass C (B^(1−α) − ρ^(1−α))/(1 − α) = q and number C (ρ^(−α) − B^(−α))/α.
/// Tested against direct quadrature of the integrals with mpmath 1.3.0 (tests/RankFreq.Tests/Data/lnre_reference.py)
/// to 1e-9 relative.
/// </remarks>
/// <param name="Alpha">α, the shape (the reciprocal of the Zipf–Mandelbrot rank exponent).</param>
/// <param name="A">A, the smallest type probability.</param>
/// <param name="B">B, the largest type probability.</param>
public sealed record FiniteZipfMandelbrotModel(double Alpha, double A, double B) : LnreModel
{
    /// <inheritdoc/>
    public override string Name => "fzm";

    /// <summary>C, the density's constant.</summary>
    public double C { get; } = (1 - Alpha) / (Math.Pow(B, 1 - Alpha) - (A > 0 ? Math.Pow(A, 1 - Alpha) : 0));

    /// <inheritdoc/>
    public override IReadOnlyDictionary<string, double> Parameters =>
        new Dictionary<string, double> { ["alpha"] = Alpha, ["A"] = A, ["B"] = B, ["S"] = PopulationTypes };

    /// <inheritdoc/>
    public override int ParameterCount => 3;

    /// <inheritdoc/>
    public override double PopulationTypes =>
        A > 0 ? C * (Math.Pow(A, -Alpha) - Math.Pow(B, -Alpha)) / Alpha : double.PositiveInfinity;

    /// <inheritdoc/>
    public override double ExpectedTypes(double n)
    {
        double a = Alpha, na = n * A, nb = n * B;
        double band = Math.Exp(a * Math.Log(n) + SpecialFunctions.GammaLn(1 - a)) * IncompleteGamma.Band(1 - a, na, nb);
        double low = A > 0 ? -LogMath.Expm1(-na) * Math.Pow(A, -a) : 0;
        return C / a * (band + low + LogMath.Expm1(-nb) * Math.Pow(B, -a));
    }

    /// <inheritdoc/>
    public override double[] ExpectedSpectrum(double n, int maxM)
    {
        var e = new double[maxM + 1];
        double a = Alpha, na = n * A, nb = n * B;
        double lnCoef = Math.Log(C) + a * Math.Log(n) + SpecialFunctions.GammaLn(1 - a); // m = 1: Γ(1−α)/1!
        bool lowGone = na <= 0;
        for (int m = 1; m <= maxM; m++)
        {
            if (m > 1) lnCoef += Math.Log(m - 1 - a) - Math.Log(m);
            double s = m - a;
            double band;
            if (lowGone && nb >= s + 12 * Math.Sqrt(s) + 40) band = 1;
            else
            {
                band = IncompleteGamma.Band(s, lowGone ? 0 : na, nb);
                // once P(s, NA) is negligible below the mode it stays so for larger s
                if (!lowGone && na < s && SpecialFunctions.GammaLowerRegularized(s, na) < 1e-18) lowGone = true;
            }
            e[m] = band <= 0 ? 0 : Math.Exp(lnCoef) * band;
        }
        e[0] = A > 0 ? Math.Max(0, PopulationTypes - ExpectedTypes(n)) : double.PositiveInfinity;
        return e;
    }

    /// <inheritdoc/>
    public override double LogDensity(double p) =>
        p < A || p > B ? double.NegativeInfinity : Math.Log(C) - (Alpha + 1) * Math.Log(p);

    /// <inheritdoc/>
    public override (double Lo, double Hi) Support => (A > 0 ? A : B * 1e-30, B);

    /// <inheritdoc/>
    public override double PopulationCoverageTypes(double q)
    {
        double a = Alpha;
        double rho = Math.Pow(Math.Pow(B, 1 - a) - q * (1 - a) / C, 1 / (1 - a));
        return C * (Math.Pow(rho, -a) - Math.Pow(B, -a)) / a;
    }
}
