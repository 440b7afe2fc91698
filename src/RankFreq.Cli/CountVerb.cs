using System.CommandLine;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Primitives;

namespace RankFreq.Cli;

internal static class CountVerb
{
    public static Command Build(TextWriter stdout, TextWriter stderr)
    {
        var common = new CorpusOptions();
        var output = new Option<string>("--out", "-o") { Description = "Count table to write (.parquet)", Required = true };
        var reproducible = new Option<bool>("--reproducible") { Description = Reproducible };
        var cmd = new Command("count", "Count tokens exactly and write the rank table as Parquet.");
        common.AddTo(cmd);
        cmd.Options.Add(output);
        cmd.Options.Add(reproducible);
        cmd.SetAction(async (pr, ct) =>
        {
            try
            {
                var settings = common.Settings(pr);
                bool quiet = pr.GetValue(common.Quiet), json = pr.GetValue(common.Json);
                var progress = new ConsoleProgress(stderr, quiet);
                var result = await Task.Run(() => CountJob.RunAsync(pr.GetValue(common.Inputs)!, settings, pr.GetValue(output)!,
                    pr.GetValue(common.RedactBelow), progress, ct, pr.GetValue(reproducible)), ct);
                progress.Done();
                OutputName.WarnIfNotParquet(stderr, pr.GetValue(output), "the count table");
                var s = result.Summary;
                foreach (var w in result.Warnings) stderr.WriteLine($"rankfreq: warning: {w}");
                if (json) stdout.WriteLine(JsonText.Write(SummaryJson(s)));
                else if (!quiet) WriteSummary(stdout, s, pr.GetValue(output)!);
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }

    /// <summary>Help text of --reproducible (count and merge).</summary>
    internal const string Reproducible = "Record no creation time in the table, so the same inputs give the same bytes";

    internal static Dictionary<string, object?> SummaryJson(CountSummary s) => ResultFields.ToMap(CountSummaryFields.All, s);

    internal static void WriteSummary(TextWriter o, CountSummary s, string path)
    {
        o.WriteLine($"  tokens   {s.Tokens,16:N0}");
        o.WriteLine($"  types    {s.Types,16:N0}");
        o.WriteLine($"  read     {Human.Bytes(s.StoredBytes),16}  from {s.Inputs.Count} file(s) in {s.Seconds:F2} s on {s.Threads} thread(s)");
        if (s.ReplacedBytes > 0) o.WriteLine($"  invalid UTF-8 bytes replaced: {s.ReplacedBytes:N0}");
        if (s.MalformedRecords > 0) o.WriteLine($"  malformed records skipped:    {s.MalformedRecords:N0}");
        if (s.MissingField > 0) o.WriteLine($"  records without the text field: {s.MissingField:N0}");
        if (s.SpilledRuns > 0) o.WriteLine($"  spilled to disk in {s.SpilledRuns} run(s)");
        o.WriteLine($"  table    {path}");
    }
}
