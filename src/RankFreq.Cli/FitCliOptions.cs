using System.CommandLine;
using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Storage;

namespace RankFreq.Cli;

/// <summary>Options of the tail fit, shared by fit and profile.</summary>
internal sealed class FitCliOptions(int defaultReps)
{
    public readonly Option<int> MinTail = WholeNumber.Option<int>("--min-tail", 2, "Fewest tail points an xmin candidate may leave", 50);
    public readonly Option<long> Xmin = WholeNumber.Option<long>("--xmin", 1, "Fix xmin instead of choosing it by the KS criterion");
    public readonly Option<int> Reps = WholeNumber.Option<int>("--reps", 0,
        "Goodness-of-fit bootstrap replicates (0 skips; 2,500 give p to ±0.01)", defaultReps);
    public readonly Option<int> CiReps = WholeNumber.Option<int>("--ci-reps", 0,
        "Bootstrap replicates for the uncertainty of alpha and xmin (0 skips)", Math.Min(1000, Math.Max(defaultReps, 200)));
    public readonly Option<ulong> Seed = WholeNumber.Option<ulong>("--seed", 0, "Seed of every random draw", 1UL);
    public readonly Option<string> Alternatives = new("--alternatives")
    {
        Description = "Families to compare with: all, none, or a list of discrete_lognormal,geometric,discrete_weibull,"
            + "power_law_cutoff (lognormal, exponential, stretched_exponential also accepted)",
        DefaultValueFactory = _ => "all",
    };

    public void AddTo(Command c)
    {
        foreach (var o in new Option[] { MinTail, Xmin, Reps, CiReps, Seed, Alternatives }) c.Options.Add(o);
    }

    public FitOptions Build(ParseResult pr, int threads)
    {
        int minTail = pr.GetValue(MinTail), reps = pr.GetValue(Reps), ci = pr.GetValue(CiReps);
        long xmin = pr.GetValue(Xmin);
        if (minTail < 2) throw new UsageException("--min-tail must be at least 2");
        if (reps < 0 || ci < 0) throw new UsageException("--reps and --ci-reps must be 0 or more");
        if (xmin < 0) throw new UsageException("--xmin must be a positive integer");
        string alt = pr.GetValue(Alternatives) ?? "all";
        IReadOnlyList<string> alts = alt switch
        {
            "all" => Fitting.Alternatives.Names,
            "none" => [],
            _ => alt.Split(',', StringSplitOptions.RemoveEmptyEntries | StringSplitOptions.TrimEntries),
        };
        alts = alts.Select(a => Fitting.Alternatives.Canonical(a)
                ?? throw new UsageException($"--alternatives: unknown family '{a}' "
                    + $"(choose from {string.Join(", ", Fitting.Alternatives.Names)})"))
            .Distinct().ToArray();
        return new FitOptions(minTail, xmin, reps, ci, pr.GetValue(Seed), threads, alts);
    }
}
