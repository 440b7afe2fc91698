using System.Collections.Concurrent;
using System.Diagnostics;
using RankFreq.Sources;
using RankFreq.Tokenization;

namespace RankFreq.Counting;

/// <summary>One group's share of a paired count.</summary>
/// <param name="Group">Label.</param>
/// <param name="Documents">Documents (records, or work units of a file for per-file keys) in it.</param>
/// <param name="TextBytes">UTF-8 bytes of text handed to the tokenizers.</param>
/// <param name="FirstTokens">Tokens of the first tokenizer.</param>
/// <param name="SecondTokens">Tokens of the second tokenizer.</param>
public sealed record PairedGroup(string Group, long Documents, long TextBytes, long FirstTokens, long SecondTokens);

/// <summary>The outcome of counting one text with two tokenizers in one pass. Dispose removes temporary files.</summary>
/// <param name="first">The first tokenizer's count.</param>
/// <param name="second">The second tokenizer's count.</param>
/// <param name="textBytes">UTF-8 bytes of text handed to both tokenizers (for JSON Lines and Parquet, the text
/// fields only, without the record syntax).</param>
/// <param name="groups">Per-group totals in ordinal label order; empty without a group key.</param>
public sealed class PairedCountResult(CountResult first, CountResult second, long textBytes, IReadOnlyList<PairedGroup> groups)
    : IDisposable
{
    /// <summary>The first tokenizer's count.</summary>
    public CountResult First => first;
    /// <summary>The second tokenizer's count.</summary>
    public CountResult Second => second;
    /// <summary>UTF-8 bytes of text handed to both tokenizers.</summary>
    public long TextBytes => textBytes;
    /// <summary>Per-group documents, text bytes and tokens of each tokenizer; empty without a group key.</summary>
    public IReadOnlyList<PairedGroup> Groups => groups;
    /// <inheritdoc/>
    public void Dispose()
    {
        first.Dispose();
        second.Dispose();
    }
}

public static partial class CountEngine
{
    /// <summary>
    /// Counts <paramref name="files"/> with two tokenizers in one pass: every work unit is read, decompressed,
    /// parsed and repaired once, and each block of text is handed to both tokenizers' sessions, each counting into its
    /// own tables (the same workers, tables, spill path and ranking as <see cref="Count"/>, so each side equals a
    /// <see cref="Count"/> with its tokenizer). Ranges of a large plain file are cut where both tokenizers allow.
    /// With <paramref name="groups"/>, documents, text bytes and both token totals are also kept per group (the
    /// tables stay whole-corpus). Throws as <see cref="Count"/> does; on failure every spill run is removed.
    /// </summary>
    public static PairedCountResult CountPair(ITokenizer first, ITokenizer second, IReadOnlyList<InputFile> files,
        IReadOnlyList<SkippedFile> skipped, CountSettings settings, GroupKey? groups = null,
        IProgress<CountProgress>? progress = null, CancellationToken ct = default)
    {
        var sw = Stopwatch.StartNew();
        var source = settings.Source ?? new SourceOptions();
        if (groups is not null) source = source with { Group = groups };
        int threads = settings.EffectiveThreads;
        var units = InputPlanner.Plan(files, CommonCut(first.RangeCut, second.RangeCut), threads > 1 ? threads * 8 : 1,
            settings.SplitAboveBytes);
        // fewer work units than threads (one compressed file, say): each pair of workers takes two threads, the second
        // tokenizer fed through a pipe on a thread of its own, so the cores do not wait on one unit's reader
        bool piped = threads >= 2 && units.Count < threads;
        int slots = piped ? Math.Max(1, Math.Min(units.Count, threads / 2)) : threads;
        long totalBytes = files.Sum(f => f.Length);
        var (tokensA, tokensB) = (new long[units.Count], new long[units.Count]);
        var (spillA, spillB) = (new SpillSet(settings.TempDirectory), new SpillSet(settings.TempDirectory));
        // the two tables of a worker share its part of the budget
        long budget = Math.Max(1, settings.EffectiveMemory / 2);
        var pairs = new List<PairWorker>();
        long done = 0;
        var stdinBytes = new long[1];
        using var timer = progress is null ? null : new Timer(_ => progress.Report(new CountProgress(Interlocked.Read(ref done),
            totalBytes, pairs.ToArray().Sum(p => p.A.Tokens), sw.Elapsed)), null, 500, 500);
        CountResult? a = null;
        try
        {
            Parallel.ForEach(Partitioner.Create(units, EnumerablePartitionerOptions.NoBuffering),
                new ParallelOptions { MaxDegreeOfParallelism = slots, CancellationToken = ct },
                () =>
                {
                    var b = new Worker(second, spillB, budget / slots);
                    var p = new PairWorker(new Worker(first, spillA, budget / slots), b, piped ? new BlockPipe(b, ct) : null);
                    lock (pairs) pairs.Add(p);
                    return p;
                },
                (unit, _, p) =>
                {
                    p.A.Begin(unit.Index);
                    p.OnB(() => p.B.Begin(unit.Index));
                    if (groups is { PerFile: true }) p.BeginGroup(groups.LabelOfFile(unit.File.Path));
                    InputReader.Read(unit, source, p, p.A.Stats, n =>
                    {
                        Interlocked.Add(ref done, n);
                        if (unit.File.IsStdin) Interlocked.Add(ref stdinBytes[0], n);
                    }, ct);
                    p.EndGroup();
                    tokensA[unit.Index] = p.A.End();
                    p.OnB(() => tokensB[unit.Index] = p.B.End());
                    return p;
                },
                p => p.Finish());
            foreach (var p in pairs) p.ThrowIfFaulted();
            // the reader kept one set of counters per worker; both sides report the same text
            foreach (var p in pairs) p.B.Stats.Add(p.A.Stats);
            Pass Side(ITokenizer t, long[] unitTokens, IEnumerable<Worker> workers, SpillSet spill) =>
                new(t, files, skipped, units, unitTokens, workers.ToList(), spill, budget, threads, sw, source, stdinBytes);
            a = Rank(Side(first, tokensA, pairs.Select(p => p.A), spillA));
            var b = Rank(Side(second, tokensB, pairs.Select(p => p.B), spillB));
            return new PairedCountResult(a, b, pairs.Sum(p => p.TextBytes), PairedGroups(pairs));
        }
        catch (Exception e)
        {
            foreach (var p in pairs) p.Finish();
            a?.Dispose();
            spillA.Dispose();
            spillB.Dispose();
            if (e is AggregateException { InnerExceptions.Count: > 0 } ae)
                System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(
                    ae.InnerExceptions.FirstOrDefault(x => x is SourceException or TokenizerException or CountingException)
                    ?? ae.InnerExceptions[0]).Throw();
            throw;
        }
    }

    /// <summary>A cut both tokenizers allow: none if either allows none, else the stricter rule (each rule after
    /// <see cref="RangeCut.AnyNewline"/> allows a subset of the cuts of the one before it).</summary>
    internal static RangeCut CommonCut(RangeCut x, RangeCut y) =>
        x == RangeCut.None || y == RangeCut.None ? RangeCut.None : (RangeCut)Math.Max((int)x, (int)y);

    private static List<PairedGroup> PairedGroups(IEnumerable<PairWorker> pairs) =>
        pairs.SelectMany(p => p.Groups).GroupBy(kv => kv.Key, StringComparer.Ordinal).OrderBy(g => g.Key, StringComparer.Ordinal)
            .Select(g => new PairedGroup(g.Key, g.Sum(x => x.Value[0]), g.Sum(x => x.Value[1]), g.Sum(x => x.Value[2]),
                g.Sum(x => x.Value[3])))
            .ToList();

    /// <summary>Hands each block to both workers' sessions, and keeps per-group totals when documents report a group.
    /// With a pipe, the second worker runs on the pipe's thread: everything it does goes through <see cref="OnB"/>.
    /// </summary>
    private sealed class PairWorker(Worker a, Worker b, BlockPipe? pipe) : ITextSink, IGroupSink
    {
        private long[]? _group;
        private long _bytesFrom, _aFrom, _bFrom;

        public Worker A => a;
        public Worker B => b;
        public long TextBytes { get; private set; }
        /// <summary>Label → [documents, text bytes, first tokens, second tokens].</summary>
        public Dictionary<string, long[]> Groups { get; } = new(StringComparer.Ordinal);

        public void Write(ReadOnlySpan<byte> utf8, bool endOfDocument)
        {
            TextBytes += utf8.Length;
            a.Write(utf8, endOfDocument);
            if (pipe is null) b.Write(utf8, endOfDocument);
            else pipe.Write(utf8, endOfDocument);
        }

        /// <summary>Runs a step of the second worker in order with its text: now, or on the pipe's thread.</summary>
        public void OnB(Action step)
        {
            if (pipe is null) step();
            else pipe.Post(step);
        }

        /// <summary>Waits until the second worker has taken all its text (no-op without a pipe); does not throw.</summary>
        public void Finish() => pipe?.Finish();

        /// <summary>Throws what the second worker threw on the pipe's thread, if anything.</summary>
        public void ThrowIfFaulted() => pipe?.ThrowIfFaulted();

        /// <summary>Documents start only between calls, so every token of the previous one has been counted.</summary>
        public void BeginGroup(string label)
        {
            EndGroup();
            if (!Groups.TryGetValue(label, out var g)) Groups[label] = g = new long[4];
            g[0]++;
            (_group, _bytesFrom, _aFrom) = (g, TextBytes, a.Tokens);
            OnB(() => _bFrom = b.Tokens);
        }

        public void EndGroup()
        {
            if (_group is not { } g) return;
            g[1] += TextBytes - _bytesFrom;
            g[2] += a.Tokens - _aFrom;
            // g[3] is written only on the second worker's thread, the other entries only on this one
            OnB(() => g[3] += b.Tokens - _bFrom);
            _group = null;
        }
    }
}
