using System.CommandLine;
using RankFreq.Jobs;
using RankFreq.Primitives;

namespace RankFreq.Cli;

internal static class MergeVerb
{
    public static Command Build(TextWriter stdout, TextWriter stderr)
    {
        var tables = new Argument<string[]>("tables") { Description = "Count tables to merge", Arity = ArgumentArity.OneOrMore };
        var output = new Option<string>("--out", "-o") { Description = "Merged count table to write", Required = true };
        var memory = new Option<string?>("--memory") { Description = "Memory before spilling to disk, e.g. 2G" };
        var temp = new Option<string?>("--temp-dir") { Description = "Folder for spill runs" };
        var json = new Option<bool>("--json") { Description = "Machine-readable summary on stdout" };
        var quiet = new Option<bool>("--quiet", "-q") { Description = "No summary" };
        var reproducible = new Option<bool>("--reproducible") { Description = CountVerb.Reproducible };
        var cmd = new Command("merge", "Merge count tables made with the same tokenizer, exactly.")
        {
            tables, output, memory, temp, json, quiet, reproducible,
        };
        cmd.SetAction(async (pr, ct) =>
        {
            try
            {
                var s = await MergeJob.RunAsync(pr.GetValue(tables)!, pr.GetValue(output)!,
                    CliApp.ParseSize(pr.GetValue(memory), "--memory"), pr.GetValue(temp), ct, pr.GetValue(reproducible));
                foreach (var w in s.Warnings) stderr.WriteLine($"rankfreq: warning: {w}");
                OutputName.WarnIfNotParquet(stderr, pr.GetValue(output), "the merged table");
                if (pr.GetValue(json))
                    stdout.WriteLine(JsonText.Write(new Dictionary<string, object>
                    {
                        ["tables"] = s.Tables,
                        ["tokens"] = s.Tokens,
                        ["types"] = s.Types,
                        ["spilled_runs"] = s.SpilledRuns,
                        ["seconds"] = Math.Round(s.Seconds, 3),
                    }));
                else if (!pr.GetValue(quiet))
                    stdout.WriteLine($"  merged {Human.Count(s.Tables, "table")}: {s.Tokens:N0} tokens, {s.Types:N0} types -> {pr.GetValue(output)}");
                return CliApp.Ok;
            }
            catch (Exception e) { return CliApp.Fail(stderr, e); }
        });
        return cmd;
    }
}
