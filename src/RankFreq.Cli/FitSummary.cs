using RankFreq.Fitting;
using RankFreq.Primitives;

namespace RankFreq.Cli;

/// <summary>The console summary of a fit, generated from the fit's field list: a two-column table, the verdict in
/// words, then the alternatives as a table.</summary>
internal static class FitSummary
{
    public static void Write(TextWriter o, TailFitResult f, string title)
    {
        var p = f.PowerLaw;
        o.WriteLine(title);
        if (p.Status != FitStatus.Ok)
        {
            o.WriteLine($"  no fit ({FitStatusNames.Of(p.Status)}): {p.Message}");
            return;
        }
        ConsoleTable.Pairs(o, ResultFields.ForPeople(TailFitFields.Fit, f));
        o.WriteLine(f.GofReps > 0
            ? $"  → {Verdicts.GoodnessOfFit(f.GofP)} at this sample size (p = {f.GofP:F3} from {f.GofReps:N0} synthetic sets)"
            : "  → goodness of fit not tested (--reps 0)");
        if (f.Alternatives.Count > 0)
        {
            o.WriteLine();
            ConsoleTable.Rows(o, TailFitFields.Alternative, f.Alternatives);
        }
        o.WriteLine($"  {f.Seconds:F2} s");
    }
}
