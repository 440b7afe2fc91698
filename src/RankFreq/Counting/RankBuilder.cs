using System.Text;

namespace RankFreq.Counting;

/// <summary>Turns worker tables (and spill runs) into the rank table, the spectrum and the growth histogram.</summary>
/// <remarks>
/// Ranking in memory needs the merged table, its sort and one string per type at once; when that would pass the
/// budget (<see cref="InMemoryBytes"/>) the tables are spilled and ranked from runs instead, so the budget holds on
/// this path too. The rank-ordered runs of the second phase are cut from a table under the same growth limit as
/// counting, and rows are read back in batches sized to the budget.
/// </remarks>
internal static class RankBuilder
{
    public static (ICountRows Rows, FrequencySpectrum Spectrum) Build(List<TokenTable> tables, SpillSet spill, long budget,
        GrowthHistogram growth, bool withIds = false, bool disjoint = false)
    {
        if (spill.Phase1.Count == 0 && InMemoryBytes(tables, disjoint) <= budget)
        {
            var filled = tables.Where(t => t.Count > 0).ToList();
            if (filled.Count > 1 && disjoint)
            {
                // partitions of a routed count: ranked side by side, merged in rank order
                var (tokensD, countsD, idsD) = SortedMerge.RankDisjoint(filled, growth, withIds);
                foreach (var t in tables) t.Clear();
                spill.Dispose();
                return (new InMemoryRows(tokensD, idsD, countsD), FrequencySpectrum.FromRankedCounts(countsD));
            }
            if (filled.Count > 1)
            {
                // several workers' tables: sorted side by side and merged in order (no hash-table merge)
                var (mergedTokens, mergedCounts, mergedIds) = SortedMerge.Rank(filled, growth, withIds);
                foreach (var t in tables) t.Clear();
                spill.Dispose();
                return (new InMemoryRows(mergedTokens, mergedIds, mergedCounts), FrequencySpectrum.FromRankedCounts(mergedCounts));
            }
            var all = tables.OrderByDescending(t => t.Count).ToList();
            var main = all[0];
            for (int i = 1; i < all.Count; i++) { main.MergeFrom(all[i]); all[i].Clear(); }
            main.FreeSlots(); // the slots are not read again: free them before the sort records are made
            var sorted = main.SortedByRank(parallel: true, consume: true);
            int n = sorted.Length;
            var counts = new long[n];
            var ids = withIds ? new int[n] : null;
            for (int r = 0; r < n; r++)
            {
                counts[r] = sorted.CountAt(r);
                if (ids is not null) ids[r] = sorted.IdAt(r);
                growth.Add(sorted.FirstAt(r));
            }
            // short keys only: the tokens come from the sort records, so the table can go before they are made
            main.ReleaseIfSortRecordsSuffice();
            // the tokens as UTF-8 chunks, on all cores (reads only), from the sort records in rank order
            var chunks = InMemoryRows.MakeChunks(n, sorted.KeyAt);
            sorted.Dispose();
            main.Clear();
            spill.Dispose();
            return (new InMemoryRows(chunks, ids, counts), FrequencySpectrum.FromRankedCounts(counts));
        }

        foreach (var t in tables) spill.Spill(t);
        var spectrum = new SpectrumBuilder();
        var phase2 = new List<string>();
        using var buffer = new TokenTable { GrowthLimit = budget };
        void Flush()
        {
            if (buffer.Count == 0) return;
            string path = spill.NewPath();
            using (var w = new RunWriter(path))
                SpillSet.WriteSorted(w, buffer, byCount: true);
            phase2.Add(path);
            buffer.Clear();
        }
        RunRecord? cur = null;
        foreach (var rec in RunMerge.Merge(spill.Phase1.ToList(), RunMerge.ByKey, spill.NewPath))
        {
            if (cur is not null && cur.Key.AsSpan().SequenceEqual(rec.Key))
            {
                cur = cur with { Count = cur.Count + rec.Count, First = Math.Min(cur.First, rec.First) };
                continue;
            }
            if (cur is not null) Emit(cur);
            cur = rec;
        }
        if (cur is not null) Emit(cur);
        Flush();
        foreach (var p in spill.Phase1) File.Delete(p);
        return (new SpilledRows(phase2, spill, withIds, BatchRows(budget)), spectrum.Build());

        void Emit(RunRecord r)
        {
            spectrum.Add(r.Count);
            growth.Add(r.First);
            buffer.Add(r.Key, r.Count, r.First, r.Id);
            if (buffer.OverBudget(budget - buffer.SortBytes)) Flush();
        }
    }

    /// <summary>
    /// Bytes that ranking <paramref name="tables"/> in memory may hold at its peak: the tables as they are (slots
    /// included, though they are freed before the sort), the sort records (40 bytes a type; none when the entries
    /// become the records in place: short keys, no ids), a placed row (20 bytes) when several tables are merged, and
    /// per type its count, id and the UTF-8 chunks (key bytes and a 4-byte start).
    /// </summary>
    internal static long InMemoryBytes(IReadOnlyList<TokenTable> tables, bool disjoint = false)
    {
        long held = 0, types = 0, keyBytes = 0;
        int filled = 0;
        bool inPlace = true;
        foreach (var t in tables)
        {
            held += t.MemoryBytes;
            types += t.Count;
            keyBytes += t.KeyBytes;
            if (t.Count > 0) filled++;
            inPlace &= t.SortsInPlace;
        }
        // one table, or disjoint partitions, are put in rank order by SortedByRank (in place when it can); several
        // workers' tables by key, never in place (SortedMerge.Rank)
        bool records = !(inPlace && (filled <= 1 || disjoint));
        long perType = 8 + 4 + 4 + (records ? 40 : 0) + (filled > 1 ? 20 : 0);
        return held + types * perType + keyBytes;
    }

    /// <summary>Rows per batch read back from rank-ordered runs: about 256 bytes of batch per row within the budget.</summary>
    internal static int BatchRows(long budget) => (int)Math.Clamp(budget / 256, 1 << 12, 1 << 20);

    /// <summary>Rank-ordered rows merged from rank-sorted runs on disk; can be read once; dispose removes the runs.</summary>
    private sealed class SpilledRows(List<string> runs, SpillSet spill, bool withIds, int maxBatch) : ICountRows
    {
        private bool _read;
        public bool Repeatable => false;

        public IEnumerable<CountRowBatch> Batches(int batchSize = 1 << 20)
        {
            if (_read) throw new InvalidOperationException("spilled rows can be read once");
            _read = true;
            batchSize = Math.Min(batchSize, maxBatch);
            long rank = 1;
            var bytes = new byte[1 << 16];
            var starts = new List<int>(batchSize + 1);
            var counts = new List<long>(batchSize);
            var ids = new List<int>(withIds ? batchSize : 0);
            int used = 0;
            CountRowBatch Take()
            {
                starts.Add(used);
                var batch = new CountRowBatch(rank, new Utf8Tokens(bytes[..used], [.. starts]), withIds ? [.. ids] : null,
                    [.. counts]);
                rank += counts.Count;
                starts.Clear(); counts.Clear(); ids.Clear();
                used = 0;
                return batch;
            }
            foreach (var r in RunMerge.Merge(runs, RunMerge.ByRank, spill.NewPath))
            {
                if (used + r.Key.Length > bytes.Length) Array.Resize(ref bytes, Math.Max(bytes.Length * 2, used + r.Key.Length));
                starts.Add(used);
                r.Key.CopyTo(bytes, used);
                used += r.Key.Length;
                counts.Add(r.Count);
                if (withIds) ids.Add(r.Id);
                if (counts.Count == batchSize)
                {
                    yield return Take();
                    // the batch just written is garbage now; collect it before the next one, so batches of a
                    // bounded-memory run do not pile up in the older generations until the collector gets to them
                    GC.Collect();
                }
            }
            if (counts.Count > 0) yield return Take();
            // read once and to the end: the runs are of no further use, so they go now rather than at dispose
            spill.Dispose();
        }

        public void Dispose() => spill.Dispose();
    }
}
