namespace RankFreq.Lexical;

/// <summary>A sample size to forecast: a multiple of the sample's N ("10x") or a number of tokens ("1e9").</summary>
/// <param name="Value">The multiple or the number of tokens.</param>
/// <param name="Relative">True for a multiple of N.</param>
public sealed record ForecastTarget(double Value, bool Relative)
{
    /// <summary>The target in tokens for a sample of <paramref name="n"/> tokens.</summary>
    public double TokensFor(double n) => Relative ? Value * n : Value;

    /// <summary>"10x" or "1e+09".</summary>
    public override string ToString() => Relative ? $"{Value:G6}x" : Value.ToString("G6", System.Globalization.CultureInfo.InvariantCulture);
}

/// <summary>Settings of a vocabulary forecast.</summary>
/// <param name="Targets">Sizes to forecast to (the curve runs up to the largest).</param>
/// <param name="Points">Points on the curve, log-spaced from N/1000 to the largest target (targets and N are added).</param>
/// <param name="Coverage">The share of tokens a vocabulary must cover, e.g. 0.99.</param>
/// <param name="Reps">Parametric bootstrap replicates for the intervals (0: none).</param>
/// <param name="Seed">Seed of the bootstrap.</param>
/// <param name="Threads">Worker threads (0: all cores); results do not depend on it.</param>
/// <param name="Family">"auto" (the best fit) or one of <see cref="LnreFitter.Families"/>.</param>
public sealed record ForecastOptions(IReadOnlyList<ForecastTarget> Targets, int Points = 100, double Coverage = 0.99,
    int Reps = 200, ulong Seed = 1, int Threads = 0, string Family = "auto");
