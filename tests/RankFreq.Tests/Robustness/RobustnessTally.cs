using Xunit;
using Xunit.Abstractions;
using Xunit.Sdk;

namespace RankFreq.Tests.Robustness;

/// <summary>Counts kept by the robustness tests for the summary line printed when they have run.</summary>
public static class RobustnessTally
{
    private static long _fuzzed, _fuzzRuns, _kills, _signals, _leftBehind;

    /// <summary>Distinct damaged or odd inputs tried.</summary>
    public static long Fuzzed => Interlocked.Read(ref _fuzzed);
    /// <summary>Verb runs over them (an input may be read by several verbs).</summary>
    public static long FuzzRuns => Interlocked.Read(ref _fuzzRuns);
    /// <summary>Processes killed with SIGKILL.</summary>
    public static long Kills => Interlocked.Read(ref _kills);
    /// <summary>Processes stopped with SIGINT or SIGTERM.</summary>
    public static long Signals => Interlocked.Read(ref _signals);
    /// <summary>Partial files under final names, or temporaries a later run did not remove.</summary>
    public static long LeftBehind => Interlocked.Read(ref _leftBehind);

    public static void AddFuzzed(long inputs, long runs, double seconds)
    {
        Interlocked.Add(ref _fuzzed, inputs);
        Interlocked.Add(ref _fuzzRuns, runs);
        Interlocked.Exchange(ref _fuzzSeconds, seconds);
    }

    private static double _fuzzSeconds;
    public static void AddKill() => Interlocked.Increment(ref _kills);
    public static void AddSignal() => Interlocked.Increment(ref _signals);
    public static void AddLeftBehind(long n) => Interlocked.Add(ref _leftBehind, n);

    private static readonly List<double> StopTimes = [];

    /// <summary>Seconds from a SIGINT or SIGTERM to the process's exit, as measured by the test (not asserted).</summary>
    public static void NoteStopTimes(IEnumerable<double> seconds) { lock (StopTimes) StopTimes.AddRange(seconds); }

    private static string StopTimeText()
    {
        lock (StopTimes)
        {
            if (StopTimes.Count == 0) return "";
            var s = StopTimes.Order().ToList();
            return $", exit after a signal in {s[s.Count / 2]:F2} s median, {s[^1]:F2} s at most";
        }
    }

    /// <summary>The summary line (no "Passed:"/"Failed:" in it: CI sums those words from the log).</summary>
    public static string Line() =>
        $"robustness: {Fuzzed:N0} inputs fuzzed in {FuzzRuns:N0} verb runs ({Volatile.Read(ref _fuzzSeconds):F0} s), {Kills} kills (SIGKILL), {Signals} stops "
        + $"(SIGINT/SIGTERM){StopTimeText()}, files left behind: {LeftBehind}";
}

/// <summary>
/// Shared by the robustness tests; when they have all run, writes the summary line where <c>dotnet test</c> shows it
/// (an xunit diagnostic message, printed by the runner at normal verbosity) and on the test host's standard output.
/// </summary>
public sealed class RobustnessFixture(IMessageSink sink) : IDisposable
{
    public void Dispose()
    {
        if (RobustnessTally.Fuzzed + RobustnessTally.Kills + RobustnessTally.Signals == 0) return;
        string line = RobustnessTally.Line();
        sink.OnMessage(new DiagnosticMessage(line));
        Console.WriteLine(line);
    }
}

[CollectionDefinition(Name)]
public sealed class RobustnessCollection : ICollectionFixture<RobustnessFixture>
{
    public const string Name = "robustness";
}
