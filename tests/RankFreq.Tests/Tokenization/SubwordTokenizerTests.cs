using System.Text;
using RankFreq.Counting;
using RankFreq.Tokenization;
using Xunit;
using RankFreq.Jobs;

namespace RankFreq.Tests.Tokenization;

public class SubwordTokenizerTests
{
    internal static List<int> ViaSession(SubwordTokenizer tok, string text, int block = 1 << 30)
    {
        var sink = new ListSink();
        var s = tok.CreateSession(sink);
        var bytes = Encoding.UTF8.GetBytes(text);
        for (int pos = 0; pos < bytes.Length; pos += block)
        {
            int n = Math.Min(block, bytes.Length - pos);
            // blocks must end on a character boundary, as the sanitizer guarantees
            while (pos + n < bytes.Length && (bytes[pos + n] & 0xC0) == 0x80) n++;
            s.Feed(bytes.AsSpan(pos, n), false);
            pos += n - block;
        }
        s.Feed([], true);
        return sink.Ids;
    }

    [Fact]
    public void Cl100kMatchesPublishedExample()
    {
        // OpenAI cookbook "How to count tokens with tiktoken": "tiktoken is great!" → cl100k_base ids
        // [83, 1609, 5963, 374, 2294, 0] (6 tokens). Value recalled from memory of that page.
        var tok = SubwordTokenizer.Tiktoken("cl100k_base");
        Assert.Equal([83, 1609, 5963, 374, 2294, 0], ViaSession(tok, "tiktoken is great!"));
        Assert.Equal("tiktoken is great!", tok.Encoder.Decode([83, 1609, 5963, 374, 2294, 0]));
    }

    [Fact]
    public void HelloWorldIds()
    {
        // "hello world" → cl100k_base [15339, 1917]; r50k_base (GPT-2) [31373, 995]. Recalled from memory of the
        // tiktoken and GPT-2 documentation examples.
        Assert.Equal([15339, 1917], ViaSession(SubwordTokenizer.Tiktoken("cl100k_base"), "hello world"));
        Assert.Equal([31373, 995], ViaSession(SubwordTokenizer.Tiktoken("r50k_base"), "hello world"));
    }

    [Fact]
    public void SpecialTokenTextIsOrdinaryText()
    {
        var tok = SubwordTokenizer.Tiktoken("cl100k_base");
        var ids = ViaSession(tok, "end <|endoftext|> start");
        Assert.DoesNotContain(100257, ids); // the special id of <|endoftext|> in cl100k_base
        Assert.True(ids.Count > 4);
    }

    [Fact]
    public void ByteFragmentsAreShownEscapedNeverAsReplacementChar()
    {
        var tok = SubwordTokenizer.Tiktoken("o200k_base");
        var shown = Enumerable.Range(0, tok.VocabularySize).Select(tok.DisplayToken).ToList();
        Assert.DoesNotContain(shown, s => s.Contains('\uFFFD'));
        Assert.Contains(shown, s => s.Contains("\\x"));
        Assert.Equal(shown.Count, shown.Distinct(StringComparer.Ordinal).Count()); // a unique readable form per id
    }

    [CorpusTheory]
    [InlineData("o200k_base")]
    [InlineData("cl100k_base")]
    [InlineData("r50k_base")]
    public void ChunkCacheEqualsWholeTextEncodingOnRealText(string encoding)
    {
        // the first 1.5 MB of the KJV Bible ($RANKFREQ_CORPORA/kjv-bible.txt), fed in 64 KiB blocks so the
        // memory cut points are exercised: identical ids in identical order to encoding the whole text at once
        var text = File.ReadAllText(Corpora.File("kjv-bible.txt"))[..1_500_000];
        var tok = SubwordTokenizer.Tiktoken(encoding);
        // reference: the library's own standard tokenizer for the encoding, encoding the whole text (it has no special-token text)
        var whole = Microsoft.ML.Tokenizers.TiktokenTokenizer.CreateForEncoding(encoding).EncodeToIds(text);
        var cached = ViaSession(tok, text, 64 * 1024);
        Assert.Equal(whole.Count, cached.Count);
        Assert.True(whole.SequenceEqual(cached));
    }

    [Theory]
    [InlineData("cl100k_base")]
    [InlineData("o200k_base")]
    [InlineData("r50k_base")]
    public void KeptPatternsAreTheLibrarysOwn(string encoding)
    {
        var pre = Microsoft.ML.Tokenizers.TiktokenTokenizer.CreateForEncoding(encoding).PreTokenizer!;
        var field = pre.GetType().GetField("_regex", System.Reflection.BindingFlags.Instance | System.Reflection.BindingFlags.NonPublic)!;
        Assert.Equal(field.GetValue(pre)!.ToString(), SubwordTokenizer.TiktokenPatterns[encoding]);
    }

    [CorpusFact]
    public void ParallelRangesGiveTheSameIdCounts()
    {
        // ranges cut after a newline followed by an ASCII letter (a chunk boundary) must not change any id
        var path = Corpora.File("kjv-bible.txt");
        using var one = CountJob.Count([path], new CountSettings("o200k_base", Threads: 1));
        using var split = CountJob.Count([path], new CountSettings("o200k_base", Threads: 2, SplitAboveBytes: 256 << 10));
        var a = (InMemoryRows)one.Rows;
        var b = (InMemoryRows)split.Rows;
        Assert.Equal(a.TokenIds, b.TokenIds);
        Assert.Equal(a.Counts, b.Counts);
        Assert.Equal(one.Growth.Types, split.Growth.Types);
    }

    [CorpusFact]
    public void CountEngineTotalsMatchEncodeToIds()
    {
        var path = Corpora.File("reina-valera-1909.txt");
        using var r = CountJob.Count([path], new CountSettings("o200k_base", Threads: 2));
        var ids = SubwordTokenizer.Tiktoken("o200k_base").EncodeWhole(File.ReadAllText(path));
        Assert.Equal(ids.Count, r.Summary.Tokens);
        Assert.Equal(ids.Distinct().Count(), r.Summary.Types);
        var rows = (InMemoryRows)r.Rows;
        var top = ids.GroupBy(i => i).OrderByDescending(g => g.Count()).First();
        Assert.Equal(top.Key, rows.TokenIds![0]);
        Assert.Equal(top.Count(), rows.Counts[0]);
    }
}

public class TiktokenSplitterTests
{
    // The library's own pre-tokenizers are the reference (special-token text does not occur in these texts).
    private static readonly Dictionary<string, Microsoft.ML.Tokenizers.PreTokenizer> Regexes = new[] { "o200k_base", "cl100k_base", "r50k_base" }
        .ToDictionary(e => e, e => Microsoft.ML.Tokenizers.TiktokenTokenizer.CreateForEncoding(e).PreTokenizer!);

    private static void Same(string encoding, string text, string what)
    {
        var expected = Regexes[encoding].PreTokenize(text).ToList();
        var got = TiktokenSplitters.Chunks(TiktokenSplitters.For(encoding), text);
        if (expected.SequenceEqual(got)) return;
        int i = 0;
        while (i < Math.Min(expected.Count, got.Count) && expected[i] == got[i]) i++;
        string Show((int o, int l)? c) => c is { } x ? $"'{text.Substring(x.o, x.l)}' at {x.o}" : "none";
        Assert.Fail($"{encoding}, {what}: chunk {i} differs: regex {Show(i < expected.Count ? expected[i] : null)}, "
            + $"splitter {Show(i < got.Count ? got[i] : null)}");
    }

    public static readonly TheoryData<string> Encodings = new() { "o200k_base", "cl100k_base", "r50k_base" };

    private static readonly string[] EdgeCases =
    [
        "Hello world, it's HTML5 they're ÉCOLE d'été",
        "a  b\n\n  c \r\n\td   ",
        "12345 1,000,000 ١٢٣٤ ½ 1234567",
        "x/y//\n--> ... !!\n\n/ /",
        "camelCaseWord HTTPServer ǅungla ʰello",
        "emoji 👋🏽 and 𝔘𝔫𝔦𝔠𝔬𝔡𝔢 tokens",
        "e\u0301cole \u0301mark  \u0301 'S 'LL 'Re I'M 'ſ 've'll'd",
        "中文字テキスト한국어 สวัสดี",
        "  leading\tand trailing \n",
        "a\r\n\r\nb \u00A0\u2003c\u0085d",
        "$100 #tag @user ' '' ''s",
        " ",
        "\n",
        "end  ",
    ];

    [Theory]
    [MemberData(nameof(Encodings))]
    public void MatchesTheRegexOnEdgeCases(string encoding)
    {
        foreach (var t in EdgeCases) Same(encoding, t, t);
    }

    [Theory]
    [MemberData(nameof(Encodings))]
    public void MatchesTheRegexOnRandomText(string encoding)
    {
        // random strings over pieces that sit on the rules' boundaries
        string[] pieces = ["a", "Z", "é", "\u0301", "1", "٣", "½", " ", "  ", "\t", "\n", "\r", "'", "s", "LL", "ve", "-",
            "/", "!", "中", "👋", "\u00A0", "x"];
        var rng = new Random(17);
        for (int k = 0; k < 400; k++)
        {
            var text = string.Concat(Enumerable.Range(0, rng.Next(1, 40)).Select(_ => pieces[rng.Next(pieces.Length)]));
            Same(encoding, text, $"random #{k}");
        }
    }

    [CorpusTheory]
    [MemberData(nameof(Encodings))]
    public void MatchesTheRegexOnEveryUdhrTranslationAndTheLargeTexts(string encoding)
    {
        // every translation in $RANKFREQ_CORPORA/udhr plus the Bibles and the addresses, chunk for chunk
        foreach (var f in Directory.GetFiles(Corpora.File("udhr/INDEX.tsv")[..^"INDEX.tsv".Length], "*.txt"))
            Same(encoding, File.ReadAllText(f), Path.GetFileName(f));
        Same(encoding, File.ReadAllText(Corpora.File("kjv-bible.txt")), "kjv");
        Same(encoding, File.ReadAllText(Corpora.File("reina-valera-1909.txt")), "reina-valera");
        Same(encoding, File.ReadAllText(Corpora.File("sotu.jsonl"))[..3_000_000], "sotu");
    }
}
