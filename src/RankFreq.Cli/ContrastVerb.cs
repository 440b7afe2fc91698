using System.CommandLine;
using System.Globalization;
using RankFreq.Comparison;
using RankFreq.Jobs;
using RankFreq.Sources;

namespace RankFreq.Cli;

internal static class ContrastVerb
{
    private static string F(double x, string fmt = "F3") => double.IsFinite(x) ? x.ToString(fmt, CultureInfo.InvariantCulture) : "–";

    public static Command Build(TextWriter stdout, TextWriter stderr)
    {
        var common = new CorpusOptions();
        var by = new Option<string?>("--by") { Description = "Group key: file, folder, field:NAME, field:NAME/WIDTH (numeric field in bins), column:NAME" };
        var groups = new Option<string?>("--groups") { Description = "File of two columns, path and group (instead of --by)" };
        var reps = new Option<int>("--reps") { Description = "Goodness-of-fit replicates per group (0 skips)", DefaultValueFactory = _ => 200 };
        var bootReps = new Option<int>("--boot-reps")
        {
            Description = "Bootstrap replicates per group for the intervals and tests",
            DefaultValueFactory = _ => 200
        };
        var thinReps = new Option<int>("--thin-reps") { Description = "Thinning replicates per group at matched size", DefaultValueFactory = _ => 50 };
        var noMatch = new Option<bool>("--no-match") { Description = "Compare at the groups' own sizes only (no thinning)" };
        var minTail = new Option<int>("--min-tail") { Description = "Fewest tail points an xmin candidate may leave", DefaultValueFactory = _ => 50 };
        var seed = new Option<ulong>("--seed") { Description = "Seed of every random draw", DefaultValueFactory = _ => 1UL };
        var renyi = new Option<double>("--renyi-order")
        {
            Description = "Order of the Rényi entropy behind the efficiency figure",
            DefaultValueFactory = _ => 2.5
        };
        var level = new Option<double>("--level") { Description = "Family-wise error rate of the pair tests (Holm)", DefaultValueFactory = _ => 0.05 };
        var skipBad = new Option<bool>("--skip-bad") { Description = "Skip and count records whose binned key is not a number instead of failing" };
        var output = new Option<string?>("--out", "-o") { Description = "Output folder for tables, plots and report.html (created if missing)" };
        var title = new Option<string?>("--title") { Description = "Title of the report (default: the input name)" };
        var cmd = new Command("contrast",
            "Compare document sets: tail exponents and vocabulary figures per group, at own and matched size, with adjusted pair tests.");
        common.AddTo(cmd);
        foreach (var o in new Option[] { by, groups, reps, bootReps, thinReps, noMatch, minTail, seed, renyi, level, skipBad, output,
            title }) cmd.Options.Add(o);
        cmd.SetAction(async (pr, ct) =>
        {
            try
            {
                var count = common.Settings(pr);
                if (count.ShardCount > 0) throw new UsageException("--shard cannot be used with contrast: every group must be counted whole");
                GroupKey? key = null;
                string? byValue = pr.GetValue(by), groupsFile = pr.GetValue(groups);
                if ((byValue is null) == (groupsFile is null)) throw new UsageException("contrast needs exactly one of --by KEY or --groups FILE");
                if (byValue is not null)
                {
                    try { key = GroupKey.Parse(byValue); }
                    catch (FormatException e) { throw new UsageException(e.Message); }
                }
                int r = pr.GetValue(reps), b = pr.GetValue(bootReps), t = pr.GetValue(thinReps), mt = pr.GetValue(minTail);
                double ro = pr.GetValue(renyi), lv = pr.GetValue(level);
                if (r < 0 || b < 2 || t < 1) throw new UsageException("--reps must be 0 or more, --boot-reps at least 2, --thin-reps at least 1");
                if (mt < 2) throw new UsageException("--min-tail must be at least 2");
                if (!(ro > 0) || !(lv > 0 && lv < 1)) throw new UsageException("--renyi-order must be positive and --level between 0 and 1");
                var options = new ContrastOptions(r, b, t, !pr.GetValue(noMatch), mt, ro, lv, pr.GetValue(seed), count.Threads);
                var source = (count.Source ?? new SourceOptions()) with { SkipBadGroupValues = pr.GetValue(skipBad) };
                var settings = new ContrastSettings(count with { Source = source }, key, options, pr.GetValue(output), pr.GetValue(common.RedactBelow),
                    pr.GetValue(title), groupsFile);
                bool quiet = pr.GetValue(common.Quiet);
                var cp = new ConsoleProgress(stderr, quiet);
                var sp = new ContrastConsoleProgress(stderr, quiet);
                var res = await Task.Run(() => ContrastJob.RunAsync(pr.GetValue(common.Inputs)!, settings, cp, sp, ct), ct);
                cp.Done(); sp.Done();
                foreach (var w in res.Warnings) stderr.WriteLine($"rankfreq: warning: {w}");
                if (pr.GetValue(common.Json))
                {
                    stdout.WriteLine(res.SummaryJson);
                    return CliApp.Ok;
                }
                if (!quiet) Write(stdout, res);
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }

    private static void Write(TextWriter o, ContrastJobResult res)
    {
        var r = res.Contrast;
        o.WriteLine($"contrast by {res.GroupKey}: {r.Groups.Count} groups, {res.Count.Tokens:N0} tokens" +
            (r.TargetTokens > 0 ? $", matched size {r.TargetTokens:N0} tokens ({r.Options.ThinReps} thinnings)" : ", no size matching"));
        int w = Math.Clamp(r.Groups.Max(g => g.Group.Length), 5, 40);
        o.WriteLine($"  {"group".PadRight(w)} {"tokens",11} {"types",9} {"α",6} {"95% interval",15} {"xmin",6} {"n_tail",7} {"gof_p",6} │ " +
            $"{"matched α",9} {"± sd",6} {"types",8} {"hapax",6} {"H bits",6}");
        foreach (var g in r.Groups)
        {
            string name = g.Group.Length > w ? g.Group[..(w - 1)] + "…" : g.Group.PadRight(w);
            if (g.Status != ContrastStatus.Ok)
            {
                o.WriteLine($"  {name} {g.Raw.Tokens,11:N0} {g.Raw.Types,9:N0}  not compared: {g.Message}");
                continue;
            }
            var pl = g.Fit!.PowerLaw;
            string raw = $"  {name} {g.Raw.Tokens,11:N0} {g.Raw.Types,9:N0} {F(g.Alpha),6} {$"{F(g.AlphaLo)}–{F(g.AlphaHi)}",15} {pl.Xmin,6:N0} " +
                $"{pl.NTail,7:N0} {F(g.Fit.GofP, "F2"),6}";
            var m = g.Matched;
            string matched = m is null ? "" : m.Status != ContrastStatus.Ok ? " │ too small at matched size"
                : $" │ {F(m.Figures["alpha"].Mean),9} {F(m.Figures["alpha"].Sd),6} {F(m.Figures["types"].Mean, "N0"),8} " +
                    $"{F(m.Figures["hapax_share"].Mean),6} {F(m.Figures["entropy_bits"].Mean, "F2"),6}";
            o.WriteLine(raw + matched);
        }
        var differ = r.Pairs.Where(p => p.Headline.Significant).ToList();
        o.WriteLine($"pairs: {r.Pairs.Count}, differing in α after Holm's adjustment: {differ.Count}");
        foreach (var p in r.Pairs.OrderBy(p => p.Headline.PHolm).Take(10))
            o.WriteLine($"  {p.A} vs {p.B}: Δα {F(p.Headline.Diff)} ({F(p.Headline.Lo)} to {F(p.Headline.Hi)}), p {F(p.Headline.P, "G3")}, Holm " +
                $"{F(p.Headline.PHolm, "G3")} [{p.Basis}]{(p.Headline.Significant ? "  *" : "")}");
        if (r.Pairs.Count > 10) o.WriteLine($"  … {r.Pairs.Count - 10} more pairs (see --json or pairs.parquet)");
        o.WriteLine("findings");
        foreach (var f in r.Findings) o.WriteLine($"  {f}");
        o.WriteLine("cautions");
        foreach (var c in r.Cautions) o.WriteLine($"  {c}");
        if (res.ReportPath is not null) o.WriteLine($"report: {res.ReportPath}");
    }
}

/// <summary>Replicate progress of a contrast, drawn by the fit's progress line with the group in the stage name.</summary>
internal sealed class ContrastConsoleProgress(TextWriter err, bool quiet) : IProgress<ContrastProgress>
{
    private readonly FitConsoleProgress _line = new(err, quiet);

    public void Report(ContrastProgress p) => _line.Report(new Fitting.FitProgress($"{p.Stage} {p.Group}", p.Done, p.Total));

    public void Done() => _line.Done();
}
