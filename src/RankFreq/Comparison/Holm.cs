namespace RankFreq.Comparison;

/// <summary>Holm's step-down adjustment of p-values for a family of tests.</summary>
/// <remarks>
/// Holm (1979), "A simple sequentially rejective multiple test procedure", Scand. J. Statist. 6:65–70. With the m
/// p-values sorted increasingly, p₍₁₎ ≤ … ≤ p₍ₘ₎, the adjusted value is p̃₍ᵢ₎ = max_{j≤i} min(1, (m − j + 1) p₍ⱼ₎);
/// rejecting every hypothesis with p̃ ≤ level is the sequential procedure of the paper and controls the family-wise
/// error rate at that level under any dependence between the tests. NaN p-values (tests that could not be run) stay
/// NaN and do not count towards m. Exact arithmetic apart from the one multiplication per value.
/// </remarks>
public static class Holm
{
    /// <summary>Adjusted p-values, in the order given.</summary>
    public static double[] Adjust(IReadOnlyList<double> p)
    {
        var adjusted = new double[p.Count];
        Array.Fill(adjusted, double.NaN);
        var order = Enumerable.Range(0, p.Count).Where(i => !double.IsNaN(p[i])).OrderBy(i => p[i]).ThenBy(i => i).ToArray();
        int m = order.Length;
        double running = 0;
        for (int j = 0; j < m; j++)
        {
            running = Math.Max(running, Math.Min(1, (m - j) * p[order[j]]));
            adjusted[order[j]] = running;
        }
        return adjusted;
    }
}
