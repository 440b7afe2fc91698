using System.Runtime.CompilerServices;
using System.Diagnostics;
using System.Text;
using RankFreq.Sources;
using RankFreq.Tokenization;
using RankFreq.Primitives;

namespace RankFreq.Counting;

/// <summary>
/// Streams inputs through a tokenizer into exact counts: one table per worker thread (parallel over files and over
/// newline-aligned ranges of large plain files), spilled as sorted runs to a temporary folder when the memory budget
/// is reached, merged exactly at the end.
/// </summary>
public static class CountEngine
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
        var sw = Stopwatch.StartNew();
        var source = settings.Source ?? new SourceOptions();
        int threads = settings.EffectiveThreads;
        // more ranges than threads, handed out one at a time, so a slow range does not leave a core idle at the end
        var units = InputPlanner.Plan(files, tokenizer.RangeCut, threads > 1 ? threads * 8 : 1, settings.SplitAboveBytes);
        long totalBytes = files.Sum(f => f.Length);
        var unitTokens = new long[units.Count];
        var spill = new SpillSet(settings.TempDirectory);
        long budget = settings.EffectiveMemory;
        var workers = new List<Worker>();
        long done = 0, stdinBytes = 0;
        using var timer = progress is null ? null : new Timer(_ =>
            progress.Report(new CountProgress(Interlocked.Read(ref done), totalBytes, workers.ToArray().Sum(w => w.Tokens), sw.Elapsed)), null, 500, 500);
        bool handedOver = false;
        try
        {
            // units handed out one at a time in corpus order, so each worker meets its units in increasing order and
            // the first time it sees a type is also that type's earliest position among its units
            var order = System.Collections.Concurrent.Partitioner.Create(units, System.Collections.Concurrent.EnumerablePartitionerOptions.NoBuffering);
            Parallel.ForEach(order,
                new ParallelOptions { MaxDegreeOfParallelism = threads, CancellationToken = ct },
                () =>
                {
                    var w = new Worker(tokenizer, spill, budget / threads);
                    lock (workers) workers.Add(w);
                    return w;
                },
                (unit, _, w) =>
                {
                    w.Begin(unit.Index);
                    InputReader.Read(unit, source, w, w.Stats, n =>
                    {
                        Interlocked.Add(ref done, n);
                        if (unit.File.IsStdin) Interlocked.Add(ref stdinBytes, n);
                    }, ct);
                    unitTokens[unit.Index] = w.End();
                    return w;
                },
                _ => { });
        }
        catch (AggregateException ae) when (ae.InnerExceptions.Count > 0)
        {
            spill.Dispose();
            var first = ae.InnerExceptions.FirstOrDefault(e => e is SourceException or TokenizerException or CountingException) ?? ae.InnerExceptions[0];
            System.Runtime.ExceptionServices.ExceptionDispatchInfo.Capture(first).Throw();
            throw;
        }
        catch
        {
            spill.Dispose();
            throw;
        }
        try
        {
            var stats = new SourceStats();
            foreach (var w in workers) stats.Add(w.Stats);
            long tokens = unitTokens.Sum();
            if (tokens == 0) throw new CountingException(NoTokens.Message(files, skipped, stats, source));
            var unitStart = new long[units.Count];
            for (int i = 1; i < units.Count; i++) unitStart[i] = unitStart[i - 1] + unitTokens[i - 1];
            var checkpoints = GrowthCurve.Checkpoints(tokens);
            var growth = new GrowthHistogram(checkpoints, unitStart);

            ICountRows rows;
            FrequencySpectrum spectrum;
            if (tokenizer.Identity == TokenIdentity.Ids)
                (rows, spectrum) = RankIds(tokenizer, workers, growth);
            else
                (rows, spectrum) = RankBuilder.Build(workers.Select(w => w.Table).ToList(), spill, budget, growth);
            var inputsInfo = files.Select(f => new InputInfo(f.Path, f.IsStdin ? Interlocked.Read(ref stdinBytes) : f.Length)).ToList();
            var summary = new CountSummary(tokenizer.Spec, tokenizer.Normalization, tokenizer.CaseRule, tokens, spectrum.TypeCount,
                stats.StoredBytes, stats.TextBytes, stats.ReplacedBytes, stats.Records, stats.MalformedRecords, stats.MissingField,
                skipped, inputsInfo, threads, spill.Runs, sw.Elapsed.TotalSeconds);
            handedOver = true;
            return new CountResult(summary, rows, spectrum, growth.ToCurve(), tokenizer.Identity == TokenIdentity.Ids);
        }
        finally
        {
            if (!handedOver) spill.Dispose();
        }
    }

    private static (ICountRows, FrequencySpectrum) RankIds(ITokenizer tok, List<Worker> workers, GrowthHistogram growth)
    {
        int v = tok.VocabularySize;
        var counts = new long[v];
        var first = new long[v];
        Array.Fill(first, long.MaxValue);
        foreach (var w in workers)
            for (int i = 0; i < v; i++)
            {
                counts[i] += w.IdCounts![i];
                if (w.IdFirst![i] < first[i]) first[i] = w.IdFirst[i];
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
    private sealed class Worker : ITokenSink, ITextSink
    {
        private readonly ITokenizerSession _session;
        private readonly SpillSet _spill;
        private readonly long _budget;
        private int _unit;
        private long _pos;
        private long _tokensBefore;

        public Worker(ITokenizer tok, SpillSet spill, long budget)
        {
            _spill = spill;
            _budget = budget;
            if (tok.Identity == TokenIdentity.Ids)
            {
                IdCounts = new long[tok.VocabularySize];
                IdFirst = new long[tok.VocabularySize];
                Array.Fill(IdFirst, long.MaxValue);
            }
            _session = tok.CreateSession(this);
        }

        public TokenTable Table { get; } = new();
        public long[]? IdCounts { get; }
        public long[]? IdFirst { get; }
        public SourceStats Stats { get; } = new();
        public long Tokens => _tokensBefore + _pos;

        public void Begin(int unit) { _unit = unit; _pos = 0; }

        public long End()
        {
            long n = _pos;
            _tokensBefore += n;
            _pos = 0;
            return n;
        }

        public void Write(ReadOnlySpan<byte> utf8, bool endOfDocument) => _session.Feed(utf8, endOfDocument);

        public void AddToken(ReadOnlySpan<byte> utf8)
        {
            Table.Add(utf8, 1, KeyPacking.PackPosition(_unit, _pos));
            if ((++_pos & 0xFFFF) == 0 && Table.MemoryBytes > _budget) _spill.Spill(Table);
        }

        public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens)
        {
            Table.AddPacked(tokens, KeyPacking.PackPosition(_unit, _pos));
            long before = _pos;
            _pos += tokens.Length;
            // memory is looked at every 65,536 tokens, as in AddToken: a run per batch would flood the spill folder
            if ((before >> 16) != (_pos >> 16) && Table.MemoryBytes > _budget) _spill.Spill(Table);
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
