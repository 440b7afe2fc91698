namespace RankFreq.Primitives;

/// <summary>
/// How many cores the steps of a run that are not its workers (ranking, making rows, encoding pages) may use: the
/// run's <c>--threads</c>, so that a user who asks for one thread on a shared machine gets one busy core. Set once by a
/// job; it flows with the run's async calls and tasks (an <see cref="AsyncLocal{T}"/>), so runs side by side in one
/// process keep their own limits, and it ends with the job's method.
/// </summary>
public static class CoreLimit
{
    private static readonly AsyncLocal<int> Limit = new();

    /// <summary>Limits the current run to <paramref name="threads"/> cores; 0 or less means all cores.</summary>
    public static void Set(int threads) => Limit.Value = Math.Max(0, threads);

    /// <summary>Cores the current run may use: its limit, never more than the machine has.</summary>
    public static int Cores =>
        Limit.Value > 0 ? Math.Min(Limit.Value, Environment.ProcessorCount) : Environment.ProcessorCount;

    /// <summary>Options for a parallel loop within the current run's limit.</summary>
    public static ParallelOptions Options => new() { MaxDegreeOfParallelism = Cores };
}
