using System.CommandLine;
using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Storage;

namespace RankFreq.Cli;

/// <summary>The console summary of a fit: a compact two-column table, then the alternatives.</summary>
internal static class FitSummary
{
    private static string F(double x, string fmt = "F3") => double.IsFinite(x) ? x.ToString(fmt, CultureInfo.InvariantCulture) : "–";

    public static void Write(TextWriter o, TailFitResult f, string title)
    {
        var p = f.PowerLaw;
        o.WriteLine(title);
        if (p.Status != FitStatus.Ok)
        {
            o.WriteLine($"  no fit: {p.Message}");
            return;
        }
        o.WriteLine($"  tail exponent  α = {F(p.Alpha)} ± {F(p.AlphaSe)} (Fisher)   bootstrap 95%: {F(f.AlphaLo)} – {F(f.AlphaHi)}   closed-form approx {F(p.AlphaApprox)}");
        o.WriteLine($"  lower cut-off  xmin = {p.Xmin:N0}{(f.Options.Xmin > 0 ? " (fixed)" : "")}   bootstrap 95%: {F(f.XminLo, "F0")} – {F(f.XminHi, "F0")}");
        o.WriteLine($"  tail size      {p.NTail:N0} of {f.NTypes:N0} types ({100.0 * p.NTail / f.NTypes:F1}%)");
        o.WriteLine($"  KS distance    {F(p.KsDistance, "F4")}");
        o.WriteLine(f.GofReps > 0
            ? $"  goodness of fit p = {F(f.GofP)} from {f.GofReps:N0} synthetic sets  → {Verdicts.GoodnessOfFit(f.GofP)}"
            : "  goodness of fit: not run (--reps 0)");
        o.WriteLine($"  Zipf rank exponent s = 1/(α−1) = {F(f.ZipfS)} ± {F(f.ZipfSSe)}   (log–log least-squares slope {F(f.LsqSlope)}: biased, for comparison only)");
        if (f.Alternatives.Count > 0)
        {
            o.WriteLine("  versus            llr     z/LR       p  favours");
            foreach (var a in f.Alternatives)
                o.WriteLine($"  {a.Name,-22} {F(a.Llr, "F1"),9} {F(a.NormalizedLlr, "F2"),7} {F(a.P, "F3"),7}  {a.Favours}");
        }
        o.WriteLine($"  seed {f.Seed}, {f.Seconds:F2} s");
    }
}
