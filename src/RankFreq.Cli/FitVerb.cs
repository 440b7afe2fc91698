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
        var input = new Argument<string>("input")
        {
            Description = "A count table or spectrum table (.parquet, or a folder of an engine's Parquet parts), or a "
                + "text list: counts, 'value types' or 'count token' lines; - for standard input",
        };
        var fo = new FitCliOptions(2500);
        var threads = WholeNumber.Option<int>("--threads", 0, "Worker threads (0 or left out: all cores; results do not depend on it)");
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
                foreach (var note in r.Notes ?? []) stderr.WriteLine($"rankfreq: note: {note}");
                OutputName.WarnIfNotParquet(stderr, pr.GetValue(output), "the fit table");
                var fit = r.Fit;
                string name = pr.GetValue(input) is "-" ? "standard input" : pr.GetValue(input)!;
                if (pr.GetValue(json)) stdout.WriteLine(JsonText.Write(FitJson(fit)));
                else if (!pr.GetValue(quiet)) FitSummary.Write(stdout, fit, $"{name}: {r.Description}, {r.Spectrum.TypeCount:N0} types");
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }

    internal static Dictionary<string, object?> FitJson(TailFitResult f) => ResultFields.ToMap(TailFitFields.FitWithAlternatives, f);
}
