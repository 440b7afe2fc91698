using RankFreq.Lexical;
using RankFreq.Primitives;

namespace RankFreq.Cli;

/// <summary>The console summary of a forecast: the models, the choice, the curve at the sample and each target, the
/// cautions.</summary>
internal static class ForecastSummary
{
    public static void Write(TextWriter o, ForecastResult r, string title, IReadOnlyList<string> files)
    {
        o.WriteLine($"{title}, {r.Tokens:N0} tokens, {r.Types:N0} types, {r.Hapax:N0} hapax");
        ConsoleTable.Rows(o, ForecastFields.Fit, r.Fits);
        if (r.Chosen is null)
        {
            o.WriteLine($"  no forecast ({r.Status}): {r.Message}");
            return;
        }
        o.WriteLine($"  → {r.Reason}");
        o.WriteLine();
        var targets = r.Options.Targets.Select(t => Math.Round(t.TokensFor(r.Tokens))).ToHashSet();
        var shown = r.Points.Where(p => p.Region == "sample" || targets.Contains(p.Tokens)).ToList();
        ConsoleTable.Rows(o, ForecastFields.Point, shown);
        o.WriteLine($"  intervals: 95% parametric bootstrap ({r.RepsUsed:N0} of {r.Options.Reps:N0} replicates refitted); "
            + $"vocabulary for coverage = types covering {r.Options.Coverage:P1} of the tokens");
        if (r.SelfCheck is { } check) o.WriteLine($"  {check.Describe()}");
        foreach (var c in r.Cautions) o.WriteLine($"  ! {c}");
        foreach (var f in files) o.WriteLine($"  wrote {f}");
    }
}
