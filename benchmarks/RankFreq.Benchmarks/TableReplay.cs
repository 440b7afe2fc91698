using System.Diagnostics;
using RankFreq.Counting;
using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>
/// `tools table-replay FILE [MB] [ROUNDS]`: the count table's own share of a one-thread count, apart from reading
/// and tokenizing. The first MB megabytes of FILE are tokenized once by the default words rule into packed tokens
/// (kept in memory); each round then adds them all to a fresh table in the tokenizer's batches, as a counting thread
/// does. Prints each round's time and the fastest (on a shared machine the fastest round is the least disturbed).
/// </summary>
internal static class TableReplay
{
    public const string Usage = "tools table-replay FILE [MB (default 120)] [ROUNDS (default 7)]";

    private sealed class Collect : ITokenSink
    {
        public readonly List<PackedToken[]> Batches = [];
        public long Other;
        public void AddToken(ReadOnlySpan<byte> utf8) => Other++;
        public void AddPackedTokens(ReadOnlySpan<PackedToken> tokens) => Batches.Add(tokens.ToArray());
        public void AddId(int id) => Other++;
    }

    public static int Run(string[] args)
    {
        if (args.Length is < 1 or > 3 || !File.Exists(args[0]))
        {
            Console.Error.WriteLine("usage: RankFreq.Benchmarks " + Usage);
            return 2;
        }
        long mb = args.Length > 1 ? long.Parse(args[1]) : 120;
        int rounds = args.Length > 2 ? int.Parse(args[2]) : 7;
        byte[] text;
        using (var f = File.OpenRead(args[0]))
        {
            text = new byte[(int)Math.Min(Math.Min(f.Length, mb << 20), Array.MaxLength)];
            f.ReadExactly(text);
        }
        var sink = new Collect();
        new WordTokenizer(false).CreateSession(sink).Feed(text, true);
        long packed = sink.Batches.Sum(b => (long)b.Length);
        Console.WriteLine($"{text.Length:N0} bytes: {packed:N0} packed tokens, {sink.Other:N0} others");
        double best = double.MaxValue;
        for (int r = 0; r < rounds; r++)
        {
            var sw = Stopwatch.StartNew();
            using var t = new TokenTable();
            long pos = 0;
            foreach (var b in sink.Batches)
            {
                t.AddPacked(b, pos);
                pos += b.Length;
            }
            long check = 0;
            foreach (ref readonly var e in t.Entries) check += e.Count;
            double s = sw.Elapsed.TotalSeconds;
            best = Math.Min(best, s);
            Console.WriteLine($"round {r + 1}: {s:F3} s, {t.Count:N0} types, {check:N0} tokens");
        }
        Console.WriteLine($"fastest: {best:F3} s ({best * 1e9 / packed:F2} ns a token)");
        return 0;
    }
}
