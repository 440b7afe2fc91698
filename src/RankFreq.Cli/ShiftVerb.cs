using System.CommandLine;
using System.Globalization;
using RankFreq.Comparison;
using RankFreq.Jobs;
using RankFreq.Primitives;

namespace RankFreq.Cli;

internal static class ShiftVerb
{
    public static Command Build(TextWriter stdout, TextWriter stderr)
    {
        var common = new CorpusOptions();
        var baseline = new Option<string>("--baseline") { Description = "Tokenizer spec to compare from (as -t)", Required = true };
        var candidate = new Option<string>("--candidate") { Description = "Tokenizer spec to compare to (as -t)", Required = true };
        var order = new Option<double>("--renyi-order")
        {
            Description = "Order of the Rényi efficiency (Zouhar et al. 2023 recommend 2.5)",
            DefaultValueFactory = _ => 2.5,
        };
        var fo = new FitCliOptions(200);
        var output = new Option<string?>("--out", "-o")
        {
            Description = "Folder for shift.parquet, the unseen-entry lists, plots and report.html",
        };
        var by = new Option<string?>("--by")
        {
            Description = "Fertility per group: file, folder, field:NAME, field:NAME/WIDTH, column:NAME (as contrast)",
        };
        var title = new Option<string?>("--title") { Description = "Title of the report (default: the input name)" };
        var cmd = new Command("tokshift", "Count the same text with two tokenizers and compare the distributions: "
            + "fertility, bytes per token, vocabulary use, concentration, entropy, tail exponent.");
        common.AddTo(cmd);
        cmd.Options.Remove(common.Tokenizer);
        cmd.Options.Remove(common.RedactBelow);
        cmd.Options.Remove(common.Shard);
        fo.AddTo(cmd);
        foreach (var o in new Option[] { baseline, candidate, order, output, by, title }) cmd.Options.Add(o);
        cmd.SetAction(async (pr, ct) =>
        {
            try
            {
                double renyi = pr.GetValue(order);
                if (!(renyi >= 0) || double.IsInfinity(renyi)) throw new UsageException("--renyi-order must be 0 or more");
                var count = common.Settings(pr);
                var fit = fo.Build(pr, count.Threads);
                Sources.GroupKey? key = null;
                if (pr.GetValue(by) is { } byValue)
                {
                    try { key = Sources.GroupKey.Parse(byValue); }
                    catch (FormatException e) { throw new UsageException(e.Message); }
                }
                var settings = new ShiftSettings(count, common.Spec(pr, pr.GetValue(baseline)!), common.Spec(pr, pr.GetValue(candidate)!),
                    new ShiftOptions(fit, renyi), pr.GetValue(output), key, pr.GetValue(title));
                bool quiet = pr.GetValue(common.Quiet);
                var cp = new ConsoleProgress(stderr, quiet);
                var r = await Task.Run(() => ShiftJob.RunAsync(pr.GetValue(common.Inputs)!, settings, cp, ct), ct);
                cp.Done();
                foreach (var w in r.Warnings) stderr.WriteLine($"rankfreq: warning: {w}");
                if (CliApp.Verbose)
                    stderr.WriteLine("rankfreq: time " + string.Join(", ", r.Timings.Select(t =>
                        $"{t.Phase} {t.Seconds.ToString("F2", CultureInfo.InvariantCulture)} s")));
                if (pr.GetValue(common.Json)) stdout.WriteLine(JsonText.Write(ResultFields.ToMap(ShiftFields.Json, r.Shift)));
                else if (!quiet) Write(stdout, r);
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }

    private static void Write(TextWriter o, ShiftJobResult r)
    {
        var s = r.Shift;
        var shown = ShiftFields.Side.Where(f => f.Shown).ToList();
        var rows = shown.Select(f => (f.Label, B: f.Display(s.Baseline), C: f.Display(s.Candidate))).ToList();
        int w0 = rows.Max(x => x.Label.Length), w1 = Math.Max(8, rows.Max(x => x.B.Length));
        o.WriteLine($"  {"".PadRight(w0)}  {"baseline".PadRight(w1)}  candidate");
        foreach (var (label, b, c) in rows) o.WriteLine($"  {label.PadRight(w0)}  {b.PadRight(w1)}  {c}");
        o.WriteLine();
        ConsoleTable.Pairs(o, ResultFields.ForPeople(ShiftFields.Differences, s));
        o.WriteLine();
        if (s.GroupKey is not null)
        {
            o.WriteLine($"  by {s.GroupKey}:");
            ConsoleTable.Rows(o, ShiftGroups.Fields, s.Groups);
            o.WriteLine();
        }
        foreach (var line in ShiftFindings.Of(s)) o.WriteLine($"  {line}");
        foreach (var f in r.Files) o.WriteLine($"  wrote {f}");
    }
}
