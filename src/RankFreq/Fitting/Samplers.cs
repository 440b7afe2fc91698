namespace RankFreq.Fitting;

/// <summary>Exact samplers used by the bootstraps (the binomial of the spectrum samplers is <see cref="BinomialSampler"/>).</summary>
public static class Samplers
{
    /// <summary>Gamma(shape, 1) by Marsaglia &amp; Tsang (2000), with the shape &lt; 1 boost.</summary>
    public static double Gamma(Xoshiro rng, double shape)
    {
        if (shape < 1) return Gamma(rng, shape + 1) * Math.Pow(rng.NextOpen(), 1 / shape);
        double d = shape - 1.0 / 3, c = 1 / Math.Sqrt(9 * d);
        while (true)
        {
            double x, v;
            do { x = rng.NextNormal(); v = 1 + c * x; } while (v <= 0);
            v = v * v * v;
            double u = rng.NextOpen();
            if (u < 1 - 0.0331 * x * x * x * x) return d * v;
            if (Math.Log(u) < 0.5 * x * x + d * (1 - v + Math.Log(v))) return d * v;
        }
    }

    /// <summary>
    /// Binomial(n, p), exactly: geometric waiting times when n·p is small; otherwise Knuth's order-statistic recursion
    /// (TAOCP vol. 2, §3.4.1): the a-th smallest of n uniforms is Beta(a, n+1−a), which splits the problem in half.
    /// The library draws with <see cref="BinomialSampler"/>; this one stays as an independent exact sampler that the
    /// tests and benchmarks use to build their data, so those data do not depend on the sampler under test.
    /// </summary>
    public static long Binomial(Xoshiro rng, long n, double p)
    {
        if (n <= 0 || p <= 0) return 0;
        if (p >= 1) return n;
        long k = 0;
        while (n > 40 && n * Math.Min(p, 1 - p) > 12)
        {
            long a = 1 + n / 2, b = n + 1 - a;
            double ga = Gamma(rng, a), gb = Gamma(rng, b);
            double x = ga / (ga + gb);
            if (x >= p) { n = a - 1; p /= x; }
            else { k += a; n = b - 1; p = (p - x) / (1 - x); }
            if (p >= 1) return k + n;
            if (p <= 0) return k;
        }
        if (p > 0.5) return k + n - Binomial(rng, n, 1 - p);
        // waiting times: gaps between successes are geometric
        // for tiny p, 1 − p rounds to 1 and its log to 0 (an endless loop of infinite gaps): LogMath keeps it.
        // Positions are doubles, so a gap far beyond n cannot overflow.
        double lq = p < 1e-6 ? LogMath.Log1p(-p) : Math.Log(1 - p);
        double pos = 0;
        while (true)
        {
            pos += Math.Floor(Math.Log(rng.NextOpen()) / lq) + 1;
            if (pos > n) return k;
            k++;
        }
    }

    /// <summary>
    /// One value of the discrete power law p(x) ∝ x^−α on x ≥ <paramref name="xmin"/>, by rejection–inversion
    /// (Hörmann &amp; Derflinger 1996, "Rejection-inversion to generate variates from monotone discrete distributions").
    /// Values are capped at 2^62 (reached only for α very close to 1).
    /// </summary>
    public static long PowerLaw(Xoshiro rng, double alpha, long xmin)
    {
        Span<long> one = stackalloc long[1];
        PowerLaw(rng, alpha, xmin, one);
        return one[0];
    }

    /// <summary>Fills <paramref name="into"/> with independent draws of <see cref="PowerLaw(Xoshiro, double, long)"/>
    /// (the same numbers as one call per draw; the constants of the hat are computed once).</summary>
    public static void PowerLaw(Xoshiro rng, double alpha, long xmin, Span<long> into)
    {
        double om = 1 - alpha; // < 0
        double H(double x) => Math.Exp(om * Math.Log(x)) / om;                 // ∫ x^-α
        double HInv(double u) => Math.Exp(Math.Log(om * u) / om);
        double h(double x) => Math.Exp(-alpha * Math.Log(x));
        double x0 = xmin;
        double hx0 = H(x0 + 0.5) - h(x0);    // upper end of u for k = xmin (H is negative, increasing to 0)
        double s = x0 + 1 - HInv(H(x0 + 1.5) - h(x0 + 1));
        for (int i = 0; i < into.Length; i++)
        {
            while (true)
            {
                double u = hx0 * rng.NextOpen();   // uniform on (hx0, 0): H(∞) = 0
                double x = HInv(u);
                double kd = Math.Floor(x + 0.5);
                if (kd < x0) kd = x0;
                if (kd > 4.6e18) kd = 4.6e18;
                if (kd - x <= s || u >= H(kd + 0.5) - h(kd)) { into[i] = (long)kd; break; }
            }
        }
    }
}
