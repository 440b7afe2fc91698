using System.Text;
using FsCheck;
using FsCheck.Fluent;
using RankFreq.Sources;
using RankFreq.Tests.Tokenization;
using RankFreq.Tokenization;
using Xunit;

namespace RankFreq.Tests.Robustness;

/// <summary>
/// Property tests (FsCheck): for every built-in tokenizer, the counts of a byte stream do not depend on where the
/// reader cuts it into blocks, invalid UTF-8 included (the sanitizer repairs it before the tokenizer sees it).
/// </summary>
public class TokenizerSplitProperties
{
    // Pieces that meet at awkward places: multi-byte letters, combining marks, emoji sequences with joiners and
    // modifiers, apostrophes, CR LF, digits next to letters, and ill-formed bytes of several classes.
    private static readonly byte[][] Pieces =
    [
        .. new[]
        {
            "a", "Zq", "word", "don't", "’", "'", " ", "  ", "\t", "\r\n", "\n", "-", ".", "1", "2024", "é", "e\u0301", "ß", "ǅ", "Ω",
            "中文", "日本", "🙂", "👩\u200D👩\u200D👧", "👍🏽", "🇫🇷", "ก", "ั", "ש", "ד", "а", "\u00A0", "\u2028",
            "x" + new string('y', 40),
        }.Select(Encoding.UTF8.GetBytes),
        [0x80], [0xC3], [0xE2, 0x82], [0xF0, 0x9F, 0x98], [0xC0, 0x80], [0xED, 0xA0, 0x80], [0xF4, 0x90, 0x80, 0x80], [0xFF],
    ];

    private static readonly Dictionary<string, ITokenizer> Tokenizers = new();

    private static ITokenizer Get(string spec)
    {
        lock (Tokenizers)
        {
            if (!Tokenizers.TryGetValue(spec, out var t)) Tokenizers[spec] = t = TokenizerFactory.Create(spec);
            return t;
        }
    }

    /// <summary>Counts of tokens (and ids) after feeding <paramref name="bytes"/> in blocks of the given sizes.</summary>
    private static Dictionary<string, int> Counts(ITokenizer tok, byte[] bytes, int[] sizes)
    {
        var sink = new ListSink();
        var sanitizer = new Utf8Sanitizer(new WordTokenizerTests.SessionTextSink(tok.CreateSession(sink)));
        int pos = 0, k = 0;
        while (pos < bytes.Length)
        {
            int n = sizes.Length == 0 ? bytes.Length : Math.Min(sizes[k++ % sizes.Length], bytes.Length - pos);
            sanitizer.Write(bytes.AsSpan(pos, n), false);
            pos += n;
        }
        sanitizer.Write([], true);
        return sink.Tokens.Concat(sink.Ids.Select(i => "#" + i)).GroupBy(t => t).ToDictionary(g => g.Key, g => g.Count());
    }

    [Theory]
    [InlineData("words")]
    [InlineData("words:keep-case")]
    [InlineData("whitespace")]
    [InlineData("chars")]
    [InlineData("cl100k_base")]
    [InlineData("o200k_base")]
    public void CountsDoNotDependOnWhereBlocksAreCut(string spec)
    {
        var tok = Get(spec);
        var text = Gen.Choose(0, Pieces.Length - 1).ArrayOf().Select(ix => ix.SelectMany(i => Pieces[i]).ToArray());
        var cuts = Gen.Choose(1, 9).ArrayOf();
        Prop.ForAll(text.ToArbitrary(), cuts.ToArbitrary(), (bytes, sizes) =>
        {
            var whole = Counts(tok, bytes, []);
            var split = Counts(tok, bytes, sizes);
            return whole.Count == split.Count && whole.All(kv => split.TryGetValue(kv.Key, out var c) && c == kv.Value);
        }).QuickCheckThrowOnFailure();
    }
}
