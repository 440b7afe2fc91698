namespace RankFreq.Fitting;

/// <summary>ln(1 + x) and e^x − 1 accurate for small x (the runtime's LogP1 and ExpM1 compute ln(1 + x) and e^x − 1 literally).</summary>
/// <remarks>
/// Goldberg's and Kahan's corrections (D. Goldberg, "What every computer scientist should know about floating-point
/// arithmetic", 1991, Theorem 4; and its expm1 analogue): with u = 1 + x rounded, ln(1 + x) = ln(u)·x/(u − 1) and
/// with u = e^x rounded, e^x − 1 = (u − 1)·x/ln(u), both to a few ulps. Checked against mpmath through the normal-tail
/// tests (Fitting/GaussLogTests.cs), whose values near z = −8 need ln(1 − 6e-16).
/// </remarks>
internal static class LogMath
{
    /// <summary>ln(1 + x), x &gt; −1.</summary>
    public static double Log1p(double x)
    {
        double u = 1 + x;
        if (u == 1) return x;
        return Math.Log(u) * x / (u - 1);
    }

    /// <summary>e^x − 1.</summary>
    public static double Expm1(double x)
    {
        if (Math.Abs(x) < 1e-5) return x + x * x / 2 + x * x * x / 6;
        double u = Math.Exp(x);
        if (u == 1) return x;
        if (u - 1 == -1) return -1;
        if (double.IsPositiveInfinity(u)) return u;
        return (u - 1) * x / Math.Log(u);
    }
}
