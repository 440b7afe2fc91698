using System.CommandLine;
using System.CommandLine.Help;
using System.Globalization;
using RankFreq.Primitives;
using RankFreq.Tokenization;

namespace RankFreq.Cli;

/// <summary>Parses arguments, builds settings, calls one library entry point and maps the outcome to an exit code.</summary>
public static class CliApp
{
    /// <summary>Exit codes: 0 ok, 1 error in the input or environment, 2 usage, 70 internal error (a bug), 130 interrupted.</summary>
    public const int Ok = 0, Error = 1, Usage = 2, Internal = 70, Interrupted = 130;

    /// <summary>Runs the command line; output goes to the given writers. <paramref name="ct"/> stops the verb (the
    /// process's signals are turned into it by <see cref="Signals"/>).</summary>
    public static async Task<int> RunAsync(string[] args, TextWriter stdout, TextWriter stderr, CancellationToken ct = default)
    {
        var root = Build(stdout, stderr);
        var parsed = root.Parse(args);
        Verbose = parsed.GetValue(VerboseOption);
        var command = parsed.CommandResult.Command;
        string tryHelp = command == root ? "Try 'rankfreq --help'." : $"Try 'rankfreq {command.Name} --help'.";
        if (Slips.Find(parsed, root, args) is { } slip)
        {
            stderr.WriteLine($"rankfreq: {slip}");
            stderr.WriteLine(tryHelp);
            return Usage;
        }
        if (args.Length == 0)
        {
            stderr.WriteLine("rankfreq: no command given; the commands are "
                + string.Join(", ", root.Subcommands.Select(c => c.Name)));
            stderr.WriteLine(tryHelp);
            return Usage;
        }
        if (parsed.Errors.Count > 0)
        {
            foreach (var e in parsed.Errors) stderr.WriteLine($"rankfreq: {e.Message}");
            stderr.WriteLine(tryHelp);
            return Usage;
        }
        try
        {
            // signals are handled by Signals (SIGTERM's own exit code, a deadline), not by the parser library
            var config = new InvocationConfiguration { Output = stdout, Error = stderr, ProcessTerminationTimeout = null };
            int code = await parsed.InvokeAsync(config, ct);
            if (parsed.Action is HelpAction) Examples.Write(stdout, command == root ? "rankfreq" : command.Name);
            return code;
        }
        catch (IOException e) when (IsBrokenPipe(e)) { return Ok; }
    }

    private static readonly Option<bool> VerboseOption = new("--verbose")
    {
        Description = "On an internal error, print its full detail; tokshift also prints the time of each phase",
        Recursive = true,
    };

    internal static bool IsBrokenPipe(IOException e) => e.Message.Contains("Broken pipe", StringComparison.OrdinalIgnoreCase) || e.HResult == 32;

    private static RootCommand Build(TextWriter stdout, TextWriter stderr)
    {
        var root = new RootCommand("RankFreq: rank-frequency (Zipf-type) analysis of text collections — exact counts, tail fits that hold up, reports.");
        root.Subcommands.Add(CountVerb.Build(stdout, stderr));
        root.Subcommands.Add(MergeVerb.Build(stdout, stderr));
        root.Subcommands.Add(FitVerb.Build(stdout, stderr));
        root.Subcommands.Add(ForecastVerb.Build(stdout, stderr));
        root.Subcommands.Add(ProfileVerb.Build(stdout, stderr));
        root.Subcommands.Add(ContrastVerb.Build(stdout, stderr));
        root.Subcommands.Add(ShiftVerb.Build(stdout, stderr));
        var tok = new Command("tokenizers", "List the tokenizer specs available.");
        tok.SetAction(_ =>
        {
            foreach (var (spec, desc) in TokenizerFactory.Available) stdout.WriteLine($"{spec,-28} {desc}");
            return Ok;
        });
        root.Subcommands.Add(tok);
        root.Subcommands.Add(Completion.Build(stdout, () => root));
        root.Options.Add(VerboseOption);
        return root;
    }

    /// <summary>The one line an interrupted run prints.</summary>
    internal const string InterruptedLine = "rankfreq: interrupted; no output written";

    /// <summary>
    /// Maps an exception to a message and exit code: bad input or environment (<see cref="RankFreqException"/>) 1,
    /// usage 2 (the CLI's <see cref="UsageException"/> or the library's <see cref="SettingsException"/>: a setting no
    /// input could make valid), interruption 130; anything else is a bug: 70 with a one-line "internal error", the
    /// detail only under <c>--verbose</c>.
    /// </summary>
    internal static int Fail(TextWriter stderr, Exception e)
    {
        switch (e)
        {
            case SettingsException:
                stderr.WriteLine($"rankfreq: {e.Message}");
                return Usage;
            case RankFreqException r:
                stderr.WriteLine($"rankfreq: error: {e.Message}"
                    + (r.Setting is { } s && OptionFor.TryGetValue(s, out var option) ? $" (see {option})" : ""));
                return Error;
            case OperationCanceledException:
                stderr.WriteLine(InterruptedLine);
                return Interrupted;
            case UsageException:
                stderr.WriteLine($"rankfreq: {e.Message}");
                return Usage;
            case IOException io when IsBrokenPipe(io):
                return Ok;
            default:
                stderr.WriteLine($"rankfreq: internal error ({e.GetType().Name}); please report it"
                    + (Verbose ? "" : " (run with --verbose for the detail)"));
                if (Verbose) stderr.WriteLine(e.ToString());
                return Internal;
        }
    }

    /// <summary>The option that sets each settings property a library error may name.</summary>
    private static readonly Dictionary<string, string> OptionFor = new()
    {
        ["MaxRecordBytes"] = "--max-record",
        ["MemoryBytes"] = "--memory",
        ["MinTail"] = "--min-tail",
        ["TextField"] = "--text-field",
        ["TextColumn"] = "--text-column",
        ["Tokenizer"] = "--tokenizer",
    };

    /// <summary>Set from <c>--verbose</c> before the verb runs.</summary>
    internal static bool Verbose { get; private set; }

    /// <summary>Parses sizes like 512M, 2G, 64K or plain bytes.</summary>
    internal static long ParseSize(string? s, string option)
    {
        if (string.IsNullOrWhiteSpace(s)) return 0;
        s = s.Trim();
        long mult = 1;
        char last = char.ToUpperInvariant(s[^1]);
        if (last == 'B' && s.Length > 1) { s = s[..^1]; last = char.ToUpperInvariant(s[^1]); }
        switch (last)
        {
            case 'K': mult = 1L << 10; s = s[..^1]; break;
            case 'M': mult = 1L << 20; s = s[..^1]; break;
            case 'G': mult = 1L << 30; s = s[..^1]; break;
            case 'T': mult = 1L << 40; s = s[..^1]; break;
        }
        if (!double.TryParse(s, NumberStyles.Float, CultureInfo.InvariantCulture, out var v) || v <= 0)
            throw new UsageException($"{option}: '{s}' is not a size (examples: 512M, 2G)");
        return (long)(v * mult);
    }
}
