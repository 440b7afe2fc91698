using System.CommandLine;
using System.Text;
using RankFreq.Tokenization;

namespace RankFreq.Cli;

/// <summary>
/// Shell completion scripts generated from the command tree, so they list exactly the commands and options there
/// are: bash (a completion function), zsh (the same function through zsh's bash completion layer) and fish.
/// </summary>
internal static class Completion
{
    public static readonly string[] Shells = ["bash", "zsh", "fish"];

    public static Command Build(TextWriter stdout, Func<RootCommand> root)
    {
        var shell = new Argument<string>("shell") { Description = "bash, zsh or fish" };
        shell.AcceptOnlyFromAmong(Shells);
        var cmd = new Command("completion", "Print a shell completion script (bash, zsh or fish).") { shell };
        cmd.SetAction(pr =>
        {
            stdout.Write(Script(pr.GetValue(shell)!, root()));
            return CliApp.Ok;
        });
        return cmd;
    }

    /// <summary>Values offered after an option, where there is a fixed set.</summary>
    private static IReadOnlyList<string> Values(string option) => option switch
    {
        "--tokenizer" or "-t" => TokenizerFactory.Available.Select(a => a.Spec).Where(s => !s.Contains(':') || s == "words:keep-case").ToList(),
        "--format" => ["auto", "text", "jsonl", "parquet"],
        "--alternatives" => ["all", "none", .. Fitting.Alternatives.Names],
        _ => [],
    };

    internal static string Script(string shell, RootCommand root)
    {
        var verbs = root.Subcommands.ToList();
        return shell switch
        {
            "fish" => Fish(root, verbs),
            "zsh" => "# rankfreq completion; load with: source <(rankfreq completion zsh), after compinit\n"
                + "autoload -U +X bashcompinit && bashcompinit\n" + Bash(root, verbs),
            _ => "# rankfreq completion; load with: source <(rankfreq completion bash)\n" + Bash(root, verbs),
        };
    }

    private static string Bash(RootCommand root, List<Command> verbs)
    {
        var sb = new StringBuilder();
        sb.Append("_rankfreq() {\n  local cur=${COMP_WORDS[COMP_CWORD]} prev=${COMP_WORDS[COMP_CWORD-1]} opts=\n");
        string words = string.Join(' ', verbs.Select(v => v.Name)) + " --help --version";
        sb.Append($"  if [[ $COMP_CWORD -eq 1 ]]; then\n    COMPREPLY=($(compgen -W \"{words}\" -- \"$cur\"))\n    return\n  fi\n");
        sb.Append("  case $prev in\n");
        foreach (var group in verbs.SelectMany(v => v.Options).SelectMany(o => o.Aliases.Prepend(o.Name)).Distinct()
                     .Select(n => (n, v: Values(n))).Where(x => x.v.Count > 0).GroupBy(x => string.Join(' ', x.v)))
            sb.Append($"    {string.Join('|', group.Select(x => x.n))}) COMPREPLY=($(compgen -W \"{group.Key}\" -- \"$cur\")); return;;\n");
        sb.Append("  esac\n  case ${COMP_WORDS[1]} in\n");
        foreach (var v in verbs)
        {
            string extra = v.Name == "completion" ? " " + string.Join(' ', Shells) : "";
            sb.Append($"    {v.Name}) opts=\"{string.Join(' ', Slips.OptionNames(v, root))}{extra}\";;\n");
        }
        sb.Append("  esac\n");
        sb.Append("  if [[ $cur == -* || ${COMP_WORDS[1]} == completion ]]; then COMPREPLY=($(compgen -W \"$opts\" -- \"$cur\"))\n");
        sb.Append("  else COMPREPLY=($(compgen -f -- \"$cur\")); fi\n}\n");
        sb.Append("complete -o filenames -o bashdefault -F _rankfreq rankfreq\n");
        return sb.ToString();
    }

    private static string Fish(RootCommand root, List<Command> verbs)
    {
        var sb = new StringBuilder("# rankfreq completion; save as ~/.config/fish/completions/rankfreq.fish\n");
        sb.Append("complete -c rankfreq -f -n __fish_use_subcommand\n");
        foreach (var v in verbs)
            sb.Append($"complete -c rankfreq -f -n __fish_use_subcommand -a {v.Name} -d {Quote(v.Description)}\n");
        foreach (var v in verbs)
        {
            string when = $"-n '__fish_seen_subcommand_from {v.Name}'";
            if (v.Name == "completion") sb.Append($"complete -c rankfreq -f {when} -a '{string.Join(' ', Shells)}'\n");
            foreach (var o in v.Options.Concat(root.Options.Where(o => o.Recursive)))
            {
                var names = o.Aliases.Prepend(o.Name).Where(n => n.StartsWith('-') && n != "-?").Distinct()
                    .Select(n => n.StartsWith("--") ? $"-l {n[2..]}" : $"-s {n[1..]}");
                var values = Values(o.Name);
                string arg = o.ValueType == typeof(bool) ? "" : values.Count > 0 ? $" -x -a '{string.Join(' ', values)}'" : " -r";
                sb.Append($"complete -c rankfreq {when} {string.Join(' ', names)}{arg} -d {Quote(o.Description)}\n");
            }
        }
        return sb.ToString();
    }

    private static string Quote(string? s) => "'" + (s ?? "").Replace("\\", "\\\\").Replace("'", "\\'") + "'";
}
