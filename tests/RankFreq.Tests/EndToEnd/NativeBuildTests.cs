using System.Diagnostics;
using System.Text.Json;
using RankFreq.Counting;
using RankFreq.Storage;
using Xunit;
using RankFreq.Jobs;

namespace RankFreq.Tests.EndToEnd;

/// <summary>Needs clang (the native build links with it); skipped with the reason on a machine without it, never under CI=true.</summary>
public sealed class NativeBuildFactAttribute : FactAttribute
{
    public NativeBuildFactAttribute()
    {
        if (!NativeBuildTests.HasClang && !Corpora.InCi)
            Skip = "clang is not installed: the native build needs Debian packages clang and zlib1g-dev (.ci/run installs them)";
    }
}

/// <summary>
/// The native (ahead-of-time compiled) build is the one the benchmarks time and the README offers, so every verb is
/// run through it here and its results are compared with the library's in-process results.
/// </summary>
public class NativeBuildTests
{
    internal static bool HasClang =>
        (Environment.GetEnvironmentVariable("PATH") ?? "").Split(':').Where(Directory.Exists)
            .Any(p => Directory.EnumerateFiles(p, "clang*").Any(f => System.Text.RegularExpressions.Regex.IsMatch(Path.GetFileName(f), @"^clang(-\d+)?$")));

    [NativeBuildFact]
    public void EveryVerbRunsInTheNativeBuildWithTheSameResults()
    {
        Assert.True(HasClang, "clang is not installed (CI installs Debian packages clang and zlib1g-dev)");
        using var d = new TempDir();
        string repo = Repo.Root;
        string exe = Publish(repo, d);
        string demo = Path.Combine(repo, "corpora-demo", "corpus");

        // count: same totals as the library in process
        var (code, o, e) = Run(exe, "count", demo, "-o", d["w.parquet"], "--json");
        Assert.True(code == 0, e);
        using var r = CountJob.Count([demo], new CountSettings());
        using (var j = JsonDocument.Parse(o))
        {
            Assert.Equal(r.Summary.Tokens, j.RootElement.GetProperty("tokens").GetInt64());
            Assert.Equal(r.Summary.Types, j.RootElement.GetProperty("types").GetInt64());
        }
        using (var t = CountTableFile.OpenAsync(d["w.parquet"]).GetAwaiter().GetResult())
            Assert.Equal(r.Spectrum, t.ReadSpectrum());

        // a subword vocabulary loaded by assembly name (kept by the trimmer only if the build roots it)
        (code, o, e) = Run(exe, "count", demo, "-o", d["o.parquet"], "-t", "o200k_base", "--json");
        Assert.True(code == 0, e);
        using var ro = CountJob.Count([demo], new CountSettings(Tokenizer: "o200k_base"));
        using (var j = JsonDocument.Parse(o)) Assert.Equal(ro.Summary.Tokens, j.RootElement.GetProperty("tokens").GetInt64());

        // merge and fit read Parquet through Parquet.Net, which reports trim warnings of its own
        (code, _, e) = Run(exe, "merge", d["w.parquet"], d["w.parquet"], "-o", d["m.parquet"]);
        Assert.True(code == 0, e);
        (code, o, e) = Run(exe, "fit", d["m.parquet"], "--reps", "50", "--ci-reps", "20", "--seed", "9", "--json");
        Assert.True(code == 0, e);
        var (c2, o2, e2) = Cli.Run("fit", d["m.parquet"], "--reps", "50", "--ci-reps", "20", "--seed", "9", "--json");
        Assert.True(c2 == 0, e2);
        using (var a = JsonDocument.Parse(o))
        using (var b = JsonDocument.Parse(o2))
        {
            Assert.Equal(b.RootElement.GetProperty("xmin").GetInt64(), a.RootElement.GetProperty("xmin").GetInt64());
            Assert.Equal(b.RootElement.GetProperty("alpha").GetDouble(), a.RootElement.GetProperty("alpha").GetDouble(), 9);
            Assert.Equal(b.RootElement.GetProperty("gof_p").GetDouble(), a.RootElement.GetProperty("gof_p").GetDouble(), 9);
        }

        // profile: plots and report through the native Skia library
        (code, _, e) = Run(exe, "profile", demo, "-o", d["p"], "--reps", "50", "--ci-reps", "20", "-q");
        Assert.True(code == 0, e);
        Assert.True(new FileInfo(Path.Combine(d["p"], "report.html")).Length > 10_000);
        Assert.True(File.Exists(Path.Combine(d["p"], "rank-frequency.svg")));

        // tokenizer.json files (when .ci/run installed them): the fast engine and the reference library's, same totals
        if (RankFreq.Tests.Tokenization.TokenizerFiles.Root is not null)
            foreach (var name in new[] { "llama3", "gemma3" })
            {
                var tok = RankFreq.Tests.Tokenization.TokenizerFiles.Path_(name);
                (code, o, e) = Run(exe, "count", demo, "-o", d[name + ".parquet"], "-t", "hf:" + tok, "--json");
                Assert.True(code == 0, e);
                using var rt = CountJob.Count([demo], new CountSettings(Tokenizer: "hf:" + tok));
                using var j = JsonDocument.Parse(o);
                Assert.Equal(rt.Summary.Tokens, j.RootElement.GetProperty("tokens").GetInt64());
            }
        // contrast: grouped counting, thinning, nullable Parquet columns, the same figures as in process
        string[] contrast = ["contrast", demo, "--by", "file", "--reps", "0", "--boot-reps", "20", "--thin-reps", "4", "--json"];
        (code, o, e) = Run(exe, [.. contrast, "-o", d["c"]]);
        Assert.True(code == 0, e);
        Assert.True(File.Exists(Path.Combine(d["c"], "groups.parquet")) && File.Exists(Path.Combine(d["c"], "report.html")));
        var (c3, o3, e3) = Cli.Run(contrast);
        Assert.True(c3 == 0, e3);
        using (var a = JsonDocument.Parse(o))
        using (var b = JsonDocument.Parse(o3))
        {
            var ga = a.RootElement.GetProperty("groups").EnumerateArray().Select(g => g.GetProperty("alpha").GetDouble()).ToArray();
            var gb = b.RootElement.GetProperty("groups").EnumerateArray().Select(g => g.GetProperty("alpha").GetDouble()).ToArray();
            Assert.Equal(gb, ga);
        }

        // errors keep their exit codes
        Assert.Equal(1, Run(exe, "count", d["missing.txt"], "-o", d["x.parquet"]).Code);
        Assert.Equal(2, Run(exe, "count").Code);
    }

    /// <summary>Publishes a copy of the sources (so this build's output folders are not touched) and returns the executable.</summary>
    private static string Publish(string repo, TempDir d)
    {
        string src = d["src"];
        foreach (var f in new[] { "Directory.Build.props", "Directory.Packages.props" })
        {
            Directory.CreateDirectory(src);
            File.Copy(Path.Combine(repo, f), Path.Combine(src, f));
        }
        foreach (var file in Directory.EnumerateFiles(Path.Combine(repo, "src"), "*", SearchOption.AllDirectories))
        {
            string rel = Path.GetRelativePath(repo, file);
            if (rel.Split(Path.DirectorySeparatorChar).Any(p => p is "bin" or "obj")) continue;
            string to = Path.Combine(src, rel);
            Directory.CreateDirectory(Path.GetDirectoryName(to)!);
            File.Copy(file, to);
        }
        var (code, o, e) = Run("dotnet", ["publish", Path.Combine(src, "src", "RankFreq.Cli"), "-c", "Release",
            "-p:Native=true", "-o", d["native"]], src, TimeSpan.FromMinutes(15));
        Assert.True(code == 0, $"native publish failed:\n{o}\n{e}");
        return Path.Combine(d["native"], "rankfreq");
    }

    private static (int Code, string Out, string Err) Run(string exe, params string[] args) => Run(exe, args, null, TimeSpan.FromMinutes(5));

    private static (int Code, string Out, string Err) Run(string exe, string[] args, string? cwd, TimeSpan timeout)
    {
        var psi = new ProcessStartInfo(exe, args) { RedirectStandardOutput = true, RedirectStandardError = true, WorkingDirectory = cwd ?? "" };
        // the test host's MSBuild variables would point a nested build at the outer one
        foreach (var k in psi.Environment.Keys.Where(k => k.StartsWith("MSBuild", StringComparison.OrdinalIgnoreCase)).ToList()) psi.Environment.Remove(k);
        using var p = Process.Start(psi)!;
        var so = p.StandardOutput.ReadToEndAsync();
        var se = p.StandardError.ReadToEndAsync();
        if (!p.WaitForExit(timeout)) { p.Kill(true); throw new TimeoutException($"{exe} {string.Join(' ', args)} ran past {timeout}"); }
        return (p.ExitCode, so.Result, se.Result);
    }
}
