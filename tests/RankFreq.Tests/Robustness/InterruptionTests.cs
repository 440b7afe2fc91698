using System.Diagnostics;
using System.Runtime.InteropServices;
using System.Text;
using System.Text.Json;
using Xunit;

namespace RankFreq.Tests.Robustness;

/// <summary>
/// Interruption of the built CLI as a child process: SIGKILL at seeded moments leaves every final name absent or
/// complete and the next run removes what the killed one left; SIGINT and SIGTERM stop a verb with 130 and 143
/// (128 + the signal, common practice for shells) and nothing written.
/// </summary>
[Collection(RobustnessCollection.Name)]
public partial class InterruptionTests(RobustnessFixture fixture)
{
    private const int Seed = 1402;
    private const int KillsPerVerb = 20;
    private const int SigKill = 9, SigInt = 2, SigTerm = 15;

    [LibraryImport("libc", SetLastError = true)]
    private static partial int kill(int pid, int sig);

    private static string Exe => Path.Combine(AppContext.BaseDirectory, "rankfreq");

    /// <summary>A verb, its arguments given the corpus and work folder, and what it writes there.</summary>
    private sealed record Verb(string Name, Func<string, string, string[]> Args, string Output);

    private static readonly Verb[] Verbs =
    [
        new("count", (corpus, w) => [corpus, "-o", Path.Combine(w, "t.parquet"), "-q", "--memory", "256K",
            "--temp-dir", Path.Combine(w, "spill")], "t.parquet"),
        new("profile", (corpus, w) => [corpus, "-o", Path.Combine(w, "p"), "-q", "--reps", "5", "--ci-reps", "5",
            "--temp-dir", Path.Combine(w, "spill")], "p"),
        new("contrast", (corpus, w) => [corpus, "--by", "field:party", "-o", Path.Combine(w, "c"), "-q", "--reps", "5",
            "--boot-reps", "5", "--thin-reps", "2", "--temp-dir", Path.Combine(w, "spill")], "c"),
        new("tokshift", (corpus, w) => [corpus, "--baseline", "words", "--candidate", "whitespace", "-o", Path.Combine(w, "s"), "-q",
            "--temp-dir", Path.Combine(w, "spill")], "s"),
    ];

    private static string Corpus(string dir, int records, int seed)
    {
        var gen = new FuzzInputs(new Random(seed), dir);
        var sb = new StringBuilder();
        for (int i = 0; i < records; i++)
            sb.Append("{\"text\": ").Append(JsonSerializer.Serialize(gen.Text(3))).Append(", \"party\": \"")
                .Append(i % 3 == 0 ? "north" : i % 3 == 1 ? "south" : "west").Append("\"}\n");
        string p = Path.Combine(dir, "corpus.jsonl");
        File.WriteAllText(p, sb.ToString());
        return p;
    }

    [Fact]
    public void SigkillAtSeededMomentsLeavesFinalNamesAbsentOrComplete()
    {
        Assert.NotNull(fixture);
        if (!OperatingSystem.IsLinux()) return; // signals as POSIX defines them; the build targets linux-x64
        using var d = new TempDir();
        string corpus = Corpus(d.Path, 600, Seed); // small: the whole test should take a minute or two
        var problems = new List<string>();
        var rng = new Random(Seed);
        // each verb gets its own seeded moments; two verbs at a time on this 2-core machine
        var plans = Verbs.Select(v => (v, Moments: Enumerable.Range(0, KillsPerVerb).Select(_ => rng.NextDouble()).ToArray())).ToList();
        Parallel.ForEach(plans, new ParallelOptions { MaxDegreeOfParallelism = 2 }, plan =>
        {
            var found = KillCampaign(plan.v, corpus, Path.Combine(d.Path, plan.v.Name), plan.Moments);
            lock (problems) problems.AddRange(found.Select(f => $"{plan.v.Name}: {f}"));
        });
        Assert.True(problems.Count == 0, string.Join("\n", problems));
    }

    private static List<string> KillCampaign(Verb verb, string corpus, string work, double[] moments)
    {
        var problems = new List<string>();
        Directory.CreateDirectory(Path.Combine(work, "spill"));
        string output = Path.Combine(work, verb.Output);
        var args = verb.Args(corpus, work);

        // the reference run: how long the verb takes here and what a complete output holds
        var clock = Stopwatch.StartNew();
        var (code, err) = RunToEnd(args, verb.Name);
        double seconds = clock.Elapsed.TotalSeconds;
        if (code != 0) return [$"the reference run failed ({code}): {err}"];
        var reference = Snapshot(output);
        Delete(output);

        // a run that ends before its moment (start-up varies with the load) is not a kill: the next moment is tried, and
        // the moments are reused from the start (halved) until every verb has had its kills, at most three rounds
        int kills = 0;
        for (int i = 0; kills < moments.Length && i < 3 * moments.Length; i++)
        {
            int delayMs = (int)(moments[i % moments.Length] / (1 + i / moments.Length) * seconds * 1000);
            using var p = Start(verb.Name, args, redirectInput: false);
            Thread.Sleep(delayMs);
            bool killed = !p.HasExited && kill(p.Id, SigKill) == 0;
            p.WaitForExit();
            if (killed) { kills++; RobustnessTally.AddKill(); }
            if (!killed && p.ExitCode != 0) problems.Add($"run {i} ended by itself with {p.ExitCode}");
            if (Snapshot(output) is { } now && Incomplete(now, reference) is { } why)
            {
                problems.Add($"kill {i} at {delayMs} ms: {why}");
                RobustnessTally.AddLeftBehind(1);
            }
            // every other run starts over an earlier complete output, so replacing one is killed too
            if (i % 2 == 0) Delete(output);
        }
        if (kills < moments.Length) problems.Add($"only {kills} of {moments.Length} runs were still going at their moment");

        // the next run removes what the killed ones left (temporaries of processes that are gone)
        (code, err) = RunToEnd(args, verb.Name);
        if (code != 0) problems.Add($"the run after the kills failed ({code}): {err}");
        if (Incomplete(Snapshot(output), reference) is { } bad) problems.Add($"the run after the kills: {bad}");
        var left = Directory.EnumerateFileSystemEntries(work, "*", SearchOption.AllDirectories)
            .Where(e => e.Contains("rankfreq-tmp", StringComparison.Ordinal)).ToList();
        left = left.Where(e => !left.Any(o => o != e && e.StartsWith(o + "/", StringComparison.Ordinal))).ToList();
        RobustnessTally.AddLeftBehind(left.Count);
        if (left.Count > 0) problems.Add($"left behind after the next run: {string.Join(", ", left.Select(Path.GetFileName))}");
        return problems;
    }

    /// <summary>The output's files and, for each, whether it is whole; null when absent.</summary>
    private static Dictionary<string, string?>? Snapshot(string output)
    {
        if (File.Exists(output)) return new() { [Path.GetFileName(output)] = Whole(output) };
        if (!Directory.Exists(output)) return null;
        return Directory.GetFileSystemEntries(output).ToDictionary(f => Path.GetFileName(f), f => File.Exists(f) ? Whole(f) : "a folder inside")!;
    }

    private static string? Incomplete(Dictionary<string, string?>? now, Dictionary<string, string?>? reference)
    {
        if (now is null) return reference is null ? null : "absent";
        if (now.FirstOrDefault(kv => kv.Value is not null) is { Key: not null } broken) return $"{broken.Key}: {broken.Value}";
        if (reference is null) return null;
        var missing = reference.Keys.Except(now.Keys).ToList();
        var extra = now.Keys.Except(reference.Keys).ToList();
        if (missing.Count > 0 || extra.Count > 0)
            return $"the folder is not complete (missing {string.Join(",", missing)}; extra {string.Join(",", extra)})";
        return null;
    }

    /// <summary>Null when the file is whole by its own format's end marker, else what is wrong.</summary>
    private static string? Whole(string path)
    {
        byte[] b;
        try { b = File.ReadAllBytes(path); }
        catch (IOException e) { return e.Message; }
        string ext = Path.GetExtension(path);
        bool ok = ext switch
        {
            // Parquet files begin and end with PAR1 (Apache Parquet format specification)
            ".parquet" => b.Length >= 12 && b.AsSpan(0, 4).SequenceEqual("PAR1"u8) && b.AsSpan(b.Length - 4).SequenceEqual("PAR1"u8),
            // a PNG ends with its IEND chunk (PNG specification, ISO/IEC 15948)
            ".png" => b.Length > 12 && b.AsSpan(b.Length - 8, 4).SequenceEqual("IEND"u8),
            ".svg" => Encoding.UTF8.GetString(b).TrimEnd().EndsWith("</svg>", StringComparison.Ordinal),
            ".html" => Encoding.UTF8.GetString(b).TrimEnd().EndsWith("</html>", StringComparison.Ordinal),
            ".json" => ParsesAsJson(b),
            _ => b.Length > 0,
        };
        return ok ? null : $"partial {ext} ({b.Length} bytes)";
    }

    private static bool ParsesAsJson(byte[] b)
    {
        try { using var _ = JsonDocument.Parse(b); return true; }
        catch (JsonException) { return false; }
    }

    private static void Delete(string output)
    {
        if (File.Exists(output)) File.Delete(output);
        if (Directory.Exists(output)) Directory.Delete(output, true);
    }

    private static Process Start(string verb, string[] args, bool redirectInput)
    {
        // A runner started as a background job of a non-interactive shell ignores SIGINT, and its children inherit
        // that (POSIX), so rankfreq would rightly leave SIGINT ignored; GNU env (coreutils ≥ 8.31) restores the default
        // disposition before it execs the program (same pid), so the test measures rankfreq and not its parent.
        bool viaEnv = File.Exists("/usr/bin/env");
        var psi = new ProcessStartInfo(viaEnv ? "/usr/bin/env" : Exe)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = redirectInput,
            UseShellExecute = false,
        };
        if (viaEnv)
        {
            psi.ArgumentList.Add("--default-signal=INT");
            psi.ArgumentList.Add(Exe);
        }
        psi.ArgumentList.Add(verb);
        foreach (var a in args) psi.ArgumentList.Add(a);
        var p = Process.Start(psi)!;
        // drain the pipes so a full pipe never stalls the child
        p.OutputDataReceived += (_, _) => { };
        p.BeginOutputReadLine();
        return p;
    }

    private static (int Code, string Err) RunToEnd(string[] args, string verb)
    {
        using var p = Start(verb, args, redirectInput: false);
        string err = p.StandardError.ReadToEnd();
        p.WaitForExit();
        return (p.ExitCode, err.Trim());
    }

    /// <summary>
    /// SIGINT and SIGTERM during the work: exit 130 and 143, one line, nothing under the final name, no temporaries.
    /// Profile and contrast are stopped while fitting (work that looks at the cancellation token); count reads a pipe
    /// that stays open (a read that cannot be cancelled, so the process exits after its grace period); tokshift is
    /// stopped half-way through a run timed first. The time to exit is printed with the summary, not asserted.
    /// </summary>
    [Fact]
    public async Task SigintAndSigtermStopEveryVerbWithNothingWritten()
    {
        Assert.NotNull(fixture);
        if (!OperatingSystem.IsLinux()) return;
        using var d = new TempDir();
        string corpus = Corpus(d.Path, 1500, Seed + 1);
        var problems = new List<string>();
        var latencies = new List<double>();
        foreach (var (signal, expected) in new[] { (SigInt, 130), (SigTerm, 143) })
        {
            foreach (var verb in Verbs)
            {
                string work = Path.Combine(d.Path, $"{verb.Name}-{signal}");
                Directory.CreateDirectory(Path.Combine(work, "spill"));
                string[] args = verb.Name switch
                {
                    "count" => ["-", "-o", Path.Combine(work, "t.parquet"), "-q"],
                    "profile" => [corpus, "-o", Path.Combine(work, "p"), "-q", "--reps", "5000", "--ci-reps", "2000"],
                    "contrast" => [corpus, "--by", "field:party", "-o", Path.Combine(work, "c"), "-q", "--reps", "3000", "--boot-reps", "2000"],
                    _ => verb.Args(corpus, work),
                };
                double wait = 1.5;
                if (verb.Name == "tokshift")
                {
                    var clock = Stopwatch.StartNew();
                    var (c0, e0) = RunToEnd(args, verb.Name);
                    if (c0 != 0) { problems.Add($"tokshift reference run: {e0}"); continue; }
                    wait = clock.Elapsed.TotalSeconds / 2;
                    Delete(Path.Combine(work, verb.Output));
                }
                using var p = Start(verb.Name, args, redirectInput: verb.Name == "count");
                if (verb.Name == "count") p.StandardInput.Write(File.ReadAllText(corpus)[..20000]); // and the pipe stays open
                var errTask = p.StandardError.ReadToEndAsync();
                await Task.Delay(TimeSpan.FromSeconds(wait));
                bool sent = !p.HasExited && kill(p.Id, signal) == 0;
                var clockExit = Stopwatch.StartNew();
                // a hang check, not a timing requirement: the exit time itself is printed with the summary
                bool ended = p.WaitForExit(TimeSpan.FromSeconds(30));
                if (!ended) { p.Kill(); problems.Add($"{verb.Name}: still running 30 s after signal {signal}"); continue; }
                string err = (await errTask).Trim();
                string output = Path.Combine(work, verb.Output);
                if (!sent || (p.ExitCode == 0 && verb.Name == "tokshift"))
                {
                    // finished before the signal: then it must be whole
                    if (p.ExitCode != 0) problems.Add($"{verb.Name}: ended by itself with {p.ExitCode}: {err}");
                    continue;
                }
                RobustnessTally.AddSignal();
                latencies.Add(clockExit.Elapsed.TotalSeconds);
                if (p.ExitCode != expected) problems.Add($"{verb.Name}: signal {signal} gave exit {p.ExitCode}, not {expected}: {err}");
                if (File.Exists(output) || Directory.Exists(output)) problems.Add($"{verb.Name}: signal {signal} but {verb.Output} exists");
                var temps = Directory.EnumerateFileSystemEntries(work, "*", SearchOption.AllDirectories)
                    .Where(e => e.Contains("rankfreq-tmp", StringComparison.Ordinal)).ToList();
                if (temps.Count > 0) problems.Add($"{verb.Name}: signal {signal} left {string.Join(", ", temps.Select(Path.GetFileName))}");
                var lines = err.Split('\n', StringSplitOptions.RemoveEmptyEntries);
                if (lines.Length != 1 || !lines[0].Contains("interrupted", StringComparison.Ordinal))
                    problems.Add($"{verb.Name}: signal {signal} printed: {err}");
                if (verb.Name == "count") p.StandardInput.Close();
            }
        }
        if (latencies.Count > 0)
            RobustnessTally.NoteStopTimes(latencies);
        Assert.True(problems.Count == 0, string.Join("\n", problems));
        Assert.True(latencies.Count >= 6, $"only {latencies.Count} of 8 runs were still working when signalled");
    }
}
