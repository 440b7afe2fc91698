using RankFreq.Primitives;
using System.IO.Compression;
using System.Reflection;
using System.Text;
using System.Text.RegularExpressions;
using Microsoft.ML.Tokenizers;

namespace RankFreq.Tokenization;

/// <summary>
/// A subword vocabulary (tiktoken, BPE, SentencePiece, WordPiece) counted through a distinct-chunk cache:
/// the text is pre-tokenized into chunks, each distinct chunk is encoded once and its ids are replayed for
/// every later occurrence. Because encoders work chunk by chunk, this gives exactly the ids of encoding the
/// whole text (tested on a real corpus).
/// </summary>
/// <remarks>
/// Special-token text in a corpus (an end-of-text marker, say) is counted as ordinary text: tiktoken vocabularies
/// are built with no special tokens and the pre-tokenizer's regex is used without special-token splitting.
/// Long texts are cut for memory only after a newline followed by an ASCII letter (or, failing that, between a
/// letter and a space followed by a letter), which is a chunk boundary under the r50k, cl100k and o200k rules.
/// Vocabularies with no pre-tokenizer (SentencePiece) are encoded line by line.
/// </remarks>
public sealed class SubwordTokenizer : ITokenizer
{
    private readonly Tokenizer _tokenizer;
    private readonly PreTokenizer? _pre;
    private readonly string[] _display;
    private readonly ChunkMatcher? _splitter; // the hand-written equivalent of a tiktoken encoding's regex

    private SubwordTokenizer(string spec, Tokenizer tokenizer, PreTokenizer? pre, string[] display, ChunkMatcher? splitter = null, string[]? base64 = null)
    {
        _base64 = base64;
        Spec = spec;
        _tokenizer = tokenizer;
        _pre = pre;
        _display = display;
        _splitter = splitter;
    }

    /// <summary>The regex pre-tokenizer in use (the reference the hand-written splitters are tested against).</summary>
    public PreTokenizer? PreTokenizer => _pre;

    /// <inheritdoc/>
    public string Spec { get; }
    /// <inheritdoc/>
    public string Normalization => "none";
    /// <inheritdoc/>
    public string CaseRule => "kept";
    /// <inheritdoc/>
    public TokenIdentity Identity => TokenIdentity.Ids;
    /// <inheritdoc/>
    public int VocabularySize => _display.Length;
    private readonly string[]? _base64; // tiktoken: token bytes per id, decoded for display only when asked
    /// <inheritdoc/>
    public Sources.RangeCut RangeCut => _pre is null ? Sources.RangeCut.None
        // r50k's rule ends a whitespace run before a letter one character early, unless the text ends there
        : Spec == "r50k_base" ? Sources.RangeCut.NewlineAfterVisibleBeforeAsciiLetter
        : Sources.RangeCut.NewlineBeforeAsciiLetter;

    /// <summary>The underlying Microsoft.ML.Tokenizers encoder (used by tests and benchmarks for comparison).</summary>
    public Tokenizer Encoder => _tokenizer;

    /// <inheritdoc/>
    public string DisplayToken(int id)
    {
        if ((uint)id >= (uint)_display.Length) return $"<id {id}>";
        if (_display[id] is null && _base64 is not null)
            _display[id] = _base64[id] is { } b ? Readable(Convert.FromBase64String(b)) : $"<id {id}>";
        return _display[id];
    }

    /// <inheritdoc/>
    public ITokenizerSession CreateSession(ITokenSink sink) => new Session(this, sink);

    /// <summary>Encodes a text whole, with no cache (the reference the cache is checked against).</summary>
    public IReadOnlyList<int> EncodeWhole(string text) => _tokenizer.EncodeToIds(text, considerPreTokenization: true, considerNormalization: false);

    /// <summary>Loads a tiktoken encoding embedded in the Microsoft.ML.Tokenizers data packages.</summary>
    public static SubwordTokenizer Tiktoken(string encoding)
    {
        Assembly data = encoding switch
        {
            "cl100k_base" => Assembly.Load("Microsoft.ML.Tokenizers.Data.Cl100kBase"),
            "o200k_base" => Assembly.Load("Microsoft.ML.Tokenizers.Data.O200kBase"),
            "r50k_base" => Assembly.Load("Microsoft.ML.Tokenizers.Data.R50kBase"),
            _ => throw new TokenizerException($"unknown tiktoken encoding '{encoding}'"),
        };
        string? resource = data.GetManifestResourceNames().FirstOrDefault(n => n.EndsWith($"{encoding}.tiktoken.deflate", StringComparison.Ordinal))
            ?? throw new TokenizerException($"vocabulary data for '{encoding}' not found in its package");
        var raw = new MemoryStream();
        using (var s = data.GetManifestResourceStream(resource)!)
        using (var inflate = new DeflateStream(s, CompressionMode.Decompress))
            inflate.CopyTo(raw);

        // our id → bytes table is parsed beside the library's own load (it has no public id → bytes map)
        var file = raw.ToArray();
        var parse = Task.Run(() => ParseTiktokenBase64(file));
        // The pre-tokenizer regex without special-token splitting. Building the library's own tokenizer just to read
        // its regex would load the vocabulary a second time, so the patterns are kept here; a test checks them
        // against the library's. Counting splits with hand-written equivalents; the regex stays for whole-text
        // encoding and as the tests' reference.
        var pre = new RegexPreTokenizer(new Regex(TiktokenPatterns[encoding], RegexOptions.None), null);
        raw.Position = 0;
        var tok = TiktokenTokenizer.Create(raw, pre, normalizer: null, specialTokens: null);
        var base64 = parse.GetAwaiter().GetResult();
        return new SubwordTokenizer(encoding, tok, pre, new string[base64.Length], TiktokenSplitters.For(encoding), base64);
    }

    /// <summary>The pre-tokenizer patterns of Microsoft.ML.Tokenizers 2.0.1 for the embedded encodings.</summary>
    internal static readonly IReadOnlyDictionary<string, string> TiktokenPatterns = new Dictionary<string, string>
    {
        ["cl100k_base"] = @"'(?i:[sdmt]|ll|ve|re)|(?>[^\r\n\p{L}\p{N}]?)(?>\p{L}+)|(?>\p{N}{1,3})"
            + @"| ?(?>[^\s\p{L}\p{N}]+)(?>[\r\n]*)|(?>\s+)$|\s*[\r\n]|\s+(?!\S)|\s",
        ["r50k_base"] = @"'(?:[sdmt]|ll|ve|re)| ?(?>\p{L}+)| ?(?>\p{N}+)| ?(?>[^\s\p{L}\p{N}]+)|(?>\s+)$|\s+(?!\S)|\s",
        ["o200k_base"] = O200kSplitter.Pattern,
    };

    /// <summary>A byte-level BPE vocabulary from a vocab.json and merges.txt pair.</summary>
    public static SubwordTokenizer Bpe(string vocabPath, string mergesPath)
    {
        RequireFile(vocabPath); RequireFile(mergesPath);
        try
        {
            var tok = BpeTokenizer.Create(vocabPath, mergesPath, PreTokenizer.CreateWordOrNonWord(), null, null, null, null, null, false);
            var display = Invert(tok.Vocabulary.Select(kv => (kv.Key, kv.Value)));
            return new SubwordTokenizer($"bpe:{vocabPath},{mergesPath}", tok, tok.PreTokenizer, display);
        }
        catch (Exception e) when (e is not TokenizerException)
        {
            throw new TokenizerException($"{vocabPath}: not a usable BPE vocabulary/merges pair ({e.Message})", e);
        }
    }

    /// <summary>A SentencePiece model file.</summary>
    public static SubwordTokenizer SentencePiece(string modelPath)
    {
        RequireFile(modelPath);
        try
        {
            using var s = File.OpenRead(modelPath);
            var tok = SentencePieceTokenizer.Create(s, false, false);
            var display = Invert(tok.Vocabulary.Select(kv => (kv.Key, kv.Value)));
            return new SubwordTokenizer($"sentencepiece:{modelPath}", tok, null, display);
        }
        catch (Exception e) when (e is not TokenizerException)
        {
            throw new TokenizerException($"{modelPath}: not a usable SentencePiece model ({e.Message})", e);
        }
    }

    /// <summary>A WordPiece vocabulary, one token a line (line number = id).</summary>
    public static SubwordTokenizer WordPiece(string vocabPath)
    {
        RequireFile(vocabPath);
        try
        {
            var lines = File.ReadAllLines(vocabPath);
            if (lines.Length == 0) throw new TokenizerException($"{vocabPath}: empty WordPiece vocabulary");
            var tok = WordPieceTokenizer.Create(vocabPath, new WordPieceOptions());
            return new SubwordTokenizer($"wordpiece:{vocabPath}", tok, tok.PreTokenizer, lines);
        }
        catch (Exception e) when (e is not TokenizerException)
        {
            throw new TokenizerException($"{vocabPath}: not a usable WordPiece vocabulary ({e.Message})", e);
        }
    }

    private static void RequireFile(string path)
    {
        if (!File.Exists(path)) throw new TokenizerException($"{path}: vocabulary file not found");
    }

    private static string[] Invert(IEnumerable<(string Token, int Id)> vocab)
    {
        var list = vocab.ToList();
        int max = list.Count == 0 ? -1 : list.Max(p => p.Id);
        var arr = new string[max + 1];
        for (int i = 0; i < arr.Length; i++) arr[i] = $"<id {i}>";
        foreach (var (t, id) in list) if (id >= 0) arr[id] = t;
        return arr;
    }

    /// <summary>
    /// Parses a tiktoken vocabulary into the base64 form of each id's bytes: "base64 rank" lines, or (the packaged form)
    /// a "Capacity: N" line followed by one base64 token a line with the rank implied by position.
    /// </summary>
    internal static string[] ParseTiktokenBase64(byte[] file)
    {
        var text = Encoding.ASCII.GetString(file);
        var pairs = new List<(int, string)>();
        int implicitRank = 0;
        bool implicitRanks = false;
        foreach (var rawLine in text.Split('\n'))
        {
            var line = rawLine.Trim();
            if (line.Length == 0) continue;
            if (line.StartsWith("Capacity:", StringComparison.Ordinal)) { implicitRanks = true; continue; }
            int sp = line.IndexOf(' ');
            if (implicitRanks && sp < 0) { pairs.Add((implicitRank++, line)); continue; }
            if (sp <= 0) continue;
            pairs.Add((int.Parse(line.AsSpan(sp + 1)), line[..sp]));
        }
        var arr = new string[pairs.Max(p => p.Item1) + 1];
        foreach (var (id, b64) in pairs) arr[id] = b64;
        return arr;
    }

    /// <summary>Valid UTF-8 decoded as is (a literal backslash doubled); every byte of an invalid sequence as \xHH; each id's form is unique.</summary>
    internal static string Readable(ReadOnlySpan<byte> bytes)
    {
        var sb = new StringBuilder(bytes.Length);
        int i = 0;
        while (i < bytes.Length)
        {
            var st = System.Text.Rune.DecodeFromUtf8(bytes[i..], out var r, out int len);
            if (st == System.Buffers.OperationStatus.Done)
            {
                if (r.Value == '\\') sb.Append("\\\\");
                else if (r.Value == 0xFFFD) sb.Append("\\xEF\\xBF\\xBD"); // a literal U+FFFD would read as a decoding failure
                else sb.Append(r.ToString());
                i += len;
            }
            else
            {
                for (int k = 0; k < Math.Max(1, len); k++) sb.Append($"\\x{bytes[i + k]:X2}");
                i += Math.Max(1, len);
            }
        }
        return sb.ToString();
    }

    private sealed class Session(SubwordTokenizer owner, ITokenSink sink) : ITokenizerSession
    {
        private const int CutAt = 1 << 20;
        private const int CacheLimit = 1 << 20;
        private readonly ChunkCache _cache = new(CacheLimit);
        private readonly HoldBack<char> _text = new();

        public void Feed(ReadOnlySpan<byte> utf8, bool eod)
        {
            // decoded text is held until a cut that cannot change a chunk (or the document's end)
            _text.Advance(Encoding.UTF8.GetChars(utf8, _text.AppendSpan(Encoding.UTF8.GetMaxCharCount(utf8.Length))));
            if (eod)
            {
                Encode(_text.Held);
                _text.Clear();
                return;
            }
            if (_text.Length < CutAt) return;
            int cut = SafeCut(_text.Held, owner.RangeCut == Sources.RangeCut.NewlineAfterVisibleBeforeAsciiLetter);
            if (cut <= 0) return;
            Encode(_text.Held[..cut]);
            _text.Consume(cut);
        }

        /// <summary>The last position where the held text can be encoded on its own; with
        /// <paramref name="visibleBefore"/> (r50k) a newline cut also needs a printable ASCII character before the
        /// newline, as the range cut does.</summary>
        internal static int SafeCut(ReadOnlySpan<char> t, bool visibleBefore)
        {
            for (int p = t.Length - 1; p > 0; p--)
                if (t[p - 1] == '\n' && char.IsAsciiLetter(t[p]) && (!visibleBefore || (p >= 2 && t[p - 2] is > ' ' and < '\x7F')))
                    return p;
            for (int p = t.Length - 2; p > 0; p--)
                if (t[p] == ' ' && char.IsLetter(t[p - 1]) && char.IsLetter(t[p + 1])) return p;
            return t.Length > 16 * CutAt ? t.Length : -1;
        }

        private void Encode(ReadOnlySpan<char> text)
        {
            if (text.IsEmpty) return;
            if (owner._splitter is { } match)
            {
                int p = 0;
                while (p < text.Length)
                {
                    int e = match(text, p);
                    if (e <= p) { p++; continue; }
                    EncodeChunk(text[p..e]);
                    p = e;
                }
                return;
            }
            if (owner._pre is null)
            {
                foreach (var range in text.EnumerateLines()) EncodeChunk(range);
                return;
            }
            string s = text.ToString();
            foreach (var (offset, length) in owner._pre.PreTokenize(s)) EncodeChunk(s.AsSpan(offset, length));
        }

        private void EncodeChunk(ReadOnlySpan<char> chunk)
        {
            if (chunk.IsEmpty) return;
            if (!_cache.TryGet(chunk, out var ids, out int slot))
                ids = _cache.Add(chunk, owner._tokenizer.EncodeToIds(chunk, considerPreTokenization: false, considerNormalization: false), slot);
            sink.AddIds(ids);
        }
    }
}
