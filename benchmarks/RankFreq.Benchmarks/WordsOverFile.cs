using System.Buffers;
using System.Text.Unicode;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using RankFreq.Counting;
using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>Where the time of counting words goes, one thread, over the whole file named by RANKFREQ_BENCH_INPUT held
/// in memory: the UTF-8 check, the words tokenizer alone and with the table (1 MiB blocks, as a counting run feeds
/// it), a bare scan for ASCII letter/digit runs (the floor for any tokenizer), and the keep-case tokenizer in blocks
/// and in one block. Seven rounds after one warm-up; the Min column is the best of seven.</summary>
[Config(typeof(InputFileConfig))]
[DefaultJob("Monitoring", RunStrategy.Monitoring, launchCount: 1, warmupCount: 1, iterationCount: 7)]
[MinColumn]
public class WordsOverFile
{
    private static readonly SearchValues<byte> AsciiAlnum =
        SearchValues.Create("abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789"u8);
    private byte[] _bytes = [];
    private long _last;

    [GlobalSetup]
    public void Setup() => _bytes = File.ReadAllBytes(BenchInput.PathFor(nameof(WordsOverFile)));

    [GlobalCleanup]
    public void Report() => Console.WriteLine($"// input {_bytes.Length:N0} bytes; last result {_last:N0}");

    [Benchmark(Description = "UTF-8 check")]
    public bool Utf8Check() => Utf8.IsValid(_bytes);

    [Benchmark(Baseline = true, Description = "words tokenize only (result: tokens)")]
    public long Tokenize() => TokenizeInBlocks(keepCase: false);

    [Benchmark(Description = "words tokenize + table (result: types)")]
    public long TokenizeAndTable()
    {
        var table = new TokenTable();
        Blocks.Feed(new WordTokenizer(false).CreateSession(new TableSink(table)), _bytes);
        return _last = table.Count;
    }

    [Benchmark(Description = "bare scan for ASCII alphanumeric runs (result: runs)")]
    public long AsciiRunScan()
    {
        long runs = 0;
        int p = 0;
        ReadOnlySpan<byte> all = _bytes;
        while (true)
        {
            int k = all[p..].IndexOfAny(AsciiAlnum);
            if (k < 0) break;
            p += k;
            int e = all[p..].IndexOfAnyExcept(AsciiAlnum);
            runs++;
            if (e < 0) break;
            p += e;
        }
        return _last = runs;
    }

    [Benchmark(Description = "keep-case tokenize only")]
    public long KeepCaseTokenize() => TokenizeInBlocks(keepCase: true);

    [Benchmark(Description = "keep-case tokenize only, one block")]
    public long KeepCaseOneBlock()
    {
        var sink = new NullSink();
        new WordTokenizer(true).CreateSession(sink).Feed(_bytes, true);
        return _last = sink.N;
    }

    private long TokenizeInBlocks(bool keepCase)
    {
        var sink = new NullSink();
        Blocks.Feed(new WordTokenizer(keepCase).CreateSession(sink), _bytes);
        return _last = sink.N;
    }
}
