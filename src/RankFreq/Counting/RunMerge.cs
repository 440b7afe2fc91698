using RankFreq.Primitives;
namespace RankFreq.Counting;

/// <summary>
/// Merges sorted runs into one sorted stream (a k-way merge on a priority queue). At most <see cref="MaxFanIn"/> runs
/// are open at once: beyond that, groups of runs are first merged into intermediate runs (records are kept, equal
/// keys stay adjacent), so any number of spills merges within the process's open-file limit.
/// </summary>
internal static class RunMerge
{
    /// <summary>Most runs read at the same time.</summary>
    public const int MaxFanIn = 128;

    /// <summary>The records of <paramref name="runs"/> in <paramref name="order"/>; <paramref name="newPath"/> names
    /// intermediate runs, which are deleted when merged.</summary>
    public static IEnumerable<RunRecord> Merge(IReadOnlyList<string> runs, IComparer<RunRecord> order, Func<string> newPath)
    {
        var level = runs.ToList();
        bool intermediate = false;
        while (level.Count > MaxFanIn)
        {
            var next = new List<string>();
            for (int i = 0; i < level.Count; i += MaxFanIn)
            {
                var group = level.GetRange(i, Math.Min(MaxFanIn, level.Count - i));
                string path = newPath();
                using (var w = new RunWriter(path))
                    foreach (var r in MergeOpen(group, order)) w.Write(r.Key, r.Count, r.First, r.Id);
                if (intermediate) foreach (var g in group) File.Delete(g);
                next.Add(path);
            }
            level = next;
            intermediate = true;
        }
        foreach (var r in MergeOpen(level, order)) yield return r;
        if (intermediate) foreach (var g in level) File.Delete(g);
    }

    private static IEnumerable<RunRecord> MergeOpen(IReadOnlyList<string> runs, IComparer<RunRecord> order)
    {
        var readers = new List<RunReader>(runs.Count);
        try
        {
            foreach (var p in runs) readers.Add(new RunReader(p)); // inside try: a failed open closes those already open
            var pq = new PriorityQueue<RunReader, RunRecord>(order);
            foreach (var r in readers) if (r.Current is { } c) pq.Enqueue(r, c);
            while (pq.TryDequeue(out var r, out var rec))
            {
                yield return rec;
                if (r.MoveNext()) pq.Enqueue(r, r.Current!);
            }
        }
        finally { foreach (var r in readers) r.Dispose(); }
    }

    /// <summary>Key order (ordinal bytes).</summary>
    public static readonly IComparer<RunRecord> ByKey = Comparer<RunRecord>.Create((a, b) => a.Key.AsSpan().SequenceCompareTo(b.Key));

    /// <summary>Rank order: count descending, ties by key bytes.</summary>
    public static readonly IComparer<RunRecord> ByRank = Comparer<RunRecord>.Create((a, b) => RankOrder.Compare(a.Count, a.Key, b.Count, b.Key));
}
