using System.CommandLine;
using System.Globalization;
using RankFreq.Jobs;
using RankFreq.Lexical;

namespace RankFreq.Cli;

internal static class ForecastVerb
{
    public static Command Build(TextWriter stdout, TextWriter stderr)
    {
        var input = new Argument<string>("input") { Description = "A count table (.parquet) or a text list of counts (one a line, or 'value types')" };
        var to = new Option<string[]>("--to")
        {
            Description = "Size to forecast to: a multiple of the sample (10x) or tokens (1e9); repeatable",
            DefaultValueFactory = _ => ["10x"],
        };
        var points = new Option<int>("--points") { Description = "Points on the curve", DefaultValueFactory = _ => 100 };
        var coverage = new Option<double>("--coverage") { Description = "Share of tokens the vocabulary must cover", DefaultValueFactory = _ => 0.99 };
        var reps = new Option<int>("--reps") { Description = "Bootstrap replicates for the intervals (0 skips)", DefaultValueFactory = _ => 200 };
        var seed = new Option<ulong>("--seed") { Description = "Seed of the bootstrap", DefaultValueFactory = _ => 1UL };
        var threads = new Option<int>("--threads") { Description = "Worker threads (results do not depend on it)" };
        var model = new Option<string>("--model") { Description = "auto (best fit), zm, fzm or gigp", DefaultValueFactory = _ => "auto" };
        var json = new Option<bool>("--json") { Description = "Print the forecast as JSON on stdout" };
        var quiet = new Option<bool>("--quiet", "-q") { Description = "No summary" };
        var output = new Option<string?>("--out", "-o") { Description = "Folder for forecast.parquet, forecast.fits.parquet, forecast.json and the plot" };
        var cmd = new Command("forecast", "Forecast vocabulary growth beyond the sample from LNRE models (ZM, fZM, GIGP) fitted to the spectrum.") { input };
        foreach (var o in new Option[] { to, points, coverage, reps, seed, threads, model, json, quiet, output }) cmd.Options.Add(o);
        cmd.SetAction(async (pr, ct) =>
        {
            try
            {
                var targets = pr.GetValue(to)!.Select(ParseTarget).ToList();
                double cov = pr.GetValue(coverage);
                if (!(cov > 0 && cov < 1)) throw new UsageException("--coverage must lie between 0 and 1 (e.g. 0.99)");
                if (pr.GetValue(points) is < 2 or > 100_000) throw new UsageException("--points must be between 2 and 100000");
                if (pr.GetValue(reps) < 0) throw new UsageException("--reps must be 0 or more");
                string family = pr.GetValue(model) ?? "auto";
                if (family != "auto" && !LnreFitter.Families.Contains(family))
                    throw new UsageException($"--model: unknown model '{family}' (choose auto, {string.Join(", ", LnreFitter.Families)})");
                var options = new ForecastOptions(targets, pr.GetValue(points), cov, pr.GetValue(reps), pr.GetValue(seed), pr.GetValue(threads), family);
                var r = await ForecastJob.RunAsync(new ForecastSettings(pr.GetValue(input)!, options, pr.GetValue(output)), ct);
                foreach (var w in r.Warnings) stderr.WriteLine($"rankfreq: warning: {w}");
                if (pr.GetValue(json)) stdout.WriteLine(r.Json);
                else if (!pr.GetValue(quiet)) ForecastSummary.Write(stdout, r.Forecast, $"{pr.GetValue(input)}: {r.Description}", r.Files);
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }

    /// <summary>"10x" (a multiple of the sample) or "1e9", "250000000" (tokens).</summary>
    internal static ForecastTarget ParseTarget(string s)
    {
        var t = s.Trim();
        bool rel = t.EndsWith('x') || t.EndsWith('X') || t.EndsWith('×');
        if (rel) t = t[..^1];
        if (!double.TryParse(t, NumberStyles.Float, CultureInfo.InvariantCulture, out double v) || !(v > 0) || !double.IsFinite(v) || v > 1e15)
            throw new UsageException($"--to: '{s}' is not a size (examples: 10x for ten times the sample, 1e9 for a billion tokens)");
        return new ForecastTarget(v, rel);
    }
}
