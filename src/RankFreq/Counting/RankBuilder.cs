using System.Text;

namespace RankFreq.Counting;

/// <summary>Turns worker tables (and spill runs) into the rank table, the spectrum and the growth histogram.</summary>
internal static class RankBuilder
{
    public static (ICountRows Rows, FrequencySpectrum Spectrum) Build(List<TokenTable> tables, SpillSet spill, long budget,
        GrowthHistogram growth, bool withIds = false)
    {
        if (spill.Phase1.Count == 0)
        {
            var all = tables.OrderByDescending(t => t.Count).ToList();
            var main = all[0];
            for (int i = 1; i < all.Count; i++) { main.MergeFrom(all[i]); all[i].Clear(); }
            var idx = main.IndicesByRank();
            var tokens = new string?[idx.Length];
            var counts = new long[idx.Length];
            var ids = withIds ? new int[idx.Length] : null;
            var entries = main.Entries;
            for (int r = 0; r < idx.Length; r++)
            {
                ref readonly var e = ref entries[idx[r]];
                counts[r] = e.Count;
                if (ids is not null) ids[r] = e.Id;
                growth.Add(e.First);
            }
            // the strings, on all cores (reads only)
            Parallel.For(0, (idx.Length + 8191) / 8192, part =>
            {
                var es = main.Entries;
                for (int r = part * 8192, end = Math.Min(idx.Length, r + 8192); r < end; r++)
                    tokens[r] = Encoding.UTF8.GetString(main.Key(es[idx[r]]));
            });
            main.Clear();
            spill.Dispose();
            return (new InMemoryRows(tokens, ids, counts), FrequencySpectrum.FromCounts(counts));
        }

        foreach (var t in tables) spill.Spill(t);
        var spectrum = new SpectrumBuilder();
        var phase2 = new List<string>();
        var buffer = new List<RunRecord>();
        long bufBytes = 0;
        void Flush()
        {
            if (buffer.Count == 0) return;
            buffer.Sort(RunMerge.ByRank);
            string path = spill.NewPath();
            using (var w = new RunWriter(path))
                foreach (var r in buffer) w.Write(r.Key, r.Count, r.First, r.Id);
            phase2.Add(path);
            buffer.Clear();
            bufBytes = 0;
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
        return (new SpilledRows(phase2, spill, withIds), spectrum.Build());

        void Emit(RunRecord r)
        {
            spectrum.Add(r.Count);
            growth.Add(r.First);
            buffer.Add(r);
            bufBytes += r.Key.Length + 96;
            if (bufBytes > budget) Flush();
        }
    }

    /// <summary>Rank-ordered rows merged from rank-sorted runs on disk; can be read once; dispose removes the runs.</summary>
    private sealed class SpilledRows(List<string> runs, SpillSet spill, bool withIds) : ICountRows
    {
        private bool _read;
        public bool Repeatable => false;

        public IEnumerable<CountRowBatch> Batches(int batchSize = 1 << 20)
        {
            if (_read) throw new InvalidOperationException("spilled rows can be read once");
            _read = true;
            long rank = 1;
            var tokens = new List<string?>(batchSize);
            var counts = new List<long>(batchSize);
            var ids = new List<int>(withIds ? batchSize : 0);
            foreach (var r in RunMerge.Merge(runs, RunMerge.ByRank, spill.NewPath))
            {
                tokens.Add(Encoding.UTF8.GetString(r.Key));
                counts.Add(r.Count);
                if (withIds) ids.Add(r.Id);
                if (counts.Count == batchSize)
                {
                    yield return new CountRowBatch(rank, tokens.ToArray(), withIds ? ids.ToArray() : null, counts.ToArray());
                    rank += counts.Count;
                    tokens.Clear(); counts.Clear(); ids.Clear();
                }
            }
            if (counts.Count > 0) yield return new CountRowBatch(rank, tokens.ToArray(), withIds ? ids.ToArray() : null, counts.ToArray());
        }

        public void Dispose() => spill.Dispose();
    }
}
