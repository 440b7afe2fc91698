namespace RankFreq.Fitting;

/// <summary>
/// Binomial(n, p) variates in constant expected time: inversion for small means, Hörmann's transformed rejection
/// with squeeze (BTRS) otherwise. Used by the bootstraps' spectrum samplers (<see cref="Synthetic"/>), where one
/// replicate draws one binomial per frequency cell.
/// </summary>
/// <remarks>
/// With q = min(p, 1 − p) (a draw for 1 − p is reflected, n − k):
/// <list type="bullet">
/// <item>n·q &lt; 10: inversion by the pmf recursion f(k+1) = f(k)·((n+1)s/(k+1) − s), s = q/(1 − q), from
/// f(0) = (1 − q)^n = exp(n·ln(1 − q)) (Devroye 1986, "Non-Uniform Random Variate Generation", §X.4); expected cost
/// 1 + n·q steps. The rounding of the running sum (~1e-15) is the only departure from the exact law.</item>
/// <item>n·q ≥ 10: BTRS (W. Hörmann 1993, "The generation of binomial random variates", J. Statist. Comput. Simul.
/// 46:101–110): a transformed-rejection hat with the constants of the paper (b = 1.15 + 2.53σ, a = −0.0873 +
/// 0.0248b + 0.01q, α = (2.83 + 5.1/b)σ, squeeze v ≤ 0.92 − 4.2/b for |u| ≤ 0.43), accepting k against the exact
/// ratio f(k)/f(m) at the mode m = ⌊(n+1)q⌋. ln k! enters through Stirling's remainder f_c(k) = ln k! − ln√(2π) −
/// (k+½)ln(k+1) + (k+1), tabulated from ln Γ for k &lt; 16 and summed from its series (four terms, error
/// &lt; 1e-14) above; about 1.2 uniform pairs per variate.</item>
/// </list>
/// Checked against the exact binomial pmf by χ² tests (tests/RankFreq.Tests/Fitting/SpectrumSamplerTests.cs).
/// </remarks>
public static class BinomialSampler
{
    private static readonly double[] Fc = BuildFc();

    private static double[] BuildFc()
    {
        var t = new double[16];
        for (int k = 0; k < t.Length; k++)
            t[k] = MathNet.Numerics.SpecialFunctions.GammaLn(k + 1) - 0.5 * Math.Log(2 * Math.PI) - (k + 0.5) * Math.Log(k + 1) + (k + 1);
        return t;
    }

    /// <summary>Stirling's remainder f_c(k) = ln k! − [ln√(2π) + (k+½) ln(k+1) − (k+1)].</summary>
    private static double StirlingTail(double k)
    {
        if (k < Fc.Length) return Fc[(int)k];
        double x = k + 1, x2 = 1 / (x * x);
        // 1/(12x) − 1/(360x³) + 1/(1260x⁵) − 1/(1680x⁷)
        return (1.0 / 12 - x2 * (1.0 / 360 - x2 * (1.0 / 1260 - x2 / 1680))) / x;
    }

    /// <summary>One Binomial(<paramref name="n"/>, <paramref name="p"/>) variate.</summary>
    public static long Draw(Xoshiro rng, long n, double p)
    {
        if (n <= 0 || !(p > 0)) return 0;
        if (p >= 1) return n;
        if (p > 0.5) return n - Draw(rng, n, 1 - p);
        return n * p < 10 ? Inversion(rng, n, p) : Btrs(rng, n, p);
    }

    /// <summary><see cref="Draw(Xoshiro, long, double)"/> for a probability given with its ln(1 − p) =
    /// LogMath.Log1p(−p) and odds p/(1 − p), as a table of cells holds them: the same variate to the bit, one logarithm and one division fewer.</summary>
    internal static long Draw(Xoshiro rng, long n, double p, double log1mP, double odds)
    {
        if (n <= 0 || !(p > 0) || p > 0.5) return Draw(rng, n, p);
        return n * p < 10 ? Inversion(rng, n, odds, log1mP) : Btrs(rng, n, p);
    }

    private static long Inversion(Xoshiro rng, long n, double p) => Inversion(rng, n, p / (1 - p), LogMath.Log1p(-p));

    private static long Inversion(Xoshiro rng, long n, double s, double log1mP)
    {
        double a = (n + 1) * s;
        double f0 = Math.Exp(n * log1mP);
        while (true)
        {
            double u = rng.NextDouble(), f = f0;
            long k = 0;
            while (u > f)
            {
                u -= f;
                k++;
                f *= a / k - s;
                if (k > n || !(f > 0)) break;
            }
            if (k <= n && u <= f) return k;
            // only where the running sum of rounded terms fell short of u: draw again
        }
    }

    private static long Btrs(Xoshiro rng, long n, double p)
    {
        double spq = Math.Sqrt(n * p * (1 - p));
        double b = 1.15 + 2.53 * spq;
        double a = -0.0873 + 0.0248 * b + 0.01 * p;
        double c = n * p + 0.5;
        double vr = 0.92 - 4.2 / b;
        double alpha = (2.83 + 5.1 / b) * spq;
        double m = Math.Floor((n + 1) * p);
        // the constants of the exact ratio test, made at the first variate the squeeze does not accept (most draws end
        // at the squeeze; the same values whenever they are made)
        double h = double.NaN, g = double.NaN;
        while (true)
        {
            double u = rng.NextDouble() - 0.5;
            double v = rng.NextDouble();
            double us = 0.5 - Math.Abs(u);
            double k = Math.Floor((2 * a / us + b) * u + c);
            if (k < 0 || k > n) continue;
            if (us >= 0.07 && v <= vr) return (long)k;
            if (double.IsNaN(h))
            {
                h = StirlingTail(m) + StirlingTail(n - m);
                g = Math.Log(p / (1 - p) * ((n - m + 1) / (m + 1)));   // ~1/n: the slope of ln f at the mode
            }
            v = Math.Log(v * alpha / (a / (us * us) + b));
            // ln f(k)/f(m) for the binomial pmf f through Stirling's formula with its remainder, written with
            // d = k − m as log1p terms so that nothing of size n·ln n cancels (n reaches 10^9 and more)
            double d = k - m;
            double bound = h - StirlingTail(k) - StirlingTail(n - k) + d * g
                - (k + 0.5) * LogMath.Log1p(d / (m + 1)) - (n - k + 0.5) * LogMath.Log1p(-d / (n - m + 1));
            if (v <= bound) return (long)k;
        }
    }
}
