using System.Text;
using System.Text.RegularExpressions;
using RankFreq.Counting;
using RankFreq.Storage;
using Xunit;
using RankFreq.Primitives;
using RankFreq.Jobs;

namespace RankFreq.Tests.Counting;

public class CountingTests
{
    internal static List<(string? Token, long Count)> Rows(ICountRows rows) =>
        rows.Batches().SelectMany(b => b.Tokens.Zip(b.Counts)).ToList();

    [CorpusFact]
    public void KjvCountsEqualAPlainRegexCount()
    {
        // Independent count, written in the plainest way: a regex for the words rule and a dictionary.
        var path = Corpora.File("kjv-bible.txt");
        var text = File.ReadAllText(path).Normalize();
        var rx = new Regex(@"[\p{L}\p{M}\p{Nd}]+(?:['’](?=[\p{L}\p{Nd}])[\p{L}\p{M}\p{Nd}]+)*");
        var expected = new Dictionary<string, long>();
        foreach (Match m in rx.Matches(text))
        {
            var w = m.Value.ToLowerInvariant();
            expected[w] = expected.GetValueOrDefault(w) + 1;
        }
        using var r = CountJob.Count([path], new CountSettings(Threads: 2, SplitAboveBytes: 1 << 20)); // also exercises range splitting
        var got = Rows(r.Rows).ToDictionary(p => p.Token!, p => p.Count);
        Assert.Equal(expected.Count, got.Count);
        Assert.Equal(expected.Values.Sum(), r.Summary.Tokens);
        foreach (var (w, c) in expected) Assert.True(got.TryGetValue(w, out var g) && g == c, $"'{w}': expected {c}, got {g}");
    }

    [CorpusFact]
    public void RangesThreadsAndSpillGiveTheSameTable()
    {
        var path = Corpora.File("kjv-bible.txt");
        using var one = CountJob.Count([path], new CountSettings(Threads: 1));
        using var split = CountJob.Count([path], new CountSettings(Threads: 2, SplitAboveBytes: 256 << 10));
        using var d = new TempDir();
        using var spilled = CountJob.Count([path], new CountSettings(Threads: 2, MemoryBytes: 1 << 20, TempDirectory: d.Path));
        Assert.True(spilled.Summary.SpilledRuns > 2, "the tiny budget should have spilled");
        var a = Rows(one.Rows);
        Assert.Equal(a, Rows(split.Rows));
        Assert.Equal(a, Rows(spilled.Rows));
        Assert.Equal(one.Spectrum, spilled.Spectrum with { });
        Assert.Equal(one.Growth.Types, split.Growth.Types);   // corpus-order growth does not depend on the split
        Assert.Equal(one.Growth.Types, spilled.Growth.Types);
        spilled.Dispose();
        Assert.Empty(Directory.GetFileSystemEntries(d.Path)); // spill runs removed
    }

    [Theory]
    [InlineData(1 << 19)]
    [InlineData(1 << 13)]
    public void PackedAndSpanKeysMeetInOneEntry(int wideMaxSlots)
    {
        // AddShort (packed words, the hot path) and Add (bytes) must agree on every key length up to 16 and beyond,
        // including keys that differ only by trailing zero bytes, and survive rehashing: in wide slots throughout,
        // and with the switch to narrow slots (9- to 16-byte keys leave the slot) in the middle of the table's growth.
        var t = new TokenTable { WideMaxSlots = wideMaxSlots };
        var keys = new List<byte[]>();
        var rng = new Random(5);
        for (int i = 0; i < 20_000; i++)
        {
            var k = new byte[1 + rng.Next(24)];
            rng.NextBytes(k);
            keys.Add(k);
        }
        keys.Add([0x61]); keys.Add([0x61, 0]); keys.Add([0x61, 0, 0]);
        foreach (var k in keys) t.Add(k, 2, 7);
        foreach (var k in keys)
            if (k.Length <= 16)
            {
                KeyPacking.ShortWords(k, out ulong a, out ulong b);
                t.AddShort(a, b, k.Length, 99);
            }
            else t.Add(k, 1, 99);
        var distinct = keys.Select(Convert.ToHexString).Distinct().Count();
        Assert.Equal(distinct, t.Count);
        var byHex = keys.GroupBy(Convert.ToHexString).ToDictionary(g => g.Key, g => (long)g.Count());
        foreach (ref readonly var e in t.Entries)
        {
            long times = byHex[Convert.ToHexString(t.Key(e))];
            Assert.Equal(3 * times, e.Count);
            Assert.Equal(7, e.First);
        }
    }

    [Theory]
    [InlineData(1 << 19)]
    [InlineData(1 << 13)]
    public void KeysSharingAHomeSlotAreCountedApart(int wideMaxSlots)
    {
        // Keys whose hashes agree in their low 32 bits share a home slot at any table size and must still be told
        // apart: by the key words a slot holds (up to 16 bytes in wide slots, 8 in narrow ones) or by the entry's key
        // words beyond, on both the packed and the byte path, before and after the switch to narrow slots.
        var rng = new Random(21);
        // pairs of equal length, so only the key words tell them apart
        var byTag = new Dictionary<ulong, byte[]>();
        var pairs = new List<(byte[] X, byte[] Y)>();
        while (pairs.Count < 8)
        {
            var k = new byte[5 + rng.Next(12)];
            rng.NextBytes(k);
            ulong tag = (uint)KeyPacking.Hash(k) | (ulong)k.Length << 32;
            if (!byTag.TryGetValue(tag, out var other)) byTag[tag] = k;
            else if (!other.AsSpan().SequenceEqual(k)) pairs.Add((other, k));
        }
        var t = new TokenTable { WideMaxSlots = wideMaxSlots };
        var expected = new Dictionary<string, long>();
        void Count(byte[] k, int times)
        {
            KeyPacking.ShortWords(k, out ulong a, out ulong b);
            for (int i = 0; i < times; i++)
                if (i % 2 == 0) t.AddShort(a, b, k.Length, 5);
                else t.Add(k, 1, 5);
            expected[Convert.ToHexString(k)] = expected.GetValueOrDefault(Convert.ToHexString(k)) + times;
        }
        for (int i = 0; i < pairs.Count; i++)
        {
            Count(pairs[i].X, 1 + i);
            Count(pairs[i].Y, 20 + i);
        }
        // fillers force several rehashes between and after the colliding keys
        for (int i = 0; i < 50_000; i++) Count(BitConverter.GetBytes(i * 7919L + 3), 1);
        foreach (var (x, y) in pairs) { Count(x, 3); Count(y, 2); }
        Assert.Equal(expected.Count, t.Count);
        foreach (ref readonly var e in t.Entries) Assert.Equal(expected[Convert.ToHexString(t.Key(e))], e.Count);
    }

    [Theory]
    [InlineData(1, 1 << 19)]
    [InlineData(5, 1 << 19)]
    [InlineData(64, 1 << 19)]
    [InlineData(5, 1 << 12)]
    public void SlotCountsFoldIntoEntriesBeforeTheyPassTheFoldPointAndStayExact(int foldAt, int wideMaxSlots)
    {
        // A slot holds a type's count in 27 bits and folds it into the entry when it reaches the fold point; the
        // point is lowered here so folds happen every few occurrences. Counts must stay exact on every path that adds
        // (packed, routed, bytes), through rehashes and the switch to narrow slots, and no slot may ever hold more
        // than the fold point (past the 27 bits the count would run into the length code).
        var t = new TokenTable { FoldAt = (uint)foldAt, WideMaxSlots = wideMaxSlots };
        var rng = new Random(foldAt);
        var expected = new Dictionary<string, long>();
        var keys = new List<byte[]>();
        for (int i = 0; i < 3_000; i++)
        {
            var k = new byte[1 + rng.Next(i % 3 == 0 ? 30 : 8)];
            rng.NextBytes(k);
            keys.Add(k);
        }
        var routed = new List<RoutedToken>();
        var longKeys = new List<byte>();
        uint largest = 0;
        for (int step = 0; step < 60_000; step++)
        {
            // a few keys take most occurrences, so their slots pass the fold point many times
            var k = keys[step % 4 == 0 ? rng.Next(keys.Count) : rng.Next(8)];
            expected[Convert.ToHexString(k)] = expected.GetValueOrDefault(Convert.ToHexString(k)) + 1;
            bool isShort = KeyPacking.ShortWords(k, out ulong a, out ulong b);
            switch (step % 3)
            {
                case 0 when isShort: t.AddShort(a, b, k.Length, 1); break;
                case 1:
                    if (!isShort) { a = (ulong)longKeys.Count; longKeys.AddRange(k); }
                    routed.Add(new RoutedToken { A = a, B = b, Hash = KeyPacking.Hash(k), First = 1, Len = k.Length });
                    if (routed.Count == 256)
                    {
                        t.AddRouted(routed.ToArray(), longKeys.ToArray());
                        routed.Clear();
                        longKeys.Clear();
                    }
                    break;
                default: t.Add(k, 1, 1); break;
            }
            if (step % 1000 == 0) largest = Math.Max(largest, t.LargestSlotCount());
        }
        t.AddRouted(routed.ToArray(), longKeys.ToArray());
        largest = Math.Max(largest, t.LargestSlotCount());
        Assert.True(largest <= (uint)foldAt, $"a slot held {largest} occurrences, past the fold point {foldAt}");
        Assert.Equal(expected.Count, t.Count);
        foreach (ref readonly var e in t.Entries) Assert.Equal(expected[Convert.ToHexString(t.Key(e))], e.Count);
        Assert.Equal(0u, t.LargestSlotCount()); // reading the entries folded every slot
    }

    [Fact]
    public void UnderAGrowthLimitWideSlotsTurnNarrowBeforeTheyCostTypes()
    {
        // Wide slots take twice the bytes of narrow ones: under a growth limit (a worker's share of a budget) they
        // must turn narrow at the growth that would pass the limit, so the table holds as many types before it asks
        // to be spilled as one that turned narrow at its first growth. Otherwise a budgeted count writes more runs.
        const long Limit = 6L << 20;
        int HeldBeforeSpill(int wideMaxSlots)
        {
            using var t = new TokenTable { GrowthLimit = Limit, WideMaxSlots = wideMaxSlots };
            for (long i = 0; !t.OverLimit; i++) t.Add(BitConverter.GetBytes(i * 2654435761L), 1, 0);
            Assert.True(t.GrowthPeakBytes > Limit);
            return t.Count;
        }
        int narrowEarly = HeldBeforeSpill(1 << 12);
        Assert.True(narrowEarly > 50_000, $"{narrowEarly} types");
        Assert.Equal(narrowEarly, HeldBeforeSpill(1 << 19));
    }

    [Fact]
    public void OccurrencesFromEarlierWorkUnitsLowerFirstPositionsOnTheRoutedPath()
    {
        // Routed counting feeds one table from several threads, so a type may be seen in unit 7 before unit 3; its
        // first position must end as the earliest, whichever order the units arrive in, while occurrences within one
        // unit come in increasing order. Checked against a plain minimum per key.
        var rng = new Random(33);
        var keys = Enumerable.Range(0, 2_000).Select(i => Encoding.UTF8.GetBytes($"{(i % 3 == 0 ? "longer-" : "")}w{i * 37 % 1999}x{i % 7}")).ToList();
        var units = Enumerable.Range(0, 12).OrderBy(_ => rng.Next()).ToList();
        var t = new TokenTable();
        var first = new Dictionary<string, long>();
        var count = new Dictionary<string, long>();
        foreach (int unit in units)
        {
            var batch = new List<RoutedToken>();
            for (int offset = 0; offset < 3_000; offset++)
            {
                // skewed towards few keys, so most occurrences are hits of types some other unit inserted
                var k = keys[rng.Next(4) == 0 ? rng.Next(keys.Count) : rng.Next(50)];
                long pos = KeyPacking.PackPosition(unit, offset);
                string hex = Convert.ToHexString(k);
                first[hex] = Math.Min(first.GetValueOrDefault(hex, long.MaxValue), pos);
                count[hex] = count.GetValueOrDefault(hex) + 1;
                KeyPacking.ShortWords(k, out ulong a, out ulong b);
                batch.Add(new RoutedToken { A = a, B = b, Hash = KeyPacking.Hash(k), First = pos, Len = k.Length });
            }
            t.AddRouted(batch.ToArray(), default);
        }
        Assert.Equal(first.Count, t.Count);
        foreach (ref readonly var e in t.Entries)
        {
            string hex = Convert.ToHexString(t.Key(e));
            Assert.Equal(count[hex], e.Count);
            Assert.Equal(first[hex], e.First);
        }
    }

    [Fact]
    public void RankSortInPlaceMatchesAPlainOrdinalSortAndEmptiesTheTable()
    {
        // Short keys and no ids: the entries become the sort records where they lie and are placed by count in
        // place. Counts in many buckets, above the bucket range (compared), keys with zero bytes and shared prefixes.
        var rng = new Random(14);
        var t = new TokenTable();
        var seen = new HashSet<string>();
        var keys = new List<byte[]>();
        var counts = new List<long>();
        while (keys.Count < 60_000)
        {
            var k = new byte[rng.Next(1, 17)];
            for (int j = 0; j < k.Length; j++) k[j] = (byte)(rng.Next(8) == 0 ? 0 : rng.Next(97, 101));
            if (!seen.Add(Convert.ToHexString(k))) continue;
            long c = rng.Next(4) switch { 0 => rng.Next(2, 300), 1 => rng.Next(65_530, 200_000), _ => 1 };
            t.Add(k, c, keys.Count);
            keys.Add(k);
            counts.Add(c);
        }
        var cmp = Comparer<byte[]>.Create((a, b) => a.AsSpan().SequenceCompareTo(b));
        var expected = Enumerable.Range(0, keys.Count).OrderByDescending(i => counts[i]).ThenBy(i => keys[i], cmp)
            .Select(i => (counts[i], Convert.ToHexString(keys[i]), (long)i)).ToList();
        t.FreeSlots();
        using var sorted = t.SortedByRank(parallel: true, consume: true);
        Assert.Equal(0, t.Count);
        var buffer = new byte[16];
        var got = Enumerable.Range(0, sorted.Length)
            .Select(r => (sorted.CountAt(r), Convert.ToHexString(sorted.KeyAt(r, buffer)), sorted.FirstAt(r))).ToList();
        Assert.Equal(expected, got);
    }

    [Fact]
    public void Pack16EqualsAZeroPaddedCopy()
    {
        var rng = new Random(3);
        for (int n = 0; n <= 16; n++)
            for (int rep = 0; rep < 50; rep++)
            {
                var buf = new byte[n + 8];
                rng.NextBytes(buf);
                var k = buf.AsSpan(4, n); // bytes on both sides must not leak in
                var pad = new byte[16];
                k.CopyTo(pad);
                KeyPacking.Pack16(k, out ulong a, out ulong b);
                Assert.Equal(BitConverter.ToUInt64(pad, 0), a);
                Assert.Equal(BitConverter.ToUInt64(pad, 8), b);
            }
    }

    [Fact]
    public void RankAndKeyOrdersMatchAPlainOrdinalSort()
    {
        // Reference: LINQ ordering with an ordinal byte comparison. Keys share 16-byte prefixes, end in zero bytes,
        // and straddle the 16-byte packed form, with many equal counts.
        var rng = new Random(11);
        var t = new TokenTable();
        var prefix = "abcdefghijklmnop"u8.ToArray();
        var seen = new HashSet<string>();
        for (int i = 0; i < 5000; i++)
        {
            int len = rng.Next(1, 30);
            var k = new byte[len];
            for (int j = 0; j < len; j++) k[j] = (byte)(rng.Next(4) == 0 ? 0 : rng.Next(97, 100));
            if (rng.Next(3) == 0) prefix.AsSpan(0, Math.Min(16, len)).CopyTo(k);
            if (seen.Add(Convert.ToHexString(k))) t.Add(k, rng.Next(1, 4), 0);
        }
        var entries = t.Entries.ToArray();
        var keys = entries.Select(e => t.Key(e).ToArray()).ToArray();
        var cmp = Comparer<byte[]>.Create((a, b) => a.AsSpan().SequenceCompareTo(b));
        var byRank = Enumerable.Range(0, entries.Length).OrderByDescending(i => entries[i].Count).ThenBy(i => keys[i], cmp).ToArray();
        var byKey = Enumerable.Range(0, entries.Length).OrderBy(i => keys[i], cmp).ToArray();
        Assert.Equal(byRank, t.IndicesByRank());
        Assert.Equal(byKey, t.IndicesByKey());
    }

    [Theory]
    [InlineData(false)]
    [InlineData(true)]
    public void RankSortByCountBucketsAndKeyBytesMatchesAPlainOrdinalSort(bool parallel)
    {
        // The rank sort places each count bucket by key bytes, one byte at a time, before comparing: buckets large
        // enough to go through all sixteen packed bytes (and, in parallel, split across threads), keys sharing 16-byte
        // prefixes, ending in or holding zero bytes, and longer than the packed form.
        var rng = new Random(12);
        var t = new TokenTable();
        var prefix = "abcdefghijklmnop"u8.ToArray();
        var seen = new HashSet<string>();
        var keys = new List<byte[]>();
        var counts = new List<long>();
        while (keys.Count < 90_000)
        {
            int len = rng.Next(1, 30);
            var k = new byte[len];
            for (int j = 0; j < len; j++) k[j] = (byte)(rng.Next(8) == 0 ? 0 : rng.Next(97, 101));
            if (rng.Next(3) == 0) prefix.AsSpan(0, Math.Min(16, len)).CopyTo(k);
            if (!seen.Add(Convert.ToHexString(k))) continue;
            long c = rng.Next(10) == 0 ? rng.Next(2, 70_000) : 1;
            t.Add(k, c, 0);
            keys.Add(k);
            counts.Add(c);
        }
        var cmp = Comparer<byte[]>.Create((a, b) => a.AsSpan().SequenceCompareTo(b));
        var expected = Enumerable.Range(0, keys.Count).OrderByDescending(i => counts[i]).ThenBy(i => keys[i], cmp)
            .Select(i => (counts[i], Convert.ToHexString(keys[i]))).ToList();
        using var sorted = t.SortedByRank(parallel);
        var buffer = new byte[16];
        var got = Enumerable.Range(0, sorted.Length)
            .Select(r => (sorted.CountAt(r), Convert.ToHexString(sorted.KeyAt(r, buffer)))).ToList();
        Assert.Equal(expected, got);
    }

    [Fact]
    public void ManyRunsMergeInBoundedFanInAndLeaveNoIntermediateFiles()
    {
        // more runs than may be open at once: merged through intermediate runs, which are deleted; records complete and in order
        using var d = new TempDir();
        var rng = new Random(4);
        var runs = new List<string>();
        var all = new List<string>();
        int runCount = RunMerge.MaxFanIn * 2 + 7;
        for (int r = 0; r < runCount; r++)
        {
            var keys = Enumerable.Range(0, 20).Select(_ => "k" + rng.Next(5000)).Distinct(StringComparer.Ordinal).Order(StringComparer.Ordinal).ToList();
            string path = d[$"run{r}.bin"];
            using (var w = new RunWriter(path))
                foreach (var k in keys) w.Write(System.Text.Encoding.UTF8.GetBytes(k), 1, r, -1);
            runs.Add(path);
            all.AddRange(keys);
        }
        int made = 0;
        var merged = RunMerge.Merge(runs, RunMerge.ByKey, () => d[$"mid{made++}.bin"]).Select(x => System.Text.Encoding.UTF8.GetString(x.Key)).ToList();
        Assert.Equal(all.Order(StringComparer.Ordinal), merged);
        Assert.True(made >= 3, "no intermediate runs were made");
        Assert.Empty(Directory.GetFiles(d.Path, "mid*"));
        Assert.Equal(runCount, Directory.GetFiles(d.Path, "run*").Length); // the caller's runs are the caller's to delete
    }

    [Fact]
    public void GrowthIsObservedInCorpusOrder()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "x y x z");
        File.WriteAllText(d["b.txt"], "y w");
        using var r = CountJob.Count([d.Path], new CountSettings(Threads: 2));
        var g = r.Growth.Tokens.Zip(r.Growth.Types).ToDictionary(p => p.First, p => p.Second);
        Assert.Equal(1, g[1]); Assert.Equal(2, g[2]); Assert.Equal(3, g[4]); Assert.Equal(4, g[6]);
    }

    [Fact]
    public async Task MergeIsAssociativeAndShardsAddUpToTheWhole()
    {
        using var d = new TempDir();
        var rng = new Random(7);
        var words = Enumerable.Range(0, 400).Select(i => "w" + i).ToArray();
        for (int f = 0; f < 6; f++)
            File.WriteAllText(d[$"in{f}.txt"], string.Join(' ', Enumerable.Range(0, 3000)
                .Select(_ => words[(int)Math.Floor(Math.Pow(rng.NextDouble(), 3) * 400)])));
        var inputs = Enumerable.Range(0, 6).Select(f => d[$"in{f}.txt"]).ToArray();
        async Task<string> CountTo(string name, int k = 0, int n = 0, params string[] files)
        {
            using var r = CountJob.Count(files, new CountSettings(ShardIndex: k, ShardCount: n));
            var meta = CountTableMetadata.From(r.Summary, 0);
            await CountTableFile.WriteAsync(d[name], r.Rows, false, meta);
            return d[name];
        }
        var whole = await CountTo("whole.parquet", 0, 0, inputs);
        var s1 = await CountTo("s1.parquet", 1, 3, inputs);
        var s2 = await CountTo("s2.parquet", 2, 3, inputs);
        var s3 = await CountTo("s3.parquet", 3, 3, inputs);
        await MergeJob.RunAsync([s1, s2], d["s12.parquet"]);
        await MergeJob.RunAsync([d["s12.parquet"], s3], d["left.parquet"]);
        await MergeJob.RunAsync([s2, s3], d["s23.parquet"], memoryBytes: 4096, tempDir: d.Path); // spilling merge
        await MergeJob.RunAsync([s1, d["s23.parquet"]], d["right.parquet"]);
        async Task<List<(string?, long)>> Read(string p) { await using var r = await CountTableFile.OpenAsync(p); return Rows(r); }
        var w = await Read(whole);
        Assert.Equal(w, await Read(d["left.parquet"]));
        Assert.Equal(w, await Read(d["right.parquet"]));
    }

    [Fact]
    public async Task MergeRefusesDifferentTokenizers()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "Alpha beta");
        foreach (var (name, tok) in new[] { ("w.parquet", "words"), ("k.parquet", "words:keep-case") })
        {
            using var r = CountJob.Count([d["a.txt"]], new CountSettings(tok));
            var s = r.Summary;
            await CountTableFile.WriteAsync(d[name], r.Rows, false, CountTableMetadata.From(s, 0));
        }
        var e = await Assert.ThrowsAsync<StorageException>(() => MergeJob.RunAsync([d["w.parquet"], d["k.parquet"]], d["m.parquet"]));
        Assert.Contains("k.parquet", e.Message);
        Assert.False(File.Exists(d["m.parquet"]));
    }

    [CorpusFact]
    public async Task RedactionKeepsTheSpectrumAndHidesRareStrings()
    {
        using var d = new TempDir();
        using var r = CountJob.Count([Corpora.File("kjv-bible.txt")], new CountSettings());
        var s = r.Summary;
        await CountTableFile.WriteAsync(d["red.parquet"], r.Rows, false, CountTableMetadata.From(s, 5));
        await using var t = await CountTableFile.OpenAsync(d["red.parquet"]);
        Assert.Equal(r.Spectrum, t.ReadSpectrum() with { });
        var rows = Rows(t);
        Assert.All(rows.Where(x => x.Count < 5), x => Assert.Null(x.Token));
        Assert.All(rows.Where(x => x.Count >= 5), x => Assert.NotNull(x.Token));
    }
}
