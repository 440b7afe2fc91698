using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Primitives;

namespace RankFreq.Jobs;

/// <summary>The vocabulary forecast a profile runs: to 2× and 10× the sample, with fewer bootstrap replicates than
/// the <c>forecast</c> verb so that the profile stays quick (the intervals' 2.5% and 97.5% ends rest on 100
/// refits; the verb's default is 200).</summary>
public static class ProfileForecast
{
    /// <summary>Sizes the report's table shows, as multiples of the sample.</summary>
    public static readonly IReadOnlyList<double> Multiples = [2, 10];

    /// <summary>Bootstrap replicates in a profile.</summary>
    public const int Reps = 100;

    /// <summary>The forecast settings of a profile: the fit's seed and threads, 60 points up to 10×.</summary>
    public static ForecastOptions Options(FitOptions fit) =>
        new([.. Multiples.Select(m => new ForecastTarget(m, true))], Points: 60, Reps: Reps, Seed: fit.Seed, Threads: fit.EffectiveThreads);

    /// <summary>The forecast as summary.json carries it: model, status, reason, the fits, the rows at the table's
    /// sizes and the cautions (the whole curve is in forecast.parquet).</summary>
    public static Dictionary<string, object?> Summary(ForecastResult r)
    {
        var map = ForecastFields.ToMap(r);
        map.Remove("tokens"); map.Remove("types"); map.Remove("hapax"); // the profile's own figures
        map["points"] = ResultFields.ToMaps(ForecastFields.Point, r.AtTargets().Select(x => x.Point));
        return map;
    }
}
