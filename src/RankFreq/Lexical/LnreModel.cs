namespace RankFreq.Lexical;

/// <summary>
/// A large-number-of-rare-events (LNRE) model: a type density g(π) over type probabilities π, normalised so that
/// ∫ π g(π) dπ = 1, sampled as a Poisson process (Baayen 2001, "Word Frequency Distributions", ch. 2–3). Under that
/// sampling, a type of probability π appears Poisson(Nπ) times in N tokens, so
/// E[V(N)] = ∫ (1 − e^(−Nπ)) g(π) dπ and E[V_m(N)] = ∫ (Nπ)^m e^(−Nπ)/m! g(π) dπ.
/// </summary>
public abstract record LnreModel
{
    /// <summary>Short name: "zm", "fzm", "gigp".</summary>
    public abstract string Name { get; }

    /// <summary>The model's parameters by name.</summary>
    public abstract IReadOnlyDictionary<string, double> Parameters { get; }

    /// <summary>Population vocabulary S = ∫ g(π) dπ (infinite for the plain Zipf–Mandelbrot model).</summary>
    public abstract double PopulationTypes { get; }

    /// <summary>Number of free parameters (counted for the degrees of freedom of the goodness-of-fit test).</summary>
    public abstract int ParameterCount { get; }

    /// <summary>E[V(N)], expected number of types in N tokens.</summary>
    public abstract double ExpectedTypes(double n);

    /// <summary>E[V_m(N)] for m = 0..<paramref name="maxM"/> (index m; element 0 is E[V_0(N)], the unseen types,
    /// which is infinite for the plain Zipf–Mandelbrot model).</summary>
    public abstract double[] ExpectedSpectrum(double n, int maxM);

    /// <summary>ln g(π), the log type density (for quadrature and plots).</summary>
    public abstract double LogDensity(double p);

    /// <summary>The range of π outside which g(π)·π² is negligible, for quadrature on ln π.</summary>
    public abstract (double Lo, double Hi) Support { get; }

    /// <summary>
    /// Types needed to cover a share q of the population's token mass: the number of most probable types whose
    /// probabilities add up to q, ∫_ρ g(π) dπ with ∫_ρ π g(π) dπ = q. This is the N → ∞ limit of
    /// <see cref="CoverageTypes"/>. The default integrates g on a grid of 4,000 points in ln π (trapezoid rule).
    /// </summary>
    public virtual double PopulationCoverageTypes(double q)
    {
        var (lo, hi) = Support;
        const int n = 4000;
        double a = Math.Log(lo), h = (Math.Log(hi) - a) / (n - 1);
        var mass = new double[n];
        var types = new double[n];
        for (int i = 0; i < n; i++)
        {
            double lp = a + i * h, g = LogDensity(Math.Exp(lp));
            types[i] = Math.Exp(g + lp);       // g(π) dπ = g π d ln π
            mass[i] = Math.Exp(g + 2 * lp);    // π g(π) dπ
        }
        double totalMass = 0;
        for (int i = 1; i < n; i++) totalMass += 0.5 * h * (mass[i] + mass[i - 1]);
        // walk down from the most probable types until their mass reaches q of the total
        double cm = 0, ct = 0;
        for (int i = n - 1; i > 0; i--)
        {
            double dm = 0.5 * h * (mass[i] + mass[i - 1]), dt = 0.5 * h * (types[i] + types[i - 1]);
            if (cm + dm >= q * totalMass) return ct + dt * (q * totalMass - cm) / dm;
            cm += dm; ct += dt;
        }
        return ct;
    }

    /// <summary>
    /// Expected vocabulary of a sample of N tokens needed to cover a share q of its tokens: the sample's types are
    /// taken from the most frequent down, so the (1 − q)·N tokens left out are those of the rarest frequency classes.
    /// Computed from the expected spectrum E[V_m(N)], m = 1, 2, …, leaving out whole classes and a fraction of the
    /// last one; when the classes left out run beyond m = 65,536 the population value
    /// <see cref="PopulationCoverageTypes"/> is used (the two agree there to well under 1%).
    /// </summary>
    public double CoverageTypes(double q, double n)
    {
        double ev = ExpectedTypes(n), budget = (1 - q) * n;
        foreach (int maxM in new[] { 16, 256, 4096, 65536 })
        {
            var e = ExpectedSpectrum(n, maxM);
            double cumTokens = 0, cumTypes = 0;
            for (int m = 1; m <= maxM; m++)
            {
                double tok = m * e[m];
                if (cumTokens + tok >= budget)
                    return Math.Max(0, ev - cumTypes - (tok > 0 ? e[m] * (budget - cumTokens) / tok : 0));
                cumTokens += tok; cumTypes += e[m];
            }
        }
        return Math.Min(ev, PopulationCoverageTypes(q));
    }

    /// <summary>
    /// Covariance of (V, V_1, …, V_k) at N under Poisson sampling (Baayen 2001, §3.3; derived from the
    /// independence of the per-type Poisson counts): var V = E[V(2N)] − E[V(N)];
    /// cov(V, V_m) = E[V_m(2N)]/2^m; var V_m = E[V_m(N)] − C(2m, m) E[V_2m(2N)]/4^m;
    /// cov(V_m, V_n) = −C(m+n, m) E[V_(m+n)(2N)]/2^(m+n).
    /// </summary>
    public double[,] SpectrumCovariance(double n, int k)
    {
        var e = ExpectedSpectrum(n, k);
        var e2 = ExpectedSpectrum(2 * n, 2 * k);
        var c = new double[k + 1, k + 1];
        c[0, 0] = ExpectedTypes(2 * n) - ExpectedTypes(n);
        for (int m = 1; m <= k; m++)
        {
            c[0, m] = c[m, 0] = e2[m] * Math.Pow(2, -m);
            for (int j = m; j <= k; j++)
            {
                double w = Math.Exp(LogChoose(m + j, m) - (m + j) * Math.Log(2)) * e2[m + j];
                c[m, j] = c[j, m] = m == j ? e[m] - w : -w;
            }
        }
        return c;
    }

    internal static double LogChoose(int n, int k) =>
        MathNet.Numerics.SpecialFunctions.FactorialLn(n) - MathNet.Numerics.SpecialFunctions.FactorialLn(k)
        - MathNet.Numerics.SpecialFunctions.FactorialLn(n - k);
}
