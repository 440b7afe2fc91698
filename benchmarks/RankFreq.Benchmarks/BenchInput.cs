namespace RankFreq.Benchmarks;

/// <summary>The user-given input file of the benchmarks that measure a real text (environment variable
/// <see cref="Variable"/>): a path to a UTF-8 text file, e.g. a corpus of a hundred megabytes or more.</summary>
internal static class BenchInput
{
    public const string Variable = "RANKFREQ_BENCH_INPUT";

    /// <summary>Why <paramref name="benchmark"/> cannot run, or null when the input file is there.</summary>
    public static string? Problem(string benchmark)
    {
        string? path = Environment.GetEnvironmentVariable(Variable);
        if (string.IsNullOrWhiteSpace(path))
            return $"{benchmark} needs an input text: set {Variable} to a UTF-8 text file (e.g. {Variable}=corpus.txt); "
                + "without it these benchmarks fail in their setup and show NA";
        if (!File.Exists(path)) return $"{benchmark}: {Variable} names {path}, which is not a file";
        return null;
    }

    /// <summary>The input file's path; throws with the reason when it is not set or not there.</summary>
    public static string PathFor(string benchmark) =>
        Problem(benchmark) is { } problem
            ? throw new InvalidOperationException(problem)
            : Environment.GetEnvironmentVariable(Variable)!;
}
