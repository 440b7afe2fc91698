using System.CommandLine;
using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Storage;

namespace RankFreq.Cli;

/// <summary>Options of the tail fit, shared by fit and profile.</summary>
internal sealed class FitCliOptions(int defaultReps)
{
    public readonly Option<int> MinTail = new("--min-tail") { Description = "Fewest tail points an xmin candidate may leave", DefaultValueFactory = _ => 50 };
    public readonly Option<long> Xmin = new("--xmin") { Description = "Fix xmin instead of choosing it by the KS criterion" };
    public readonly Option<int> Reps = new("--reps") { Description = $"Goodness-of-fit bootstrap replicates (0 skips; 2,500 give p to ±0.01)", DefaultValueFactory = _ => defaultReps };
    public readonly Option<int> CiReps = new("--ci-reps") { Description = "Bootstrap replicates for the uncertainty of alpha and xmin (0 skips)", DefaultValueFactory = _ => Math.Min(1000, Math.Max(defaultReps, 200)) };
    public readonly Option<ulong> Seed = new("--seed") { Description = "Seed of every random draw", DefaultValueFactory = _ => 1UL };
    public readonly Option<string> Alternatives = new("--alternatives") { Description = "Families to compare with: all, none, or a list of lognormal,exponential,stretched_exponential,power_law_cutoff", DefaultValueFactory = _ => "all" };

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
        foreach (var a in alts)
            if (!Fitting.Alternatives.Names.Contains(a)) throw new UsageException($"--alternatives: unknown family '{a}' (choose from {string.Join(", ", Fitting.Alternatives.Names)})");
        return new FitOptions(minTail, xmin, reps, ci, pr.GetValue(Seed), threads, alts);
    }
}

internal static class FitVerb
{
    public static Command Build(TextWriter stdout, TextWriter stderr)
    {
        var input = new Argument<string>("input") { Description = "A count table (.parquet) or a text list of counts (one a line, or 'value types')" };
        var fo = new FitCliOptions(2500);
        var threads = new Option<int>("--threads") { Description = "Worker threads (results do not depend on it)" };
        var json = new Option<bool>("--json") { Description = "Print the fit as JSON on stdout" };
        var quiet = new Option<bool>("--quiet", "-q") { Description = "No progress or summary" };
        var output = new Option<string?>("--out", "-o") { Description = "Write the fit table (and X.alternatives.parquet beside it)" };
        var cmd = new Command("fit", "Fit the tail of a count table or count list: discrete power-law MLE, xmin, goodness of fit, alternatives.") { input };
        fo.AddTo(cmd);
        foreach (var o in new Option[] { threads, json, quiet, output }) cmd.Options.Add(o);
        cmd.SetAction(async (pr, ct) =>
        {
            try
            {
                var options = fo.Build(pr, pr.GetValue(threads));
                var (spectrum, desc) = await SpectrumInput.LoadAsync(pr.GetValue(input)!, ct);
                var progress = new FitConsoleProgress(stderr, pr.GetValue(quiet));
                var fit = await Task.Run(() => TailFitter.Fit(spectrum, options, progress, ct), ct);
                progress.Done();
                if (pr.GetValue(output) is { } o) await FitTableFile.WriteAsync(o, [("all", fit)], ct);
                if (pr.GetValue(json)) stdout.WriteLine(Reporting.JsonText.Write(FitJson(fit)));
                else if (!pr.GetValue(quiet)) FitSummary.Write(stdout, fit, $"{pr.GetValue(input)}: {desc}, {spectrum.TypeCount:N0} types");
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }

    internal static Dictionary<string, object?> FitJson(TailFitResult f) => Reporting.SummaryFields.Fit(f);
}

internal sealed class FitConsoleProgress(TextWriter err, bool quiet) : IProgress<FitProgress>
{
    private readonly bool _tty = !Console.IsErrorRedirected;
    private DateTime _last = DateTime.UtcNow;
    private bool _drew;

    public void Report(FitProgress p)
    {
        if (quiet) return;
        var now = DateTime.UtcNow;
        if (now - _last < TimeSpan.FromSeconds(_tty ? 0.25 : 10)) return;
        _last = now;
        lock (this)
        {
            string line = $"{p.Stage}: {p.Done:N0} of {p.Total:N0} replicates";
            if (_tty) { err.Write("\r" + line.PadRight(60)); _drew = true; } else err.WriteLine(line);
        }
    }

    public void Done()
    {
        lock (this) if (_drew) { err.Write("\r" + new string(' ', 60) + "\r"); _drew = false; }
    }
}

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
            ? $"  goodness of fit p = {F(f.GofP)} from {f.GofReps:N0} synthetic sets{(f.GofP < 0.1 ? "  → power law ruled out" : "  → power law not ruled out (not proven)")}"
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
