namespace RankFreq.Fitting;

/// <summary>
/// Hurwitz zeta ζ(s, q) = Σ_{k≥0} (q + k)^−s for s &gt; 1, q &gt; 0, and its first two derivatives in s.
/// </summary>
/// <remarks>
/// Euler–Maclaurin summation (NIST DLMF §2.10 and §25.11): N direct terms bring the argument to a = q + N ≥ 12, then
/// ζ(s, q) = Σ_{k&lt;N} (q+k)^−s + a^{1−s}/(s−1) + a^−s/2 + Σ_{j=1}^{12} B_{2j}/(2j)! · s(s+1)…(s+2j−2) · a^{−s−2j+1};
/// derivatives in s are taken term by term. Tested against 50-digit mpmath values for s ∈ [1.05, 6], q ∈ [1, 10^6]
/// (tests/RankFreq.Tests/Data/hurwitz-mpmath.csv): relative error ≤ 1e-12 for ζ and ∂ζ/∂s. <see cref="Log"/> runs the same
/// sums scaled by q^s, so ln ζ stays finite where ζ underflows (q = 10^12 with s near 30); it is checked against the
/// unscaled sums where both are finite and, through the fits, on counts near 10^12 (Fitting/FitEdgeTests.cs).
/// </remarks>
public static class HurwitzZeta
{
    private const double MinA = 12;
    // B_{2j} / (2j)! for j = 1..12
    private static readonly double[] BernoulliOverFactorial =
    [
        1.0 / 6 / 2,
        -1.0 / 30 / 24,
        1.0 / 42 / 720,
        -1.0 / 30 / 40320,
        5.0 / 66 / 3628800,
        -691.0 / 2730 / 479001600,
        7.0 / 6 / 87178291200,
        -3617.0 / 510 / 20922789888000,
        43867.0 / 798 / 6402373705728000,
        -174611.0 / 330 / 2432902008176640000,
        854513.0 / 138 / 1124000727777607680000.0,
        -236364091.0 / 2730 / 620448401733239439360000.0,
    ];

    /// <summary>ζ(s, q).</summary>
    public static double Value(double s, double q) => Evaluate(s, q, derivatives: false).Value;

    /// <summary>ζ(s, q), ∂ζ/∂s and ∂²ζ/∂s² (the derivatives are 0 unless requested).</summary>
    public static ZetaValue Evaluate(double s, double q, bool derivatives = true) => Core(s, q, derivatives, 0);

    /// <summary>ln ζ(s, q) alone: finite where ζ itself underflows (q = 10^12, s = 30 gives ζ ≈ 10^−350).</summary>
    public static double LogValue(double s, double q) => Log(s, q, derivatives: false).Ln;

    /// <summary>
    /// ln ζ(s, q) with the ratios ζ'/ζ and ζ''/ζ. Every term is computed relative to q^−s (the sums are ζ·q^s, which
    /// lies between 1 and about 1 + q/(s−1)), so nothing underflows for any s &gt; 1 and q ≤ 2^62.
    /// </summary>
    public static LogZeta Log(double s, double q, bool derivatives = true) => LogAt(s, q, Math.Log(q), derivatives);

    /// <summary><see cref="Log(double, double, bool)"/> given ln q (= Math.Log(q), so the result is the same to the
    /// bit); where q ≥ 12 the scaled leading power is exactly 1 and is not recomputed.</summary>
    internal static LogZeta LogAt(double s, double q, double lnQ, bool derivatives) =>
        FromScaled(ScaledAt(s, q, lnQ, derivatives), s * lnQ);

    /// <summary>The sums of <see cref="LogAt"/> before their logarithm: ζ·q^s and its derivatives scaled alike (a
    /// caller that may not need ln ζ skips the logarithm; <see cref="FromScaled"/> then gives LogAt's values to the bit).</summary>
    internal static ZetaValue ScaledAt(double s, double q, double lnQ, bool derivatives) => Core(s, q, derivatives, s * lnQ, lnQ);

    /// <summary>ln ζ and the ratios from <see cref="ScaledAt"/>'s sums, shift = s·ln q.</summary>
    internal static LogZeta FromScaled(ZetaValue z, double shift) => new(Math.Log(z.Value) - shift, z.D1 / z.Value, z.D2 / z.Value);

    /// <summary>
    /// The sums of <see cref="ScaledAt"/> with both derivatives for q ≥ 12 (no direct terms), in fewer divisions: one
    /// reciprocal per Bernoulli step for both Pochhammer factors, squares for the second-derivative sum, and the series
    /// cut once a term is below 1e-16 of the sum. Not the same bits as <see cref="ScaledAt"/> (within a few 1e-16
    /// relative, tested in HurwitzZetaTests over s ∈ [1.01, 30], q ∈ [12, 10^12]); for bounds that carry a margin, such
    /// as the xmin search's screen, never for the fitted α.
    /// </summary>
    internal static ZetaValue ScaledQuick(double s, double q, double lnQ) => ScaledQuick(s, q, lnQ, 1 / (s - 1));

    /// <summary><see cref="ScaledQuick(double, double, double)"/> given <paramref name="inv"/> = 1/(s − 1).</summary>
    internal static ZetaValue ScaledQuick(double s, double q, double lnQ, double inv)
    {
        double integral = q * inv;                // q^(1−s)/(s−1), scaled by q^s
        double z = integral + 0.5;
        double dl = -lnQ - inv;
        double d1 = integral * dl - 0.5 * lnQ;
        double d2 = integral * (dl * dl + inv * inv) + 0.5 * lnQ * lnQ;
        double invQ = 1 / q;
        double inva2 = invQ * invQ;
        double poch = s, pw = invQ;               // s (s+1) … (s+2j−2) and q^(−2j+1), scaled
        double h1 = 1 / s;
        double h2 = h1 * h1;
        for (int j = 1; j <= BernoulliOverFactorial.Length; j++)
        {
            double term = BernoulliOverFactorial[j - 1] * poch * pw;
            z += term;
            double g = h1 - lnQ;
            d1 += term * g;
            d2 += term * (g * g - h2);
            if (Math.Abs(term) < 1e-16 * z) break;
            double x1 = s + 2 * j - 1, x2 = s + 2 * j;
            double p = x1 * x2, r = 1 / p, r1 = x2 * r, r2 = x1 * r;
            poch *= p;
            h1 += r1 + r2;
            h2 += r1 * r1 + r2 * r2;
            pw *= inva2;
        }
        return new ZetaValue(z, d1, d2);
    }

    // Sums scaled by e^shift (every power a^−s taken as e^(shift − s ln a)); shift = 0 gives ζ itself.
    private static ZetaValue Core(double s, double q, bool derivatives, double shift, double lnQ = double.NaN)
    {
        if (!(s > 1)) throw new ArgumentOutOfRangeException(nameof(s), s, "Hurwitz zeta needs s > 1");
        if (!(q > 0)) throw new ArgumentOutOfRangeException(nameof(q), q, "Hurwitz zeta needs q > 0");
        double z = 0, d1 = 0, d2 = 0;
        double a = q;
        while (a < MinA)
        {
            double t = shift == 0 ? Math.Pow(a, -s) : Math.Exp(shift - s * Math.Log(a));
            z += t;
            if (derivatives)
            {
                double l = Math.Log(a);
                d1 -= l * t;
                d2 += l * l * t;
            }
            a += 1;
        }
        bool atQ = a == q && !double.IsNaN(lnQ);  // then shift − s·ln a is exactly 0
        double la = atQ ? lnQ : Math.Log(a);
        double apow = atQ ? 1 : Math.Exp(shift - s * la);   // a^-s (scaled)
        double integral = apow * a / (s - 1);     // a^(1-s)/(s-1)
        double half = 0.5 * apow;
        z += integral + half;
        if (derivatives)
        {
            double dl = -la - 1 / (s - 1);
            d1 += integral * dl - la * half;
            d2 += integral * (dl * dl + 1 / ((s - 1) * (s - 1))) + la * la * half;
        }
        double poch = s;                // s (s+1) ... (s+2j-2)
        double pw = apow / a;           // a^(-s-2j+1)
        double h1 = 1 / s, h2 = 1 / (s * s);
        double inva2 = 1 / (a * a);
        for (int j = 1; j <= BernoulliOverFactorial.Length; j++)
        {
            double term = BernoulliOverFactorial[j - 1] * poch * pw;
            z += term;
            if (derivatives)
            {
                double g = h1 - la;
                d1 += term * g;
                d2 += term * (g * g - h2);
            }
            double x1 = s + 2 * j - 1, x2 = s + 2 * j;
            poch *= x1 * x2;
            h1 += 1 / x1 + 1 / x2;
            h2 += 1 / (x1 * x1) + 1 / (x2 * x2);
            pw *= inva2;
            if (Math.Abs(term) < 1e-17 * z) break;
        }
        return new ZetaValue(z, d1, d2);
    }
}
