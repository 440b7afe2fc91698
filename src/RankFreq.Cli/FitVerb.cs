using System.CommandLine;
using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Jobs;
using RankFreq.Primitives;

namespace RankFreq.Cli;

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
                var progress = new FitConsoleProgress(stderr, pr.GetValue(quiet));
                var r = await FitJob.RunAsync(pr.GetValue(input)!, options, pr.GetValue(output), progress, ct);
                progress.Done();
                var fit = r.Fit;
                if (pr.GetValue(json)) stdout.WriteLine(JsonText.Write(FitJson(fit)));
                else if (!pr.GetValue(quiet)) FitSummary.Write(stdout, fit, $"{pr.GetValue(input)}: {r.Description}, {r.Spectrum.TypeCount:N0} types");
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }

    internal static Dictionary<string, object?> FitJson(TailFitResult f) => ResultFields.ToMap(TailFitFields.FitWithAlternatives, f);
}
