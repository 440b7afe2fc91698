namespace RankFreq.Fitting;

/// <summary>Synthetic data generated as spectra (Clauset et al. 2009, §4.1, written over value multiplicities).</summary>
/// <remarks>
/// Exact in distribution: a multinomial draw of n points over cells with probabilities π_1, π_2, … is the sequence of
/// conditional binomials k_j ~ Binomial(n − Σ_{i&lt;j} k_i, π_j / Σ_{i≥j} π_i) (common practice; Devroye 1986,
/// "Non-Uniform Random Variate Generation", §XI.1.4). Each binomial comes from <see cref="BinomialSampler"/> (constant
/// expected time), so a replicate costs O(distinct values) at a few tens of nanoseconds per cell. Since issue 13's
/// speed round the bootstraps draw with it instead of the order-statistic recursion of <see cref="Samplers.Binomial"/>:
/// the same law, other random numbers, so p-values and intervals for a given seed differ from earlier versions.
/// </remarks>
internal static class Synthetic
{
    /// <summary>
    /// Adds <paramref name="n"/> draws from the discrete power law (α, xmin) to <paramref name="buf"/> as a spectrum:
    /// sequential binomial splitting over small x (the count at x is Binomial(remaining, x^−α/ζ(α, x))), then the few
    /// remaining far-tail points drawn one by one with the exact rejection–inversion sampler conditioned on x ≥ the current value.
    /// </summary>
    public static void PowerLawTail(Xoshiro rng, double alpha, long xmin, long n, SpectrumBuffer buf) =>
        PowerLawTail(rng, alpha, xmin, n, buf, null);

    /// <summary><see cref="PowerLawTail(Xoshiro, double, long, long, SpectrumBuffer)"/> with the cell probabilities of
    /// its first steps read from <paramref name="cells"/> (made for the same α and xmin): the same numbers, computed
    /// once for all replicates instead of an exponential per cell and replicate.</summary>
    public static void PowerLawTail(Xoshiro rng, double alpha, long xmin, long n, SpectrumBuffer buf, PowerLawCells? cells)
    {
        long remaining = n;
        long x = xmin;
        int steps = 0;
        double z;
        if (cells is not null)
        {
            if (cells.Alpha != alpha || cells.Xmin != xmin) throw new ArgumentException("cells made for another law", nameof(cells));
            double[] pc = cells.P, l1 = cells.Log1mP, odds = cells.Odds;
            for (; steps < pc.Length && remaining > 0; steps++, x++)
            {
                double p = pc[steps];
                if (remaining < 32 || remaining * p < 1) break;
                long k = BinomialSampler.Draw(rng, remaining, p, l1[steps], odds[steps]);
                buf.Add(x, k);
                remaining -= k;
            }
            // past the table (or stopped inside it): the running state of the loop below at this step
            z = steps < pc.Length ? double.NaN : cells.ZAfter;
            if (steps < pc.Length) goto Individuals;
        }
        else z = HurwitzZeta.Value(alpha, xmin);
        while (remaining > 0)
        {
            double t = Math.Exp(-alpha * Math.Log(x));
            double p = t / z;
            if (remaining < 32 || remaining * p < 1) break;
            long k = BinomialSampler.Draw(rng, remaining, p);
            buf.Add(x, k);
            remaining -= k;
            z -= t;
            x++;
            // refresh ζ now and then so the running subtraction cannot drift
            if ((++steps & 255) == 0) z = HurwitzZeta.Value(alpha, x);
        }
    Individuals:
        if (remaining > 0)
        {
            var xs = buf.Scratch((int)remaining);
            Samplers.PowerLaw(rng, alpha, x, xs);
            buf.AddIndividuals(xs);
        }
    }

    /// <summary>
    /// Adds a multinomial draw of <paramref name="n"/> points over the values of <paramref name="plan"/> with
    /// probabilities ∝ their multiplicities: sequential binomials over the plan's dense head, then the points left for
    /// the sparse suffix placed one by one on a uniformly drawn type of the suffix.
    /// </summary>
    /// <remarks>
    /// Same law as <see cref="Multinomial(Xoshiro, long[], long[], int, int, long, SpectrumBuffer)"/> (Devroye 1986,
    /// §XI.1.4): after the head's conditional binomials, the count K left for the suffix cells is their total count,
    /// and given K the suffix counts are Multinomial(K, m_j / Σ_suffix m): K independent points each falling on cell j
    /// with probability m_j / Σ_suffix m — a type of the suffix drawn uniformly (exactly: Lemire's bounded integers,
    /// <see cref="UniformBelow"/>) and mapped to its cell. A suffix point costs one 64-bit draw and two array reads
    /// where a cell cost one binomial (~60 ns, most of an interval replicate's draw). Other random numbers than that
    /// one: bootstrap figures for a given seed differ from versions before this one (same law).
    /// </remarks>
    public static void Multinomial(Xoshiro rng, MultinomialPlan plan, long n, SpectrumBuffer buf)
    {
        long[] v = plan.Values, m = plan.Mult;
        double mass = plan.Mass;
        long remaining = n;
        int j = plan.From;
        for (; j < plan.Split && remaining > 0; j++)
        {
            long k = j == plan.To - 1 ? remaining : BinomialSampler.Draw(rng, remaining, Math.Min(1, m[j] / mass));
            buf.Add(v[j], k);
            remaining -= k;
            mass -= m[j];
        }
        if (remaining <= 0 || j == plan.To) return;
        var counts = buf.Histogram(plan.To - plan.Split);
        var cellOf = plan.CellOf;
        ulong types = (ulong)cellOf.Length;
        ulong reject = (0 - types) % types; // Lemire's threshold (UniformBelow), computed once
        // the points in batches: the batch's 64-bit numbers drawn in one run, each point's type taken from them in
        // order exactly as UniformBelow takes them one call at a time (a rejected number, probability < types/2^64,
        // passes to the next number for the same point), then the cells counted in a second loop whose reads do not
        // wait on the generator. Never more numbers are drawn than UniformBelow would: each point takes at least one.
        Span<ulong> raw = stackalloc ulong[256];
        Span<int> picked = stackalloc int[256];
        for (long left = remaining; left > 0;)
        {
            var batch = raw[..(int)Math.Min(left, raw.Length)];
            rng.Fill(batch);
            int got = 0;
            foreach (ulong r in batch)
            {
                ulong hi = Math.BigMul(r, types, out ulong lo);
                if (lo < reject) continue; // UniformBelow's rejection: lo < types and lo < the threshold, which is < types
                picked[got++] = (int)hi;
            }
            foreach (int t in picked[..got]) counts[cellOf[t]]++;
            left -= got;
        }
        for (int c = 0; c < counts.Length; c++)
            if (counts[c] != 0) buf.Add(v[plan.Split + c], counts[c]);
    }

    /// <summary>Uniform integer in [0, s), exactly: Lemire's multiply-and-reject ("Fast random integer generation in
    /// an interval", ACM TOMACS 29(1), 2019); a draw is rejected with probability &lt; s / 2^64. The batched suffix
    /// loop of <see cref="Multinomial(Xoshiro, MultinomialPlan, long, SpectrumBuffer)"/> applies the same rule inline;
    /// this one-at-a-time form is its reference in the tests.</summary>
    internal static long UniformBelow(Xoshiro rng, ulong s)
    {
        ulong hi = Math.BigMul(rng.NextUInt64(), s, out ulong lo);
        if (lo < s)
        {
            ulong t = (0 - s) % s;
            while (lo < t) hi = Math.BigMul(rng.NextUInt64(), s, out lo);
        }
        return (long)hi;
    }

    /// <summary>Adds a multinomial draw of <paramref name="n"/> points over the values <c>v[from..to)</c> with probabilities ∝ m.</summary>
    public static void Multinomial(Xoshiro rng, long[] v, long[] m, int from, int to, long n, SpectrumBuffer buf)
    {
        double mass = 0;
        for (int j = from; j < to; j++) mass += m[j];
        long remaining = n;
        for (int j = from; j < to && remaining > 0; j++)
        {
            long k = j == to - 1 ? remaining : BinomialSampler.Draw(rng, remaining, Math.Min(1, m[j] / mass));
            buf.Add(v[j], k);
            remaining -= k;
            mass -= m[j];
        }
    }
}

/// <summary>
/// A multinomial over the values <c>v[from..to)</c> with probabilities ∝ m, prepared once for many draws
/// (<see cref="Synthetic.Multinomial(Xoshiro, MultinomialPlan, long, SpectrumBuffer)"/>): the sparse suffix (where a
/// cell holds few types, so a resample puts few points there) gets a map from type to cell.
/// </summary>
internal sealed class MultinomialPlan
{
    private const int MaxSparseTypes = 1 << 22; // 16 MiB of map at most
    private const int TypesPerCell = 4;         // a suffix point costs far less than a binomial, so up to 4 per cell

    public readonly long[] Values, Mult;
    public readonly int From, To, Split;
    public readonly double Mass;   // Σ m over [from, to)
    public readonly int[] CellOf;  // type of the suffix → its cell − Split

    public MultinomialPlan(long[] v, long[] m, int from, int to)
    {
        Values = v; Mult = m; From = from; To = to;
        double mass = 0;
        for (int j = from; j < to; j++) mass += m[j];
        Mass = mass;
        // the lowest split whose suffix holds at most TypesPerCell types per cell (and fits the map)
        int split = to;
        long types = 0;
        for (int j = to - 1; j >= from; j--)
        {
            types += m[j];
            if (types > MaxSparseTypes) break;
            if (types <= (long)TypesPerCell * (to - j)) split = j;
        }
        Split = split;
        types = 0;
        for (int j = split; j < to; j++) types += m[j];
        CellOf = new int[(int)types];
        int at = 0;
        for (int j = split; j < to; j++)
            for (long t = 0; t < m[j]; t++) CellOf[at++] = j - split;
    }
}

/// <summary>
/// The first cell probabilities p_s = x^−α / ζ(α, x), x = xmin + s, of <see cref="Synthetic.PowerLawTail(Xoshiro,
/// double, long, long, SpectrumBuffer, PowerLawCells?)"/>'s splitting, computed by its own recurrence (running ζ less
/// each term, refreshed every 256 steps), so a draw with the table gives the same numbers as one without.
/// </summary>
internal sealed class PowerLawCells
{
    public readonly double Alpha;
    public readonly long Xmin;
    public readonly double[] P;
    public readonly double ZAfter; // the running ζ after the last step of the table

    /// <summary>Cells until a draw of at most <paramref name="maxPoints"/> points would stop splitting (p·n &lt; 1), or
    /// until <paramref name="maxPoints"/> points would put fewer than 1/64 of a point on the cell in expectation (a draw
    /// then practically always stops splitting before: its remaining count would have to exceed 64 times its
    /// expectation there), at most 2^20 cells; a draw past them computes its cells as without a table, so the length
    /// changes only the speed. (Without the second rule a 10^9-token spectrum's table held ~400,000 cells of which a
    /// draw uses ~6,000.)</summary>
    public PowerLawCells(double alpha, long xmin, long maxPoints)
    {
        Alpha = alpha; Xmin = xmin;
        var p = new List<double>();
        long x = xmin;
        double z = HurwitzZeta.Value(alpha, xmin);
        double expectedAt = maxPoints / z; // maxPoints · x^−α / ζ(α, xmin) = expected points at x, times x^α
        int steps = 0;
        while (p.Count < 1 << 20)
        {
            double t = Math.Exp(-alpha * Math.Log(x));
            double q = t / z;
            if (maxPoints * q < 1 || expectedAt * t < 1.0 / 64) break;
            p.Add(q);
            z -= t;
            x++;
            if ((++steps & 255) == 0) z = HurwitzZeta.Value(alpha, x);
        }
        P = p.ToArray();
        ZAfter = z;
        Log1mP = P.Select(q => LogMath.Log1p(-q)).ToArray();
        Odds = P.Select(q => q / (1 - q)).ToArray();
    }

    /// <summary>ln(1 − p) and p/(1 − p) of each cell, as the binomial sampler's inversion computes them (the same
    /// values).</summary>
    public readonly double[] Log1mP, Odds;
}
