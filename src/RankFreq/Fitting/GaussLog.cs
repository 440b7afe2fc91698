using MathNet.Numerics;

namespace RankFreq.Fitting;

/// <summary>Logarithms of standard normal tail probabilities and of their differences, finite for any z.</summary>
/// <remarks>
/// Q(z) = 1 − Φ(z) = ½ erfc(z/√2). For x = z/√2 ≥ 15, ln erfc(x) = −x² − ln √π + ln K(x) with Lentz's evaluation of the
/// continued fraction √π e^{x²} erfc(x) = 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + …)))) (NIST DLMF 7.9.2), which never
/// underflows (and converges in a few dozen terms there); below 15 erfc itself (≥ 7e-100) is representable to full
/// relative precision. ln(Φ(b) − Φ(a)) is taken from the
/// side where both tails are small (ln Q(a) + ln(1 − e^{ln Q(b) − ln Q(a)}), by symmetry for b ≤ 0), and for a narrow
/// interval (h = b − a with h·max(1, |m|) &lt; 0.02, m the midpoint) from the Taylor expansion of ∫φ around m:
/// φ(m)·h·(1 + (m² − 1)h²/24 + (m⁴ − 6m² + 3)h⁴/1920). Tested against mpmath (50 digits) for z up to ±60
/// (tests/RankFreq.Tests/Fitting/GaussLogTests.cs): relative error of the logarithm ≤ 1e-13.
/// </remarks>
internal static class GaussLog
{
    private static readonly double LnSqrtPi = 0.5 * Math.Log(Math.PI);
    private static readonly double LnSqrt2Pi = 0.5 * Math.Log(2 * Math.PI);

    /// <summary>ln erfc(x) for x ≥ 0.</summary>
    public static double LogErfc(double x)
    {
        if (x < 15) return Math.Log(SpecialFunctions.Erfc(x));
        // modified Lentz on 1/(x + a1/(x + a2/(x + …))), a_k = k/2
        const double tiny = 1e-300;
        double f = x, c = x, d = 0;
        for (int k = 1; k < 500; k++)
        {
            double a = 0.5 * k;
            d = x + a * d; if (d == 0) d = tiny; d = 1 / d;
            c = x + a / c; if (c == 0) c = tiny;
            double delta = c * d;
            f *= delta;
            if (Math.Abs(delta - 1) < 1e-16) break;
        }
        return -x * x - LnSqrtPi - Math.Log(f);
    }

    /// <summary>ln Q(z) = ln(1 − Φ(z)).</summary>
    public static double LogQ(double z) =>
        z >= 0 ? -Math.Log(2) + LogErfc(z / Math.Sqrt(2)) : LogMath.Log1p(-0.5 * SpecialFunctions.Erfc(-z / Math.Sqrt(2)));

    /// <summary>ln(Φ(b) − Φ(a)) for a &lt; b (−∞ when the interval is empty).</summary>
    public static double LogDiff(double a, double b)
    {
        if (!(b > a)) return double.NegativeInfinity;
        double h = b - a, m = 0.5 * (a + b);
        if (h * Math.Max(1, Math.Abs(m)) < 0.02)
        {
            double m2 = m * m, h2 = h * h;
            return -0.5 * m2 - LnSqrt2Pi + Math.Log(h) + LogMath.Log1p((m2 - 1) * h2 / 24 + (m2 * m2 - 6 * m2 + 3) * h2 * h2 / 1920);
        }
        if (a >= 0) return LogMinus(LogQ(a), LogQ(b));
        if (b <= 0) return LogMinus(LogQ(-b), LogQ(-a));
        // a < 0 < b: both tails at most ½
        return LogMath.Log1p(-(Math.Exp(LogQ(b)) + Math.Exp(LogQ(-a))));
    }

    /// <summary>ln(e^x − e^y) for x ≥ y.</summary>
    private static double LogMinus(double x, double y) => x + Math.Log(-LogMath.Expm1(y - x));
}
