namespace RankFreq.Fitting;

/// <summary>How to fit a tail.</summary>
/// <param name="MinTail">Fewest tail points an xmin candidate may leave.</param>
/// <param name="Xmin">Fixed xmin (0: chosen by the KS criterion).</param>
/// <param name="Reps">Goodness-of-fit bootstrap replicates (0 skips the test).</param>
/// <param name="CiReps">Nonparametric bootstrap replicates for the uncertainty of α, xmin and n_tail (0 skips).</param>
/// <param name="Seed">Seed of every random draw.</param>
/// <param name="Threads">Worker threads (0: all cores); results do not depend on it.</param>
/// <param name="Alternatives">Alternative families to compare with.</param>
public sealed record FitOptions(
    int MinTail = 50,
    long Xmin = 0,
    int Reps = 2500,
    int CiReps = 1000,
    ulong Seed = 1,
    int Threads = 0,
    IReadOnlyList<string>? Alternatives = null)
{
    /// <summary>Alternatives to compare (default: all).</summary>
    public IReadOnlyList<string> EffectiveAlternatives => Alternatives ?? Fitting.Alternatives.Names;
    /// <summary>Effective thread count.</summary>
    public int EffectiveThreads => Threads > 0 ? Threads : Environment.ProcessorCount;
}
