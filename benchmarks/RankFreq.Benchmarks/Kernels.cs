using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>Kernels timed by BenchmarkDotNet on synthetic inputs built in the setup.</summary>
[DefaultJob("ShortRun", RunStrategy.Throughput, launchCount: 1, warmupCount: 3, iterationCount: 3)]
[MemoryDiagnoser]
public class Kernels
{
    private byte[] _text = [];
    private FrequencySpectrum _spec = null!;

    [GlobalSetup]
    public void Setup()
    {
        var rng = new Random(1);
        var words = Enumerable.Range(0, 5000).Select(i => (i % 7 == 0 ? "Ünï" : "word") + i).ToArray();
        _text = System.Text.Encoding.UTF8.GetBytes(string.Join(' ',
            Enumerable.Range(0, 400_000).Select(_ => words[(int)(Math.Pow(rng.NextDouble(), 3) * 5000)])));
        _spec = SyntheticSpectra.PowerLaw(200_000);
    }

    [Benchmark(Description = "words tokenizer + table, 1 thread, 400k words (~3.3 MB, 1 in 7 non-ASCII)")]
    public int WordsCount()
    {
        var t = new TokenTable();
        var sink = new TableSink(t);
        new WordTokenizer(false).CreateSession(sink).Feed(_text, true);
        return t.Count;
    }

    [Benchmark(Description = "Hurwitz zeta with two derivatives")]
    public double Zeta() => HurwitzZeta.Evaluate(2.1, 37).D2;

    [Benchmark(Description = "full xmin search, 2·10^5 types")]
    public double Search() => new TailSearch(_spec.Values, _spec.Types, _spec.Values.Length).Search(50).Alpha;
}
