using System.Text;
using System.Text.Json;
using RankFreq.Tokenization;
using Xunit;

namespace RankFreq.Tests.Tokenization;

/// <summary>
/// The UTF-8 vocabulary table against the runtime's own <c>Dictionary&lt;string, int&gt;</c> and JSON reader (an
/// independent implementation of the same mapping), and the merge table against <c>Dictionary&lt;long, long&gt;</c>.
/// The whole-file behaviour is checked id for id against the reference library in TokenizerJsonTests.
/// </summary>
public class Utf8VocabularyTests
{
    [Fact]
    public void AgreesWithADictionaryOnRandomKeysThroughGrowth()
    {
        var rng = new Random(7);
        var vocab = new Utf8Vocabulary(16); // starts small: the entries and slots grow many times
        var oracle = new Dictionary<string, int>(StringComparer.Ordinal);
        string[] alphabet = ["a", "b", "Ġ", "é", "中", "😀", " ", "\n", "Ċ"];
        for (int i = 0; i < 50_000; i++)
        {
            var sb = new StringBuilder();
            int len = 1 + rng.Next(6);
            for (int k = 0; k < len; k++) sb.Append(alphabet[rng.Next(alphabet.Length)]);
            string key = sb.ToString();
            oracle[key] = i; // last wins, as JSON object properties read into a dictionary
            vocab.Set(Encoding.UTF8.GetBytes(key), i);
        }
        Assert.Equal(oracle.Count, vocab.Count);
        foreach (var (key, id) in oracle)
        {
            Assert.True(vocab.TryGet(Encoding.UTF8.GetBytes(key), out int got), key);
            Assert.Equal(id, got);
            Assert.True(vocab.TryGet(key.AsSpan(), out got));
            Assert.Equal(id, got);
        }
        for (int e = 0; e < vocab.Count; e++) Assert.Equal(oracle[vocab.Text(e)], vocab.Id(e));
        Assert.False(vocab.TryGet("zzz"u8, out _));
        Assert.Equal(oracle.Values.Max(), vocab.MaxId());
    }

    [Fact]
    public void TryAddKeepsTheFirstIdAndSetTheLast()
    {
        var v = new Utf8Vocabulary();
        v.TryAdd("x"u8, 1);
        v.TryAdd("x"u8, 2);
        Assert.True(v.TryGet("x"u8, out int id));
        Assert.Equal(1, id);
        v.Set("x"u8, 3);
        Assert.True(v.TryGet("x"u8, out id));
        Assert.Equal(3, id);
        Assert.Equal(1, v.Count);
        Assert.Equal(3, v.Id(0));
    }

    [Fact]
    public void JsonNamesAndStringsAreUnescapedAsTheJsonReaderDoes()
    {
        // escapes a tokenizer.json may hold: \u escapes of byte-level characters, quotes, backslashes, control characters
        const string json = """{"\u0120the": 1, "a\"b": 2, "c\\d": 3, "\n": 4, "plain": 5, "é": 6, "list": ["\u0120x y", "q\"r s"]}""";
        using var doc = JsonDocument.Parse(json);
        foreach (var p in doc.RootElement.EnumerateObject())
        {
            if (p.Value.ValueKind != JsonValueKind.Number) continue;
            Assert.Equal(Encoding.UTF8.GetBytes(p.Name), Utf8Vocabulary.NameBytes(p).ToArray());
        }
        foreach (var s in doc.RootElement.GetProperty("list").EnumerateArray())
            Assert.Equal(Encoding.UTF8.GetBytes(s.GetString()!), Utf8Vocabulary.StringBytes(s).ToArray());
    }

    [Fact]
    public void MergeTableAgreesWithADictionary()
    {
        var rng = new Random(11);
        var table = new PairRanks(1000);
        var oracle = new Dictionary<long, long>();
        for (int i = 0; i < 1000; i++)
        {
            // small ids, as real merges have, including the pair (0, 0) whose mixed key is 0
            long key = (long)((((ulong)(uint)rng.Next(64) << 32) | (uint)rng.Next(64)) * 0x9E3779B97F4A7C15UL);
            if (i == 0) key = 0;
            long value = ((long)i << 32) | (uint)rng.Next(1 << 20);
            oracle[key] = value;
            table.Set(key, value);
        }
        foreach (var (k, v) in oracle)
        {
            Assert.True(table.TryGetValue(k, out long got));
            Assert.Equal(v, got);
        }
        Assert.False(table.TryGetValue(12345, out _));
    }
}
