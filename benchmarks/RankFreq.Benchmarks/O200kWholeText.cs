using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using Microsoft.ML.Tokenizers;

namespace RankFreq.Benchmarks;

/// <summary>The baseline for o200k_base counting: the library's own tokenizer
/// (<c>TiktokenTokenizer.CreateForEncoding("o200k_base").EncodeToIds</c>) over the whole file named by
/// RANKFREQ_BENCH_INPUT, one thread. Vocabulary loading and file reading are in the setup, not timed. One call in
/// one fresh process, as before (benchmarks/peers/count-vs-unix.sh runs it once per round; --launchCount N gives N);
/// the token total is printed for comparison with `rankfreq count -t o200k_base`.</summary>
[Config(typeof(InputFileConfig))]
[DefaultJob("ColdStart", RunStrategy.ColdStart, launchCount: 1, warmupCount: 0, iterationCount: 1)]
public class O200kWholeText
{
    private Tokenizer _tok = null!;
    private string _text = "";
    private long _total;

    [GlobalSetup]
    public void Setup()
    {
        string path = BenchInput.PathFor(nameof(O200kWholeText));
        _tok = TiktokenTokenizer.CreateForEncoding("o200k_base");
        _text = File.ReadAllText(path);
    }

    [GlobalCleanup]
    public void Report() => Console.WriteLine($"// o200k_base EncodeToIds over the whole text: {_total:N0} tokens");

    [Benchmark(Description = "o200k_base EncodeToIds, whole text")]
    public long EncodeToIds() => _total = _tok.EncodeToIds(_text).Count;
}
