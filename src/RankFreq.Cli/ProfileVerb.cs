using System.CommandLine;
using RankFreq.Jobs;
using RankFreq.Reporting;

namespace RankFreq.Cli;

internal static class ProfileVerb
{
    public static Command Build(TextWriter stdout, TextWriter stderr)
    {
        var common = new CorpusOptions();
        var fo = new FitCliOptions(2500);
        var output = new Option<string>("--out", "-o") { Description = "Output folder (created if missing)", Required = true };
        var title = new Option<string?>("--title") { Description = "Title of the report (default: the input name)" };
        var cmd = new Command("profile", "The main job: count, fit the tail, compare alternatives, vocabulary growth and richness, plots and an HTML report.");
        common.AddTo(cmd);
        fo.AddTo(cmd);
        cmd.Options.Add(output);
        cmd.Options.Add(title);
        cmd.SetAction(async (pr, ct) =>
        {
            try
            {
                var count = common.Settings(pr);
                var fit = fo.Build(pr, count.Threads);
                bool quiet = pr.GetValue(common.Quiet);
                var settings = new ProfileSettings(count, fit, pr.GetValue(output)!, pr.GetValue(common.RedactBelow), pr.GetValue(title));
                var cp = new ConsoleProgress(stderr, quiet);
                var fp = new FitConsoleProgress(stderr, quiet);
                var r = await Task.Run(() => ProfileJob.RunAsync(pr.GetValue(common.Inputs)!, settings, cp, fp, ct), ct);
                cp.Done(); fp.Done();
                foreach (var w in r.Warnings) stderr.WriteLine($"rankfreq: warning: {w}");
                if (pr.GetValue(common.Json))
                {
                    stdout.WriteLine(r.SummaryJson);
                    return CliApp.Ok;
                }
                if (quiet) return CliApp.Ok;
                CountVerb.WriteSummary(stdout, r.Count, Path.Combine(settings.OutputDirectory, "counts.parquet"));
                FitSummary.Write(stdout, r.Fit, "tail fit");
                var l = r.Lexical;
                stdout.WriteLine($"vocabulary");
                stdout.WriteLine($"  hapax {l.Hapax:N0} ({100 * l.HapaxShare:F1}% of types), dis {l.Dis:N0}, "
                    + $"unseen mass N1/N {l.GoodTuringUnseen:F4}, Chao1 {l.Chao1:N0}");
                stdout.WriteLine($"  Heaps β {r.Growth.HeapsBeta:F3} (K {r.Growth.HeapsK:G3}), "
                    + $"entropy {l.EntropyMillerMadowBits:F3} bits/token, Yule's K {l.YuleK:F1}");
                if (Cautions.HeapsBetaCaution(r.Growth) is { } heaps) stdout.WriteLine($"  note: {heaps}");
                stdout.WriteLine($"report: {r.ReportPath}");
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }
}
