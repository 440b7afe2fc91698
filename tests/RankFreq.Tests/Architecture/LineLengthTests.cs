using Xunit;

namespace RankFreq.Tests.Architecture;

/// <summary>
/// Source lines stay readable: no line of a <c>.cs</c> file under src/ is longer than 160 characters (project rules,
/// "Lines ≤ 120 characters where possible, never over 160"). Build output folders (obj/, bin/) are skipped.
/// </summary>
public class LineLengthTests
{
    /// <summary>The hard limit from the project rules.</summary>
    public const int MaxLength = 160;

    /// <summary>Every line over <see cref="MaxLength"/> in the .cs files under <paramref name="root"/>, as
    /// "file:line: length", with paths relative to <paramref name="root"/>.</summary>
    public static List<string> LongLines(string root)
    {
        var found = new List<string>();
        var files = Directory.EnumerateFiles(root, "*.cs", SearchOption.AllDirectories)
            .Where(p => !Path.GetRelativePath(root, p).Split(Path.DirectorySeparatorChar).Any(s => s is "obj" or "bin"))
            .Order(StringComparer.Ordinal);
        foreach (var path in files)
        {
            var rel = Path.GetRelativePath(root, path);
            var lines = File.ReadAllLines(path);
            for (int i = 0; i < lines.Length; i++)
                if (lines[i].Length > MaxLength) found.Add($"{rel}:{i + 1}: {lines[i].Length} characters");
        }
        return found;
    }

    [Fact]
    public void No_source_line_is_longer_than_the_limit()
    {
        var found = LongLines(SourceRoot());
        Assert.True(found.Count == 0, $"lines longer than {MaxLength} characters:\n" + string.Join("\n", found));
    }

    [Fact]
    public void A_long_line_is_caught_and_build_output_is_skipped()
    {
        // one line just over the limit is reported with its place; one exactly at the limit and any file under
        // obj/ or bin/ are not
        using var d = new TempDir();
        Directory.CreateDirectory(Path.Combine(d.Path, "Lib", "obj"));
        Directory.CreateDirectory(Path.Combine(d.Path, "Lib", "bin", "Debug"));
        File.WriteAllText(Path.Combine(d.Path, "Lib", "A.cs"),
            "namespace X;\n" + new string('a', MaxLength) + "\n// " + new string('b', MaxLength - 2) + "\n");
        File.WriteAllText(Path.Combine(d.Path, "Lib", "obj", "G.cs"), new string('c', 300) + "\n");
        File.WriteAllText(Path.Combine(d.Path, "Lib", "bin", "Debug", "H.cs"), new string('d', 300) + "\n");
        var found = LongLines(d.Path);
        Assert.Equal([$"Lib{Path.DirectorySeparatorChar}A.cs:3: {MaxLength + 1} characters"], found);
    }

    private static string SourceRoot()
    {
        var dir = new DirectoryInfo(AppContext.BaseDirectory);
        while (dir is not null && !File.Exists(Path.Combine(dir.FullName, "RankFreq.sln"))) dir = dir.Parent;
        Assert.NotNull(dir);
        return Path.Combine(dir!.FullName, "src");
    }
}
