using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>Where o200k_base counting time goes, one thread, over the first 20 million characters of the file named
/// by RANKFREQ_BENCH_INPUT: the library's regex pre-tokenizer (1 MiB pieces), the hand-written splitter, a counting
/// session with the chunk cache (one block), and the library's EncodeToIds over the whole text. The vocabulary is
/// loaded and the text read in the setup. Two rounds, no warm-up (per-round times are in the log).</summary>
[Config(typeof(InputFileConfig))]
[DefaultJob("Monitoring", RunStrategy.Monitoring, launchCount: 1, warmupCount: 0, iterationCount: 2)]
public class O200kStages
{
    private const int MaxChars = 20_000_000;
    private SubwordTokenizer _tok = null!;
    private string _text = "";
    private byte[] _bytes = [];
    private long _last;

    [GlobalSetup]
    public void Setup()
    {
        string path = BenchInput.PathFor(nameof(O200kStages));
        _tok = SubwordTokenizer.Tiktoken("o200k_base");
        _text = File.ReadAllText(path);
        _text = _text[..Math.Min(_text.Length, MaxChars)];
        _bytes = System.Text.Encoding.UTF8.GetBytes(_text);
    }

    [GlobalCleanup]
    public void Report() => Console.WriteLine($"// {_text.Length:N0} characters; last result {_last:N0}");

    [Benchmark(Description = "regex pre-tokenize (result: chunks)")]
    public long PreTokenize()
    {
        var pre = _tok.Encoder.PreTokenizer!;
        long chunks = 0;
        for (int off = 0; off < _text.Length; off += Blocks.Size)
        {
            var part = _text.Substring(off, Math.Min(Blocks.Size, _text.Length - off));
            foreach (var _ in pre.PreTokenize(part)) chunks++;
        }
        return _last = chunks;
    }

    [Benchmark(Description = "hand-written split (result: chunks)")]
    public long HandWrittenSplit()
    {
        long chunks = 0;
        int p = 0;
        while (p < _text.Length)
        {
            int e = O200kSplitter.Match(_text, p);
            if (e <= p) { p++; continue; }
            chunks++;
            p = e;
        }
        return _last = chunks;
    }

    [Benchmark(Description = "counting session with the chunk cache (result: ids)")]
    public long Session()
    {
        var sink = new NullSink();
        _tok.CreateSession(sink).Feed(_bytes, true);
        return _last = sink.N;
    }

    [Benchmark(Description = "EncodeToIds over the text (result: ids)")]
    public long EncodeWhole() => _last = _tok.EncodeWhole(_text).Count;
}
