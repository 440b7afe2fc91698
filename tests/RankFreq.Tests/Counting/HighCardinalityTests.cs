using System.Diagnostics;
using System.IO.Hashing;
using System.Text;
using System.Text.RegularExpressions;
using RankFreq.Counting;
using RankFreq.Jobs;
using RankFreq.Primitives;
using Xunit;

namespace RankFreq.Tests.Counting;

/// <summary>
/// Counting at high cardinality (most types rare, many seen once), in memory and under memory budgets small enough to
/// spill hundreds of runs, against the plainest possible reference: a dictionary count of the space-separated
/// tokens (common practice), ranked by count descending and then by ordinal key bytes (the rank order the design
/// notes define).
/// </summary>
public class HighCardinalityTests(HighCardinalityTests.InputFixture input) : IClassFixture<HighCardinalityTests.InputFixture>
{
    /// <summary>The shared input (600,000 tokens) and its reference rows, written once for the class.</summary>
    public sealed class InputFixture : IDisposable
    {
        private readonly TempDir _dir = new();
        public string Path { get; }
        public List<(string Token, long Count)> Rows { get; }

        public InputFixture()
        {
            string text = Text(600_000, 12);
            Path = _dir["high.txt"];
            File.WriteAllText(Path, text);
            Rows = ReferenceRows(text);
        }

        public void Dispose() => _dir.Dispose();
    }

    /// <summary>
    /// Seeded text of lower-case letter tokens: 60% heavy-tailed ranks (P(X ≥ x) = x^−1.05, spelled in bijective
    /// base 26, so a few words are very common and most are rare) and 40% random strings of 5 to 30 letters (nearly
    /// all new types; those over 16 bytes take the table's long-key path).
    /// </summary>
    internal static string Text(int tokens, int seed, int maxRandomLength = 30)
    {
        var rng = new Random(seed);
        var sb = new StringBuilder(tokens * 10);
        for (int i = 0; i < tokens; i++)
        {
            if (rng.NextDouble() < 0.6)
            {
                long r = (long)Math.Min(1e15, Math.Floor(Math.Pow(1 - rng.NextDouble(), -1 / 1.05)));
                var w = new StringBuilder();
                while (r > 0) { r--; w.Insert(0, (char)('a' + r % 26)); r /= 26; }
                sb.Append(w);
            }
            else
            {
                int len = 5 + rng.Next(maxRandomLength - 4);
                for (int j = 0; j < len; j++) sb.Append((char)('a' + rng.Next(26)));
            }
            sb.Append(i % 15 == 14 ? '\n' : ' ');
        }
        return sb.ToString();
    }

    /// <summary>The reference: a dictionary count, rows in rank order.</summary>
    internal static List<(string Token, long Count)> ReferenceRows(string text)
    {
        var counts = new Dictionary<string, long>(StringComparer.Ordinal);
        foreach (var t in text.Split([' ', '\n'], StringSplitOptions.RemoveEmptyEntries))
            counts[t] = counts.GetValueOrDefault(t) + 1;
        var rows = counts.Select(kv => (kv.Key, kv.Value)).ToList();
        // ordinal on ASCII strings is ordinal on their UTF-8 bytes
        rows.Sort((a, b) => a.Value != b.Value ? b.Value.CompareTo(a.Value) : string.CompareOrdinal(a.Key, b.Key));
        return rows;
    }

    internal static ulong RowsHash(IEnumerable<(string? Token, long Count)> rows)
    {
        var h = new XxHash64();
        long rank = 1;
        foreach (var (t, c) in rows)
        {
            h.Append(BitConverter.GetBytes(rank++));
            h.Append(BitConverter.GetBytes(c));
            h.Append(Encoding.UTF8.GetBytes(t ?? "\0"));
        }
        return h.GetCurrentHashAsUInt64();
    }

    [Theory]
    [InlineData(1, 0L)]          // in memory
    [InlineData(2, 0L)]
    [InlineData(2, 4L << 20)]    // a few runs
    [InlineData(1, 256L << 10)]  // hundreds of runs: more than one merge pass (fan-in 128)
    [InlineData(2, 256L << 10)]
    public void CountsEqualADictionaryCountAtAnyThreadCountAndBudget(int threads, long budget)
    {
        var (path, expected) = (input.Path, input.Rows);
        using var d = new TempDir();
        // ranges of 64 KiB: many work units, so each worker's table sees many units and spills between them
        using var r = CountJob.Count([path], new CountSettings(Threads: threads, MemoryBytes: budget, TempDirectory: d.Path,
            SplitAboveBytes: 64 << 10));
        var got = CountingTests.Rows(r.Rows);
        Assert.True(expected.Count > 200_000, $"the input should be high-cardinality ({expected.Count} types)");
        Assert.Equal(expected.Count, r.Summary.Types);
        Assert.Equal(expected.Sum(x => x.Count), r.Summary.Tokens);
        Assert.Equal(expected.Take(100).Select(x => ((string?)x.Token, x.Count)), got.Take(100));
        Assert.Equal(RowsHash(expected.Select(x => ((string?)x.Token, x.Count))), RowsHash(got));
        Assert.Equal(expected.Count(x => x.Count == 1), r.Spectrum.Values[0] == 1 ? r.Spectrum.Types[0] : 0);
        if (budget == 256L << 10) Assert.True(r.Summary.SpilledRuns >= 200, $"only {r.Summary.SpilledRuns} runs");
        if (budget == 0) Assert.Equal(0, r.Summary.SpilledRuns);
        r.Dispose();
        Assert.Empty(Directory.GetFileSystemEntries(d.Path)); // every run removed
    }

    /// <summary>Types seen by each checkpoint in corpus order, from the text itself.</summary>
    internal static long[] ReferenceGrowth(string text, long[] checkpoints)
    {
        var seen = new HashSet<string>(StringComparer.Ordinal);
        var types = new long[checkpoints.Length];
        long n = 0;
        int c = 0;
        foreach (var t in text.Split([' ', '\n'], StringSplitOptions.RemoveEmptyEntries))
        {
            seen.Add(t);
            n++;
            while (c < checkpoints.Length && checkpoints[c] == n) types[c++] = seen.Count;
        }
        return types;
    }

    [Theory]
    [InlineData(2, 0L, 1000, "words")]         // routed by hash after 1,000 types, in memory
    [InlineData(3, 0L, 1, "words")]            // three partitions, routed from the first type on
    [InlineData(2, 0L, 1, "whitespace")]       // every token through AddToken (no packed batches)
    [InlineData(2, 4L << 20, 1000, "words")]   // partitions spilled under a budget
    [InlineData(2, 256L << 10, 1, "words")]    // hundreds of runs
    public void RoutedCountsEqualADictionaryCountWithExactGrowth(int threads, long budget, int routeAbove, string tokenizer)
    {
        var (path, expected) = (input.Path, input.Rows);
        using var d = new TempDir();
        using var r = CountJob.Count([path], new CountSettings(Tokenizer: tokenizer, Threads: threads, MemoryBytes: budget,
            TempDirectory: d.Path, SplitAboveBytes: 64 << 10, RouteAboveTypes: routeAbove));
        var got = CountingTests.Rows(r.Rows);
        Assert.Equal(expected.Count, r.Summary.Types);
        Assert.Equal(expected.Sum(x => x.Count), r.Summary.Tokens);
        Assert.Equal(RowsHash(expected.Select(x => ((string?)x.Token, x.Count))), RowsHash(got));
        // first positions stay exact although several threads feed each partition's table in any order
        Assert.Equal(ReferenceGrowth(File.ReadAllText(path), r.Growth.Tokens), r.Growth.Types);
        if (budget == 256L << 10) Assert.True(r.Summary.SpilledRuns >= 100, $"only {r.Summary.SpilledRuns} runs");
        if (budget == 0) Assert.Equal(0, r.Summary.SpilledRuns);
        r.Dispose();
        Assert.Empty(Directory.GetFileSystemEntries(d.Path));
    }

    [Theory]
    [InlineData(1)]
    [InlineData(2)]
    public void ShortKeysOnlyRankFromSortRecordsAlone(int threads)
    {
        // every key ≤ 16 bytes: the tables are freed before the strings are made (only the sort records are read)
        using var d = new TempDir();
        string text = Text(300_000, 5, maxRandomLength: 16);
        File.WriteAllText(d["short.txt"], text);
        var expected = ReferenceRows(text);
        using var r = CountJob.Count([d["short.txt"]], new CountSettings(Threads: threads, SplitAboveBytes: 64 << 10,
            RouteAboveTypes: 1000));
        Assert.True(expected.Count > 100_000, $"the input should be high-cardinality ({expected.Count} types)");
        Assert.Equal(RowsHash(expected.Select(x => ((string?)x.Token, x.Count))), RowsHash(CountingTests.Rows(r.Rows)));
        Assert.Equal(ReferenceGrowth(text, r.Growth.Tokens), r.Growth.Types);
    }

    [Fact]
    public void ASixteenByteKeyAndALongerOneWithItsBytesRankApartAcrossPartitions()
    {
        // One partition holds only short keys (its entries become its sort records and its table is freed), another
        // a key of 17+ bytes whose first 16 bytes are a 16-byte key of the first, with the same count: the two
        // rank-ordered streams meet at those keys and must order them (the shorter first) without the freed table.
        const string prefix = "abcdefghijklmnop";
        int partOfPrefix = RoutedTables.PartOf(KeyPacking.Hash(Encoding.UTF8.GetBytes(prefix)), 2);
        string longer = Enumerable.Range(0, 26 * 26).Select(i => prefix + (char)('a' + i / 26) + (char)('a' + i % 26))
            .First(w => RoutedTables.PartOf(KeyPacking.Hash(Encoding.UTF8.GetBytes(w)), 2) != partOfPrefix);
        var rng = new Random(8);
        var words = new List<string>();
        var fillers = new HashSet<string>();
        while (fillers.Count < 3000)
        {
            var w = new string(Enumerable.Range(0, rng.Next(3, 11)).Select(_ => (char)rng.Next('a', 'z' + 1)).ToArray());
            if (fillers.Add(w)) words.Add(w);
        }
        for (int i = 0; i < 3; i++) { words.Add(prefix); words.Add(longer); }
        using var d = new TempDir();
        string text = string.Join(' ', words.OrderBy(_ => rng.Next())) + "\n";
        File.WriteAllText(d["meet.txt"], text);
        var expected = ReferenceRows(text);
        using var r = CountJob.Count([d["meet.txt"]], new CountSettings(Threads: 2, SplitAboveBytes: 4 << 10,
            RouteAboveTypes: 1));
        var got = CountingTests.Rows(r.Rows);
        Assert.Equal(RowsHash(expected.Select(x => ((string?)x.Token, x.Count))), RowsHash(got));
        Assert.Equal([prefix, longer], got.Take(2).Select(x => x.Token).ToList());
    }

    [Fact]
    public void MergerUnderATinyBudgetEqualsADictionaryCount()
    {
        // the merge verb's path: rows added one by one, spilled and ranked under the same budget rule
        var expected = input.Rows;
        using var d = new TempDir();
        using var m = new CountMerger(256 << 10, d.Path);
        var rng = new Random(3);
        // each type added in two parts, in shuffled order
        var parts = expected.SelectMany(x => x.Count == 1 ? [(x.Token, 1L)] : new[] { (x.Token, x.Count / 2), (x.Token, x.Count - x.Count / 2) })
            .OrderBy(_ => rng.Next()).ToList();
        foreach (var (t, c) in parts) m.Add(Encoding.UTF8.GetBytes(t), c);
        var (rows, spectrum) = m.Rank(withIds: false);
        using (rows)
        {
            Assert.True(m.SpilledRuns > 100, $"only {m.SpilledRuns} runs");
            Assert.Equal(expected.Count, spectrum.TypeCount);
            Assert.Equal(RowsHash(expected.Select(x => ((string?)x.Token, x.Count))), RowsHash(CountingTests.Rows(rows)));
        }
    }
}

/// <summary>Skips where the operating system's peak-RSS accounting through /usr/bin/time is not available.</summary>
public sealed class PeakRssFactAttribute : FactAttribute
{
    public PeakRssFactAttribute()
    {
        if (!OperatingSystem.IsLinux() || !File.Exists("/usr/bin/time"))
            Skip = "needs Linux and /usr/bin/time (GNU time, package 'time') to read the child's peak RSS from the kernel";
    }
}

public class MemoryBudgetProcessTests
{
    [PeakRssFact]
    public void CountUnderABudgetStaysWithinBudgetPlus200MB()
    {
        // The issue's rule: --memory B bounds peak RSS to B + 200 MB, measured outside the process. GNU time reports
        // the kernel's ru_maxrss of the child (wait4), in KiB.
        using var d = new TempDir();
        string text = HighCardinalityTests.Text(1_500_000, 21);
        File.WriteAllText(d["in.txt"], text);
        var expected = HighCardinalityTests.ReferenceRows(text);
        const long budget = 32L << 20;
        var psi = new ProcessStartInfo("/usr/bin/time")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var a in new[] { "-v", Path.Combine(AppContext.BaseDirectory, "rankfreq"), "count", d["in.txt"], "-o",
                     d["out.parquet"], "--memory", "32M", "--threads", "2", "--temp-dir", d.Path, "--json", "-q" })
            psi.ArgumentList.Add(a);
        using var p = Process.Start(psi)!;
        var stdout = p.StandardOutput.ReadToEndAsync();
        var stderr = p.StandardError.ReadToEndAsync();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, stderr.Result);
        var m = Regex.Match(stderr.Result, @"Maximum resident set size \(kbytes\): (\d+)");
        Assert.True(m.Success, "no peak RSS in: " + stderr.Result);
        long peak = long.Parse(m.Groups[1].Value) * 1024;
        Assert.True(peak <= budget + (200L << 20), $"peak RSS {peak >> 20} MiB over 32 MiB + 200 MiB");
        // it did spill, and the table is exact
        Assert.Matches(@"""spilled_runs"": ?[1-9]", stdout.Result);
        Assert.Matches($@"""types"": ?{expected.Count}\b", stdout.Result);
        using var table = RankFreq.Storage.CountTableFile.OpenAsync(d["out.parquet"]).GetAwaiter().GetResult();
        var rows = table.Batches().SelectMany(b => b.Tokens.Zip(b.Counts));
        Assert.Equal(HighCardinalityTests.RowsHash(expected.Select(x => ((string?)x.Token, x.Count))), HighCardinalityTests.RowsHash(rows));
    }
}
