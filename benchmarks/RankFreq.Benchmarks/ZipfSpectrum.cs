using System.Globalization;
using MathNet.Numerics;
using RankFreq.Fitting;

/// <summary>
/// Seeded Zipf-like frequency spectra for the fitting benchmarks, written as "value,types" lines that `rankfreq fit`
/// reads. Type r has an expected count λ_r = (N/ζ(s)) r^−s (rank exponent s, N tokens, an unbounded vocabulary).
/// Types with λ_r ≥ L are drawn one by one (count ≈ λ_r + √λ_r·normal, rounded); below L the number of types with
/// count x is Poisson with mean E_x = ∫ Pois(x; λ) |dr/dλ| dλ over λ &lt; L, which in closed form is
/// (1/s)(N/ζ(s))^{1/s} Γ(x − 1/s) P(x − 1/s, L) / x!  (P the regularised lower incomplete gamma function).
/// The "flat" mode is a pathological spectrum: every value 1..K present, multiplicity 1 + Poisson(20·x^−0.3).
/// </summary>
internal static class ZipfSpectrum
{
    public static void Run(string[] args)
    {
        // zipf-spectrum TOKENS FILE [s=1.07] [seed=1]   or   flat-spectrum K FILE [seed=1]
        var rng = new Xoshiro(args.Length > 4 ? ulong.Parse(args[4]) : 1, 7, 0);
        var spec = new SortedDictionary<long, long>();
        if (args[0] == "flat-spectrum")
        {
            long k = long.Parse(args[1], NumberStyles.Float);
            for (long x = 1; x <= k; x++) spec[x] = 1 + Poisson(rng, 20 * Math.Pow(x, -0.3));
        }
        else
        {
            double n = double.Parse(args[1], CultureInfo.InvariantCulture);
            double s = args.Length > 3 ? double.Parse(args[3], CultureInfo.InvariantCulture) : 1.07;
            const double L = 1000;
            double scale = n / HurwitzZeta.Value(s, 1);
            long rMax = (long)Math.Floor(Math.Pow(scale / L, 1 / s));
            for (long r = 1; r <= rMax; r++)
            {
                double lambda = scale * Math.Pow(r, -s);
                long c = (long)Math.Round(lambda + Math.Sqrt(lambda) * rng.NextNormal());
                if (c >= 1) spec[c] = spec.GetValueOrDefault(c) + 1;
            }
            double front = Math.Pow(scale, 1 / s) / s;
            for (long x = 1; x <= 3 * (long)L; x++)
            {
                double a = x - 1 / s;
                double lnE = Math.Log(front) + SpecialFunctions.GammaLn(a) + Math.Log(SpecialFunctions.GammaLowerRegularized(a, L))
                    - SpecialFunctions.GammaLn(x + 1);
                long t = Poisson(rng, Math.Exp(lnE));
                if (t > 0) spec[x] = spec.GetValueOrDefault(x) + t;
            }
        }
        long types = 0, tokens = 0;
        using (var w = new StreamWriter(args[2]))
            foreach (var (v, t) in spec) { w.WriteLine($"{v},{t}"); types += t; tokens += v * t; }
        Console.WriteLine($"{args[2]}: {spec.Count:N0} distinct values, {types:N0} types, {tokens:N0} tokens");
    }

    private static long Poisson(Xoshiro rng, double mean)
    {
        if (mean > 50) return Math.Max(0, (long)Math.Round(mean + Math.Sqrt(mean) * rng.NextNormal()));
        double l = Math.Exp(-mean), p = 1;
        long k = -1;
        do { k++; p *= rng.NextDouble(); } while (p > l);
        return k;
    }
}
