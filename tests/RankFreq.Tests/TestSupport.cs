using System.Text;
using RankFreq.Tokenization;
using Xunit;

namespace RankFreq.Tests;

/// <summary>
/// Real corpora come from RANKFREQ_CORPORA. Without it the test reports itself skipped with the reason;
/// under CI=true it is not skipped, so the missing variable fails the run.
/// </summary>
public sealed class CorpusFactAttribute : FactAttribute
{
    public CorpusFactAttribute()
    {
        if (Corpora.Root is null && !Corpora.InCi)
            Skip = "RANKFREQ_CORPORA is not set: this test reads real corpora (set it to ../shared/corpora)";
    }
}

/// <summary>Like <see cref="CorpusFactAttribute"/>, for theories.</summary>
public sealed class CorpusTheoryAttribute : TheoryAttribute
{
    public CorpusTheoryAttribute()
    {
        if (Corpora.Root is null && !Corpora.InCi)
            Skip = "RANKFREQ_CORPORA is not set: this test reads real corpora (set it to ../shared/corpora)";
    }
}

public static class Corpora
{
    public static bool InCi => string.Equals(Environment.GetEnvironmentVariable("CI"), "true", StringComparison.OrdinalIgnoreCase);

    public static string? Root
    {
        get
        {
            var r = Environment.GetEnvironmentVariable("RANKFREQ_CORPORA");
            return string.IsNullOrEmpty(r) || !Directory.Exists(r) ? null : r;
        }
    }

    public static string File(string relative)
    {
        var root = Root ?? throw new InvalidOperationException("RANKFREQ_CORPORA is not set or not a folder (required under CI=true)");
        var p = Path.Combine(root, relative);
        Assert.True(System.IO.File.Exists(p), $"corpus file missing: {p}");
        return p;
    }
}

/// <summary>The repository the test binaries were built from.</summary>
public static class Repo
{
    public static string Root
    {
        get
        {
            var dir = new DirectoryInfo(AppContext.BaseDirectory);
            while (dir is not null && !System.IO.File.Exists(System.IO.Path.Combine(dir.FullName, "RankFreq.sln"))) dir = dir.Parent;
            return dir?.FullName ?? throw new InvalidOperationException("repository root not found above the test binaries");
        }
    }
}

/// <summary>A temporary folder removed at the end of a test.</summary>
public sealed class TempDir : IDisposable
{
    public string Path { get; } = System.IO.Path.Combine(System.IO.Path.GetTempPath(), "rankfreq-test-" + Guid.NewGuid().ToString("N")[..12]);
    public TempDir() => Directory.CreateDirectory(Path);
    public string this[string name] => System.IO.Path.Combine(Path, name);
    public void Dispose() { try { Directory.Delete(Path, true); } catch (IOException) { } }
}

/// <summary>Collects tokens as strings, in order.</summary>
public sealed class ListSink : ITokenSink
{
    public List<string> Tokens { get; } = [];
    public List<int> Ids { get; } = [];
    public void AddToken(ReadOnlySpan<byte> utf8) => Tokens.Add(Encoding.UTF8.GetString(utf8));
    public void AddId(int id) => Ids.Add(id);

    public static List<string> Words(string text, bool keepCase = false)
    {
        var sink = new ListSink();
        new WordTokenizer(keepCase).CreateSession(sink).Feed(Encoding.UTF8.GetBytes(text), true);
        return sink.Tokens;
    }
}

/// <summary>Runs the CLI in-process with captured output.</summary>
public static class Cli
{
    public static (int Code, string Out, string Err) Run(params string[] args)
    {
        var o = new StringWriter();
        var e = new StringWriter();
        int code = RankFreq.Cli.CliApp.RunAsync(args, o, e).GetAwaiter().GetResult();
        return (code, o.ToString(), e.ToString());
    }
}
