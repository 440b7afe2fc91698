namespace RankFreq.Fitting;

/// <summary>
/// Curves of a fitted discrete power law for plotting, computed where the model lives so that plots only draw.
/// Points are spaced evenly in log10 x (every 0.02 decades) from xmin to <c>top</c>, x rounded to integers.
/// </summary>
public static class TailModelCurves
{
    /// <summary>
    /// Rank of the type at frequency x in the fitted tail, n_tail · ζ(α, x)/ζ(α, xmin) (the expected number of tail
    /// types at least as frequent), for x from xmin up to <paramref name="top"/>; stops where the rank falls below 1.
    /// </summary>
    public static (double[] Rank, double[] Frequency) Rank(PowerLawFit fit, long top)
    {
        var rank = new List<double>();
        var freq = new List<double>();
        double z0 = HurwitzZeta.Value(fit.Alpha, fit.Xmin);
        foreach (double x in Grid(fit.Xmin, top))
        {
            double r = fit.NTail * HurwitzZeta.Value(fit.Alpha, x) / z0;
            if (r < 1) break;
            rank.Add(r);
            freq.Add(x);
        }
        return (rank.ToArray(), freq.ToArray());
    }

    /// <summary>
    /// P(X ≥ x) over all types: <paramref name="tailShare"/> · ζ(α, x)/ζ(α, xmin), where the tail share is
    /// n_tail / n_types, for x from xmin up to <paramref name="top"/>.
    /// </summary>
    public static (double[] X, double[] Share) Ccdf(PowerLawFit fit, double tailShare, long top)
    {
        double z0 = HurwitzZeta.Value(fit.Alpha, fit.Xmin);
        var xs = Grid(fit.Xmin, top).ToArray();
        return (xs, xs.Select(x => tailShare * HurwitzZeta.Value(fit.Alpha, x) / z0).ToArray());
    }

    /// <summary>
    /// Expected number of types seen exactly x times under the fitted tail, n_tail · x^−α / ζ(α, xmin) (the tail size
    /// times the model's probability of x), for x from xmin up to <paramref name="top"/>; stops once the expectation
    /// falls below <paramref name="floor"/> types (0: never).
    /// </summary>
    /// <remarks>Summed over every integer x ≥ xmin the expectations add up to n_tail (tested to 1e-9 relative).</remarks>
    public static (double[] X, double[] Types) Spectrum(PowerLawFit fit, long top, double floor = 0)
    {
        var xs = new List<double>();
        var types = new List<double>();
        double z0 = HurwitzZeta.Value(fit.Alpha, fit.Xmin);
        foreach (double x in Grid(fit.Xmin, top))
        {
            double e = fit.NTail * Math.Pow(x, -fit.Alpha) / z0;
            if (e < floor) break;
            xs.Add(x);
            types.Add(e);
        }
        return (xs.ToArray(), types.ToArray());
    }

    private static IEnumerable<double> Grid(long xmin, long top)
    {
        double last = double.NaN;
        for (double lx = Math.Log10(xmin); lx <= Math.Log10(Math.Max(xmin, top)) + 1e-9; lx += 0.02)
        {
            double x = Math.Round(Math.Pow(10, lx));
            if (x == last) continue;
            last = x;
            yield return x;
        }
    }
}
