using System.Text.RegularExpressions;
using Xunit;

namespace RankFreq.Tests.Architecture;

/// <summary>
/// The library's stages depend only on earlier stages (DEVELOPERS.md, "Stage order"): a file in a stage folder may
/// name its own stage and earlier ones, never a later one. Names are found the way the compiler would need them:
/// <c>using</c> directives, qualified names (<c>Storage.X</c>, <c>RankFreq.Storage.X</c>) and cref attributes.
/// </summary>
public class StagesFlowOneWayTests
{
    /// <summary>Stage folders in flow order; statistics stages share a rank and may not use each other.</summary>
    public static readonly string[][] Order =
    [
        ["Primitives"], ["Sources"], ["Tokenization"], ["Counting"], ["Fitting", "Lexical"], ["Comparison"],
        ["Storage"], ["Reporting"], ["Jobs"],
    ];

    private static int Rank(string stage) => Array.FindIndex(Order, r => r.Contains(stage));

    private static readonly Regex Reference = new(
        @"(?<![\w.])(?:RankFreq\.)?(?<stage>" + string.Join("|", Order.SelectMany(r => r)) + @")\.(?=[A-Z])",
        RegexOptions.Compiled);

    private static readonly Regex Using = new(@"^\s*using\s+(?:static\s+)?RankFreq\.(?<stage>\w+)", RegexOptions.Multiline);

    /// <summary>Every reference from a stage file to a later stage (or a peer statistics stage), as "file:line: text".</summary>
    public static List<string> BackwardReferences(string libraryRoot)
    {
        var found = new List<string>();
        foreach (var path in Directory.EnumerateFiles(libraryRoot, "*.cs", SearchOption.AllDirectories))
        {
            var rel = Path.GetRelativePath(libraryRoot, path);
            var top = rel.Split(Path.DirectorySeparatorChar)[0];
            if (top is "obj" or "bin") continue;
            int own = Rank(top);
            Assert.True(own >= 0, $"{rel}: source files live in a stage folder ({string.Join(", ", Order.SelectMany(r => r))})");
            var lines = File.ReadAllLines(path);
            for (int i = 0; i < lines.Length; i++)
            {
                var line = StripStringsAndLineComments(lines[i]);
                var stages = Using.Matches(line).Select(m => m.Groups["stage"].Value)
                    .Concat(Reference.Matches(line).Select(m => m.Groups["stage"].Value));
                foreach (var stage in stages)
                {
                    int r = Rank(stage);
                    if (r < 0 || stage == top) continue;
                    if (r >= own) found.Add($"{rel}:{i + 1}: {top} names {stage}: {lines[i].Trim()}");
                }
            }
        }
        return found;
    }

    // XML doc lines keep their crefs (a cref is a reference); plain comments and string literals are prose.
    private static string StripStringsAndLineComments(string line)
    {
        var t = line.TrimStart();
        if (t.StartsWith("///", StringComparison.Ordinal))
            return string.Join(" ", Regex.Matches(t, "cref=\"([^\"]*)\"").Select(m => m.Groups[1].Value));
        var noStrings = Regex.Replace(line, "\"(?:[^\"\\\\]|\\\\.)*\"", "\"\"");
        int c = noStrings.IndexOf("//", StringComparison.Ordinal);
        return c >= 0 ? noStrings[..c] : noStrings;
    }

    [Fact]
    public void No_stage_names_a_later_stage()
    {
        var found = BackwardReferences(LibraryRoot());
        Assert.True(found.Count == 0, "backward references:\n" + string.Join("\n", found));
    }

    [Fact]
    public void A_backward_reference_is_caught()
    {
        // a copy of one stage file with one later-stage reference added must be reported, with its place
        using var d = new TempDir();
        Directory.CreateDirectory(Path.Combine(d.Path, "Counting"));
        Directory.CreateDirectory(Path.Combine(d.Path, "Storage"));
        File.WriteAllText(Path.Combine(d.Path, "Counting", "A.cs"),
            "using RankFreq.Sources;\nnamespace RankFreq.Counting;\n// Storage.X in a comment is prose\n"
            + "class A { object B => Storage.AtomicFile.Describe(\"Reporting.X\"); }\n");
        File.WriteAllText(Path.Combine(d.Path, "Storage", "S.cs"), "using RankFreq.Counting;\nnamespace RankFreq.Storage;\n");
        var found = BackwardReferences(d.Path);
        Assert.Equal(["Counting" + Path.DirectorySeparatorChar + "A.cs:4: Counting names Storage: "
            + "class A { object B => Storage.AtomicFile.Describe(\"Reporting.X\"); }"], found);
    }

    [Fact]
    public void The_cli_names_only_jobs_and_results()
    {
        // the CLI is parse → settings → one job call → render: it never calls an engine or a file writer itself
        var cli = Path.Combine(LibraryRoot(), "..", "RankFreq.Cli");
        var engines = new Regex(@"\b(CountEngine|TailFitter|CountTableFile|FitTableFile|SpectrumInput|CountMerger|InputPlanner|InputReader)\b");
        var found = Directory.EnumerateFiles(cli, "*.cs", SearchOption.AllDirectories)
            .Where(p => !p.Contains($"{Path.DirectorySeparatorChar}obj{Path.DirectorySeparatorChar}"))
            .SelectMany(p => File.ReadAllLines(p).Select((l, i) => (p, l, i)))
            .Where(x => engines.IsMatch(x.l) && !x.l.TrimStart().StartsWith("//", StringComparison.Ordinal))
            .Select(x => $"{Path.GetFileName(x.p)}:{x.i + 1}: {x.l.Trim()}").ToList();
        Assert.True(found.Count == 0, "the CLI calls engine types:\n" + string.Join("\n", found));
    }

    private static string LibraryRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "RankFreq.sln"))) dir = dir.Parent;
        Assert.NotNull(dir);
        return Path.Combine(dir!.FullName, "src", "RankFreq");
    }
}
