using System.IO.Compression;
using System.Reflection;
using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using Microsoft.ML.Tokenizers;
using RankFreq.Tokenization;

namespace RankFreq.Benchmarks;

/// <summary>The stages of loading o200k_base from its embedded data, each timed once in a fresh process (first-use
/// cost included): loading the data assembly and inflating the vocabulary, RankFreq's base64 parse of it, the
/// library's TiktokenTokenizer.Create from it, the first encode; and the whole SubwordTokenizer.Tiktoken load a
/// `count -t o200k_base` pays (the create and the parse run side by side there).</summary>
[DefaultJob("ColdStart", RunStrategy.ColdStart, launchCount: 5, warmupCount: 0, iterationCount: 1)]
public class O200kVocabularyLoad
{
    private byte[] _raw = [];
    private Tokenizer _tok = null!;

    // each stage's setup runs the stages before it, never the stage itself (that would warm it up)
    [GlobalSetup(Targets = [nameof(ParseBase64), nameof(CreateTokenizer)])]
    public void SetupInflated() => _raw = Inflate();

    [GlobalSetup(Target = nameof(FirstEncode))]
    public void SetupCreated() => _tok = Create(Inflate());

    [Benchmark(Description = "load data assembly + inflate")]
    public byte[] Inflate()
    {
        var data = Assembly.Load("Microsoft.ML.Tokenizers.Data.O200kBase");
        string res = data.GetManifestResourceNames()
            .First(n => n.EndsWith("o200k_base.tiktoken.deflate", StringComparison.Ordinal));
        var raw = new MemoryStream();
        using (var s = data.GetManifestResourceStream(res)!)
        using (var inflate = new DeflateStream(s, CompressionMode.Decompress)) inflate.CopyTo(raw);
        return raw.ToArray();
    }

    [Benchmark(Description = "RankFreq base64 parse")]
    public int ParseBase64() => SubwordTokenizer.ParseTiktokenBase64(_raw).Length;

    [Benchmark(Description = "TiktokenTokenizer.Create")]
    public Tokenizer CreateTokenizer() => Create(_raw);

    [Benchmark(Description = "first encode")]
    public int FirstEncode() => _tok.EncodeToIds("hello world", false, false).Count;

    [Benchmark(Description = "SubwordTokenizer.Tiktoken(\"o200k_base\"), whole")]
    public int WholeLoad() => SubwordTokenizer.Tiktoken("o200k_base").VocabularySize;

    private static Tokenizer Create(byte[] raw) =>
        TiktokenTokenizer.Create(new MemoryStream(raw), null, normalizer: null, specialTokens: null);
}
