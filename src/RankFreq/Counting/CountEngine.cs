using System.Runtime.CompilerServices;
using System.Diagnostics;
using System.Text;
using RankFreq.Primitives;
using RankFreq.Sources;
using RankFreq.Tokenization;

namespace RankFreq.Counting;

/// <summary>
/// Streams inputs through a tokenizer into exact counts: one table per worker thread (parallel over files and over
/// newline-aligned ranges of large plain files), spilled as sorted runs to a temporary folder when the memory budget
/// is reached, merged exactly at the end.
/// </summary>
public static partial class CountEngine
{
    /// <summary>
    /// Counts <paramref name="files"/> (already expanded and, for a shard, selected; see the count job) with
    /// <paramref name="tokenizer"/>. Throws <see cref="SourceException"/>, <see cref="TokenizerException"/> or
    /// <see cref="CountingException"/> with a message naming the cause; on any failure or cancellation every spill
    /// run is removed before the exception leaves.
    /// </summary>
    public static CountResult Count(ITokenizer tokenizer, IReadOnlyList<InputFile> files, IReadOnlyList<SkippedFile> skipped,
        CountSettings settings, IProgress<CountProgress>? progress = null, CancellationToken ct = default)
    {
        return Rank(Run(tokenizer, files, skipped, settings, null, progress, ct));
    }

    /// <summary>Ranks a pass's tables into a count result; on failure removes the pass's spill runs.</summary>
    private static CountResult Rank(Pass pass)
    {
        bool handedOver = false;
        try
        {
            long tokens = pass.UnitTokens.Sum();
            if (tokens == 0) throw NoTokensFound(pass);
            var unitStart = new long[pass.Units.Count];
            for (int i = 1; i < pass.Units.Count; i++) unitStart[i] = unitStart[i - 1] + pass.UnitTokens[i - 1];
            var checkpoints = GrowthCurve.Checkpoints(tokens);
            var growth = new GrowthHistogram(checkpoints, unitStart);

            ICountRows rows;
            FrequencySpectrum spectrum;
            if (pass.Tokenizer.Identity == TokenIdentity.Ids)
                (rows, spectrum) = RankIds(pass.Tokenizer, pass.Workers.Select(w => (w.IdCounts!, w.IdFirst!)), growth);
            else
                (rows, spectrum) = pass.Routed is { Used: true } routed
                    ? RankBuilder.Build(routed.Tables, pass.Spill, pass.Budget, growth, disjoint: true)
                    : RankBuilder.Build(pass.Workers.Select(w => w.Table).ToList(), pass.Spill, pass.Budget, growth);
            handedOver = true;
            return new CountResult(pass.Summary(tokens, spectrum.TypeCount), rows, spectrum, growth.ToCurve(), pass.Tokenizer.Identity == TokenIdentity.Ids);
        }
        finally
        {
            if (!handedOver) pass.Spill.Dispose();
        }
    }

    /// <summary>The error of a pass that found no tokens, saying why where it can.</summary>
    private static CountingException NoTokensFound(Pass pass) =>
        new(NoTokens.Message(pass.Files, pass.Skipped, pass.Stats(), pass.Source));

    /// <summary>What one counting pass left: the workers' tables, per-unit token counts and the run's facts.</summary>
    private sealed record Pass(ITokenizer Tokenizer, IReadOnlyList<InputFile> Files, IReadOnlyList<SkippedFile> Skipped, IReadOnlyList<WorkUnit> Units,
        long[] UnitTokens, List<Worker> Workers, SpillSet Spill, long Budget, int Threads, Stopwatch Clock, SourceOptions Source,
        long[] StdinBytes, RoutedTables? Routed = null)
    {
        public SourceStats Stats()
        {
            var stats = new SourceStats();
            foreach (var w in Workers) stats.Add(w.Stats);
            return stats;
        }

        public CountSummary Summary(long tokens, long types)
        {
            var stats = Stats();
            return new CountSummary(Tokenizer.Spec, Tokenizer.Normalization, Tokenizer.CaseRule, tokens, types,
                stats.StoredBytes, stats.TextBytes, stats.ReplacedBytes, stats.Records, stats.MalformedRecords, stats.MissingField,
                Skipped, Files.Select(f => new InputInfo(f.Path, f.IsStdin ? Interlocked.Read(ref StdinBytes[0]) : f.Length)).ToList(), Threads,
                    Spill.Runs + Workers.Sum(w => w.GroupRuns), Clock.Elapsed.TotalSeconds);
        }
    }

    /// <summary>
    /// The one pass over the inputs shared by plain and grouped counting: tokenizes every work unit into per-worker
    /// tables (per group when <paramref name="groups"/> is given), spilling when over budget.
    /// </summary>
    private static Pass Run(ITokenizer tokenizer, IReadOnlyList<InputFile> files, IReadOnlyList<SkippedFile> skipped, CountSettings settings,
        GroupKey? groups, IProgress<CountProgress>? progress, CancellationToken ct)
    {
        var sw = Stopwatch.StartNew();
        var source = settings.Source ?? new SourceOptions();
        if (groups is not null) source = source with { Group = groups };
        int threads = settings.EffectiveThreads;
        // more ranges than threads, handed out one at a time, so a slow range does not leave a core idle at the end
        var units = InputPlanner.Plan(files, tokenizer.RangeCut, threads > 1 ? threads * 8 : 1, settings.SplitAboveBytes);
        long totalBytes = files.Sum(f => f.Length);
        var unitTokens = new long[units.Count];
        var spill = new SpillSet(settings.TempDirectory);
        long budget = settings.EffectiveMemory;
        var groupSpills = groups is null ? null : new System.Collections.Concurrent.ConcurrentDictionary<string, SpillSet>(StringComparer.Ordinal);
        var workers = new List<Worker>();
        // past RouteAboveTypes types in a worker's table, tokens go by hash to one table per thread (not grouped counts:
        // their tables switch per document)
        var routed = groups is null && threads > 1 && tokenizer.Identity != TokenIdentity.Ids
            ? new RoutedTables(threads, spill, budget) : null;
        long done = 0;
        var stdinBytes = new long[1];
        using var timer = progress is null ? null : new Timer(_ =>
            progress.Report(new CountProgress(Interlocked.Read(ref done), totalBytes, workers.ToArray().Sum(w => w.Tokens), sw.Elapsed)), null, 500, 500);
        try
        {
            // units handed out one at a time in corpus order, so each worker meets its units in increasing order and
            // the first time it sees a type is also that type's earliest position among its units
            var order = System.Collections.Concurrent.Partitioner.Create(units, System.Collections.Concurrent.EnumerablePartitionerOptions.NoBuffering);
            Parallel.ForEach(order,
                new ParallelOptions { MaxDegreeOfParallelism = threads, CancellationToken = ct },
                () =>
                {
                    var w = new Worker(tokenizer, spill, budget / threads,
                        groupSpills is null ? null : label => groupSpills.GetOrAdd(label, _ => new SpillSet(settings.TempDirectory)),
                        routed, settings.RouteAboveTypes);
                    lock (workers) workers.Add(w);
                    return w;
                },
                (unit, _, w) =>
                {
                    w.Begin(unit.Index);
                    if (groups is { PerFile: true }) w.BeginGroup(groups.LabelOfFile(unit.File.Path));
                    InputReader.Read(unit, source, w, w.Stats, n =>
                    {
                        Interlocked.Add(ref done, n);
                        if (unit.File.IsStdin) Interlocked.Add(ref stdinBytes[0], n);
                    }, ct);
                    unitTokens[unit.Index] = w.End();
                    return w;
                },
                _ => { });
            if (routed is { Used: true })
            {
                // what is still in batches, and the tables of workers that never switched, go to their partitions
                foreach (var w in workers) w.FinishRouting();
                foreach (var w in workers) { routed.AddTable(w.Table); w.Table.Clear(); }
            }
        }
        catch (AggregateException ae) when (ae.InnerExceptions.Count > 0)
        {
            DisposeAll(spill, groupSpills);
            var first = ae.InnerExceptions.FirstOrDefault(e => e is SourceException or TokenizerException or CountingException) ?? ae.InnerExceptions[0];
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(first).Throw();
            throw;
        }
        catch
        {
            DisposeAll(spill, groupSpills);
            throw;
        }
        return new Pass(tokenizer, files, skipped, units, unitTokens, workers, spill, budget, threads, sw, source, stdinBytes,
            routed);
    }

    private static void DisposeAll(SpillSet spill, System.Collections.Concurrent.ConcurrentDictionary<string, SpillSet>? groups)
    {
        spill.Dispose();
        if (groups is not null) foreach (var s in groups.Values) s.Dispose();
    }

    private static (ICountRows, FrequencySpectrum) RankIds(ITokenizer tok, IEnumerable<(long[] Counts, long[] First)> parts, GrowthHistogram growth)
    {
        int v = tok.VocabularySize;
        var counts = new long[v];
        var first = new long[v];
        Array.Fill(first, long.MaxValue);
        foreach (var (partCounts, partFirst) in parts)
            for (int i = 0; i < v; i++)
            {
                counts[i] += partCounts[i];
                if (partFirst[i] < first[i]) first[i] = partFirst[i];
            }
        var ids = Enumerable.Range(0, v).Where(i => counts[i] > 0).ToArray();
        var display = ids.Select(tok.DisplayToken).ToArray();
        var keys = display.Select(Encoding.UTF8.GetBytes).ToArray();
        var order = Enumerable.Range(0, ids.Length).ToArray();
        Array.Sort(order, (a, b) => RankOrder.Compare(counts[ids[a]], keys[a], counts[ids[b]], keys[b]));
        var rowTokens = order.Select(i => (string?)display[i]).ToArray();
        var rowIds = order.Select(i => ids[i]).ToArray();
        var rowCounts = order.Select(i => counts[ids[i]]).ToArray();
        foreach (int id in ids) growth.Add(first[id]);
        return (new InMemoryRows(rowTokens, rowIds, rowCounts), FrequencySpectrum.FromCounts(rowCounts));
    }

    /// <summary>One worker thread's state: its tokenizer session, table and counters.</summary>
    private sealed class Worker : ITokenSink, ITextSink, IGroupSink
    {
        private readonly ITokenizerSession _session;
        private readonly SpillSet _spill;
        private readonly long _budget;
        private readonly ITokenizer _tok;
        private readonly Func<string, SpillSet>? _groupSpill;
        private int _unit;
        private long _pos;
        private long _tokensBefore;
        private GroupPart? _group;
        private long _groupFrom;
        private readonly RoutedTables? _shared;
        private readonly int _routeAbove;
        // routing: the batch being filled per partition, full batches waiting for their partition's lock, spare ones
        private RouteBatch[]? _filling;
        private Queue<RouteBatch>[]? _waiting;
        private readonly Stack<RouteBatch> _spare = new();
        private int _waitingCount;
        /// <summary>Full batches a worker may hold back while their partitions are busy before it waits for one.</summary>
        private const int MaxWaiting = 8;

        public Worker(ITokenizer tok, SpillSet spill, long budget, Func<string, SpillSet>? groupSpill = null,
            RoutedTables? routed = null, int routeAbove = int.MaxValue)
        {
            _shared = routed;
            _routeAbove = routeAbove;
            _tok = tok;
            _spill = spill;
            _budget = budget;
            _groupSpill = groupSpill;
            if (groupSpill is not null) Groups = new Dictionary<string, GroupPart>(StringComparer.Ordinal);
            (IdCounts, IdFirst) = NewIdArrays(tok);
            _session = tok.CreateSession(this);
            Table.GrowthLimit = budget;
        }

        private static (long[]?, long[]?) NewIdArrays(ITokenizer tok)
        {
            if (tok.Identity != TokenIdentity.Ids) return (null, null);
            var first = new long[tok.VocabularySize];
            Array.Fill(first, long.MaxValue);
            return (new long[tok.VocabularySize], first);
        }

        public TokenTable Table { get; private set; } = new();
        public long[]? IdCounts { get; private set; }
        public long[]? IdFirst { get; private set; }
        public SourceStats Stats { get; } = new();
        public long Tokens => _tokensBefore + _pos;
        /// <summary>Grouped counting: this worker's table (or id arrays) per group label; null when not grouped.</summary>
        public Dictionary<string, GroupPart>? Groups { get; }
        /// <summary>Spill runs written for groups.</summary>
        public int GroupRuns { get; private set; }

        public void Begin(int unit) { _unit = unit; _pos = 0; _groupFrom = 0; }

        public long End()
        {
            long n = _pos;
            if (_group is not null) _group.Tokens += _pos - _groupFrom;
            _groupFrom = 0;
            _tokensBefore += n;
            _pos = 0;
            return n;
        }

        /// <summary>Switches to the group's table; documents only start between calls, so no token is split.</summary>
        public void BeginGroup(string label)
        {
            if (Groups is null) return;
            if (_group is not null) _group.Tokens += _pos - _groupFrom;
            if (!Groups.TryGetValue(label, out var g))
            {
                var (counts, first) = NewIdArrays(_tok);
                Groups[label] = g = new GroupPart(label, _groupSpill!(label), counts, first);
                g.Table.GrowthLimit = _budget;
            }
            g.Documents++;
            _group = g;
            _groupFrom = _pos;
            Table = g.Table; IdCounts = g.IdCounts; IdFirst = g.IdFirst;
        }

        private void CheckMemory()
        {
            if (Groups is null)
            {
                if (Table.OverBudget(_budget)) _spill.Spill(Table);
                return;
            }
            long total = 0, keys = 0;
            foreach (var g in Groups.Values) { total += g.Table.MemoryBytes; keys += g.Table.Count; }
            // as TokenTable.OverBudget: empty tables' own blocks may pass a tiny budget; runs of a few keys would not help
            if ((total <= _budget || keys < 2048) && !Table.OverLimit) return;
            foreach (var g in Groups.Values)
                if (g.Table.Count > 0) { g.Spill.Spill(g.Table); GroupRuns++; }
        }

        public void Write(ReadOnlySpan<byte> utf8, bool endOfDocument) => _session.Feed(utf8, endOfDocument);

        /// <summary>Whether tokens go to the routed partitions (this worker's table passed the routing threshold).</summary>
        private bool Routing => _filling is not null;

        private void StartRouting()
        {
            // one worker past the threshold switches them all (a worker started later begins routing at once)
            _shared!.Active = true;
            int parts = _shared.Parts;
            _filling = new RouteBatch[parts];
            _waiting = new Queue<RouteBatch>[parts];
            for (int p = 0; p < parts; p++) { _filling[p] = new RouteBatch(); _waiting[p] = new Queue<RouteBatch>(); }
            // what this worker counted so far moves to the partitions, so no type stays in two tables
            _shared.AddTable(Table);
            Table.Clear();
        }

        [MethodImpl(MethodImplOptions.AggressiveInlining)]
        private void Route(ulong a, ulong b, int len, ulong h, long first, ReadOnlySpan<byte> longKey)
        {
            int p = RoutedTables.PartOf(h, _filling!.Length);
            var batch = _filling[p];
            if (len > 16)
            {
                batch.Reserve(len);
                longKey.CopyTo(batch.LongKeys.AsSpan(batch.LongBytes));
                a = (ulong)batch.LongBytes;
                batch.LongBytes += len;
            }
            ref var t = ref batch.Tokens[batch.Count++];
            t.A = a;
            t.B = b;
            t.Hash = h;
            t.First = first;
            t.Len = len;
            if (batch.Count == RouteBatch.Size) Send(p);
        }

        /// <summary>Queues partition <paramref name="p"/>'s full batch and hands over whatever a free lock allows.</summary>
        private void Send(int p)
        {
            _waiting![p].Enqueue(_filling![p]);
            _waitingCount++;
            _filling[p] = _spare.TryPop(out var s) ? s : new RouteBatch();
            Drain(wait: _waitingCount > MaxWaiting);
        }

        private void Drain(bool wait)
        {
            var waiting = _waiting!;
            for (int q = 0; q < waiting.Length; q++)
            {
                int n = waiting[q].Count;
                if (n > 0 && _shared!.TryAdd(q, waiting[q], Recycle, wait: false)) _waitingCount -= n;
            }
            if (!wait || _waitingCount <= MaxWaiting) return;
            // every lock we need is busy and too much is held back: wait for the partition with the most batches
            int most = 0;
            for (int q = 1; q < waiting.Length; q++) if (waiting[q].Count > waiting[most].Count) most = q;
            int m = waiting[most].Count;
            _shared!.TryAdd(most, waiting[most], Recycle, wait: true);
            _waitingCount -= m;
        }

        private void Recycle(RouteBatch b)
        {
            b.Reset();
            _spare.Push(b);
        }

        /// <summary>Hands every batch still held to its partition (after counting, on one thread).</summary>
        public void FinishRouting()
        {
            if (!Routing) return;
            for (int p = 0; p < _filling!.Length; p++)
            {
                if (_filling[p].Count > 0) { _waiting![p].Enqueue(_filling[p]); _filling[p] = new RouteBatch(); }
                _shared!.TryAdd(p, _waiting![p], Recycle, wait: true);
            }
            _waitingCount = 0;
            _spare.Clear();
        }

        public void AddToken(ReadOnlySpan<byte> utf8)
        {
            if (Routing)
            {
                _ = KeyPacking.ShortWords(utf8, out ulong a, out ulong b);
                Route(a, b, utf8.Length, KeyPacking.Hash(utf8), KeyPacking.PackPosition(_unit, _pos++), utf8);
                return;
            }
            Table.Add(utf8, 1, KeyPacking.PackPosition(_unit, _pos));
            if (_shared is not null && (Table.Count >= _routeAbove || _shared.Active)) StartRouting();
            // the table says when it held back a growth to stay under the budget: spill before memory doubles
            if ((++_pos & 0xFFFF) == 0 || Table.OverLimit) CheckMemory();
        }

        public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens)
        {
            long first = KeyPacking.PackPosition(_unit, _pos);
            if (Routing)
            {
                for (int i = 0; i < tokens.Length; i++)
                {
                    ref readonly var t = ref tokens[i];
                    Route(t.Lo, t.Hi, t.Length, KeyPacking.Mix(t.Lo, t.Hi, t.Length), first + i, default);
                }
                _pos += tokens.Length;
                return;
            }
            Table.AddPacked(tokens, first);
            if (_shared is not null && (Table.Count >= _routeAbove || _shared.Active)) StartRouting();
            long before = _pos;
            _pos += tokens.Length;
            // memory is looked at every 65,536 tokens, as in AddToken: a run per batch would flood the spill folder
            if ((before >> 16) != (_pos >> 16) || Table.OverLimit) CheckMemory();
        }

        public void AddId(int id) => AddIds(new ReadOnlySpan<int>(in id));

        public void AddIds(ReadOnlySpan<int> ids)
        {
            long[] counts = IdCounts!;
            foreach (int id in ids)
            {
                if (counts[id]++ == 0) IdFirst![id] = KeyPacking.PackPosition(_unit, _pos);
                _pos++;
            }
        }
    }
}
