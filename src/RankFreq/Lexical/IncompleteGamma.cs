using MathNet.Numerics;

namespace RankFreq.Lexical;

/// <summary>Differences of the regularized incomplete gamma function, taken from the side that keeps precision.</summary>
internal static class IncompleteGamma
{
    /// <summary>
    /// P(a, x2) − P(a, x1) = ∫_x1^x2 t^(a−1) e^(−t) dt / Γ(a) for 0 ≤ x1 ≤ x2, a &gt; 0. Uses MathNet.Numerics 5.0.0's
    /// <c>GammaLowerRegularized</c>/<c>GammaUpperRegularized</c>; when x1 lies above a the difference is taken of the
    /// upper functions Q(a, x1) − Q(a, x2), which are then small and exact, instead of two numbers near 1. Saturated
    /// ends are cut: P(a, x) = 1 when x ≥ a + 12√a + 40 (Q below 10^−20 there), P(a, 0) = 0.
    /// </summary>
    public static double Band(double a, double x1, double x2)
    {
        bool top = x2 >= a + 12 * Math.Sqrt(a) + 40;
        if (x1 <= 0) return top ? 1 : SpecialFunctions.GammaLowerRegularized(a, x2);
        if (x1 > a)
            return SpecialFunctions.GammaUpperRegularized(a, x1) - (top ? 0 : SpecialFunctions.GammaUpperRegularized(a, x2));
        return (top ? 1 : SpecialFunctions.GammaLowerRegularized(a, x2)) - SpecialFunctions.GammaLowerRegularized(a, x1);
    }
}
