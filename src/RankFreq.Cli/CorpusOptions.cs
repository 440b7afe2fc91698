using System.CommandLine;
using RankFreq.Counting;
using RankFreq.Sources;

namespace RankFreq.Cli;

/// <summary>Options shared by the verbs that read a corpus.</summary>
internal sealed class CorpusOptions
{
    public readonly Argument<string[]> Inputs = new("inputs")
    {
        Description = "Files, folders (recursive) or - for standard input",
        Arity = ArgumentArity.OneOrMore,
    };
    public readonly Option<string> Tokenizer = new("--tokenizer", "-t")
    {
        Description = "Tokenizer spec (see 'rankfreq tokenizers')",
        DefaultValueFactory = _ => "words",
    };
    public readonly Option<string> Format = new("--format") { Description = "Input format: auto, text, jsonl, parquet", DefaultValueFactory = _ => "auto" };
    public readonly Option<string> TextField = new("--text-field")
    {
        Description = "JSON Lines field with the text (dots for nested objects)",
        DefaultValueFactory = _ => "text",
    };
    public readonly Option<string> TextColumn = new("--text-column") { Description = "Parquet column with the text", DefaultValueFactory = _ => "text" };
    public readonly Option<string[]> Include = new("--include")
    {
        Description = "Glob a file in a folder must match; without a / it matches names at any depth (repeatable)",
        AllowMultipleArgumentsPerToken = false,
    };
    public readonly Option<string[]> Exclude = new("--exclude") { Description = "Glob that drops files in a folder, as --include (repeatable)" };
    public readonly Option<string> MaxRecord = new("--max-record") { Description = "Longest JSON Lines record accepted", DefaultValueFactory = _ => "64M" };
    public readonly Option<bool> Strict = new("--strict") { Description = "Make a malformed JSON Lines record an error instead of skipping it" };
    public readonly Option<int> Threads = WholeNumber.Option<int>("--threads", 0, "Worker threads (0 or left out: all cores)");
    public readonly Option<string?> Memory = new("--memory")
    {
        Description = "Memory for counting before spilling to disk (default: a quarter of RAM); peak use stays within it plus ~200 MB, e.g. 2G",
    };
    public readonly Option<string?> Shard = new("--shard") { Description = "Count only part K of N of the sorted input files, as K/N (shards split by file)" };
    public readonly Option<long> RedactBelow = WholeNumber.Option<long>("--redact-below", 0,
        "Write token strings of types with count below K as null (counts kept)");
    public readonly Option<string?> TempDir = new("--temp-dir") { Description = "Folder for spill runs (default: system temporary folder)" };
    public readonly Option<bool> Quiet = new("--quiet", "-q") { Description = "No progress or summary on the console" };
    public readonly Option<bool> Json = new("--json") { Description = "Print a machine-readable summary on stdout" };
    public readonly Option<bool> Specials = new("--specials")
    {
        Description = "tokenizer.json: count special-token text (such as an end-of-text marker) as the special token",
    };

    public void AddTo(Command c)
    {
        c.Arguments.Add(Inputs);
        var options = new Option[]
        {
            Tokenizer, Format, TextField, TextColumn, Include, Exclude, MaxRecord, Strict, Threads, Memory, Shard,
            RedactBelow, TempDir, Quiet, Json, Specials,
        };
        foreach (var o in options)
            c.Options.Add(o);
    }

    /// <summary>A tokenizer spec as given, with special-token parsing when --specials is set.</summary>
    public string Spec(ParseResult pr, string spec) =>
        pr.GetValue(Specials) ? Tokenization.TokenizerJsonLoader.WithSpecials(spec) : spec;

    public CountSettings Settings(ParseResult pr)
    {
        var fmt = (pr.GetValue(Format) ?? "auto").ToLowerInvariant() switch
        {
            "auto" => InputFormat.Auto,
            "text" or "txt" => InputFormat.Text,
            "jsonl" or "ndjson" => InputFormat.JsonLines,
            "parquet" => InputFormat.Parquet,
            var f => throw new UsageException($"--format: '{f}' is not one of auto, text, jsonl, parquet"),
        };
        int k = 0, n = 0;
        if (pr.GetValue(Shard) is { } shard)
        {
            var parts = shard.Split('/');
            if (parts.Length != 2 || !int.TryParse(parts[0], out k) || !int.TryParse(parts[1], out n) || n < 1 || k < 1 || k > n)
                throw new UsageException($"--shard: '{shard}' is not K/N with 1 ≤ K ≤ N");
        }
        int threads = pr.GetValue(Threads);
        if (threads < 0) throw new UsageException("--threads must be positive");
        if (pr.GetValue(RedactBelow) < 0) throw new UsageException("--redact-below must be positive");
        var source = new SourceOptions(fmt, pr.GetValue(TextField) ?? "text", pr.GetValue(TextColumn) ?? "text",
            CliApp.ParseSize(pr.GetValue(MaxRecord), "--max-record"), pr.GetValue(Strict), pr.GetValue(Include) ?? [], pr.GetValue(Exclude) ?? []);
        return new CountSettings(Spec(pr, pr.GetValue(Tokenizer) ?? "words"), source, threads,
            CliApp.ParseSize(pr.GetValue(Memory), "--memory"), k, n, pr.GetValue(TempDir));
    }
}
