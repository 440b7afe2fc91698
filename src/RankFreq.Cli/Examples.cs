namespace RankFreq.Cli;

/// <summary>The Examples section appended to each command's help.</summary>
internal static class Examples
{
    private static readonly Dictionary<string, (string Command, string Says)[]> ByCommand = new()
    {
        ["rankfreq"] =
        [
            ("rankfreq profile corpora-demo -o profile-demo", "count, fit and report on a folder of text"),
            ("rankfreq fit --help", "the options of one command, with examples"),
        ],
        ["profile"] =
        [
            ("rankfreq profile corpora-demo -o profile-demo", "everything about a folder, report in profile-demo/report.html"),
            ("rankfreq profile letters.jsonl --text-field body -o out", "JSON Lines, text in the 'body' field"),
            ("cat day*.log | rankfreq profile - -t whitespace -o out", "standard input, split on white space"),
        ],
        ["count"] =
        [
            ("rankfreq count bulletins --include '*.txt' -o counts.parquet", "only .txt files, at any depth"),
            ("rankfreq count big --shard 1/4 -o part1.parquet", "the first of four parts; merge the parts after"),
            ("rankfreq count notes.txt -t o200k_base --json -o t.parquet", "subword tokens, summary as JSON"),
        ],
        ["merge"] =
        [
            ("rankfreq merge part1.parquet part2.parquet -o all.parquet", "add up tables made with one tokenizer"),
        ],
        ["fit"] =
        [
            ("rankfreq fit counts.parquet", "fit the tail of a count table"),
            ("sort words.txt | uniq -c | rankfreq fit -", "a list of 'count token' lines on standard input"),
            ("rankfreq fit profile-demo/spectrum.parquet --reps 0 --json", "a spectrum table, no bootstrap, JSON"),
        ],
        ["tokenizers"] = [("rankfreq tokenizers", "list the specs that -t accepts")],
        ["completion"] =
        [
            ("source <(rankfreq completion bash)", "Tab completion in this bash session"),
            ("rankfreq completion fish > ~/.config/fish/completions/rankfreq.fish", "for fish, kept"),
        ],
    };

    /// <summary>Writes the examples of <paramref name="command"/>, if it has any.</summary>
    public static void Write(TextWriter o, string command)
    {
        if (!ByCommand.TryGetValue(command, out var list)) return;
        o.WriteLine("Examples:");
        foreach (var (cmd, says) in list)
        {
            o.WriteLine($"  {cmd}");
            o.WriteLine($"      {says}");
        }
        o.WriteLine();
    }
}
