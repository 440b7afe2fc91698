using System.CommandLine;
using System.CommandLine.Parsing;

namespace RankFreq.Cli;

/// <summary>
/// Turns the slips a person makes on the command line into one usage line with a suggestion: a misspelt command
/// ("cout"), or a misspelt option ("--thread") that the parser would otherwise take for an input file name.
/// </summary>
internal static class Slips
{
    /// <summary>The usage message for the first slip in <paramref name="args"/>, or null when there is none.</summary>
    public static string? Find(ParseResult parsed, RootCommand root, IReadOnlyList<string> args)
    {
        var command = parsed.CommandResult.Command;
        // words after "--" are inputs whatever they look like
        var beforeDoubleDash = args.TakeWhile(a => a != "--").ToHashSet(StringComparer.Ordinal);
        if (command == root)
        {
            string? word = parsed.UnmatchedTokens.FirstOrDefault(t => !t.StartsWith('-'));
            var verbs = root.Subcommands.Select(c => c.Name).ToList();
            if (word is not null)
                return Nearest(word, verbs) is { } v
                    ? $"unknown command '{word}'; did you mean '{v}'?"
                    : $"unknown command '{word}'; the commands are {string.Join(", ", verbs)}";
        }
        var positional = parsed.CommandResult.Children.OfType<ArgumentResult>().SelectMany(a => a.Tokens).Select(t => t.Value);
        foreach (var token in positional.Concat(parsed.UnmatchedTokens))
        {
            if (token.Length < 2 || token[0] != '-' || !beforeDoubleDash.Contains(token)) continue;
            if (char.IsAsciiDigit(token[1]) || token[1] == '.') continue;    // a negative number is a value
            string name = token.Split('=')[0];
            var names = OptionNames(command, root);
            if (names.Contains(name)) continue;
            string help = command == root ? "rankfreq --help" : $"rankfreq {command.Name} --help";
            return Nearest(name, names) is { } o
                ? $"unknown option {name} (did you mean {o}?)"
                : $"unknown option {name} (see '{help}')";
        }
        return null;
    }

    /// <summary>The options a command accepts, with their aliases and the recursive ones of the root.</summary>
    internal static List<string> OptionNames(Command command, RootCommand root)
    {
        var options = command.Options.Concat(command == root ? [] : root.Options.Where(o => o.Recursive));
        return options.SelectMany(o => o.Aliases.Prepend(o.Name)).Where(n => n.StartsWith('-') && n != "-?").Distinct().ToList();
    }

    /// <summary>The closest candidate: a unique one the word is a prefix of, else one within a small edit distance
    /// (a third of the word's length rounded up, at most 3).</summary>
    internal static string? Nearest(string word, IReadOnlyList<string> candidates)
    {
        var prefixed = candidates.Where(c => c.Length > word.Length && c.StartsWith(word, StringComparison.Ordinal)
            && word.TrimStart('-').Length >= 2).ToList();
        if (prefixed.Count == 1) return prefixed[0];
        int limit = Math.Clamp((word.TrimStart('-').Length + 2) / 3, 1, 3);
        return candidates.Select(c => (c, d: Distance(word, c))).Where(x => x.d <= limit)
            .OrderBy(x => x.d).ThenBy(x => x.c, StringComparer.Ordinal).Select(x => x.c).FirstOrDefault();
    }

    /// <summary>Edit distance counting an insertion, deletion, substitution or swap of neighbours as one (optimal
    /// string alignment; common practice for "did you mean" suggestions).</summary>
    internal static int Distance(string a, string b)
    {
        var d = new int[a.Length + 1, b.Length + 1];
        for (int i = 0; i <= a.Length; i++) d[i, 0] = i;
        for (int j = 0; j <= b.Length; j++) d[0, j] = j;
        for (int i = 1; i <= a.Length; i++)
            for (int j = 1; j <= b.Length; j++)
            {
                int cost = a[i - 1] == b[j - 1] ? 0 : 1;
                d[i, j] = Math.Min(Math.Min(d[i - 1, j] + 1, d[i, j - 1] + 1), d[i - 1, j - 1] + cost);
                if (i > 1 && j > 1 && a[i - 1] == b[j - 2] && a[i - 2] == b[j - 1]) d[i, j] = Math.Min(d[i, j], d[i - 2, j - 2] + 1);
            }
        return d[a.Length, b.Length];
    }
}
