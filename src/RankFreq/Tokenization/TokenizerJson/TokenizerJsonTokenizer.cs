using System.Text;

namespace RankFreq.Tokenization;

/// <summary>
/// A tokenizer read from a Hugging Face tokenizer.json file (spec <c>hf:PATH</c>, or a path ending in <c>.json</c>).
/// Each document (a JSON Lines record, a Parquet cell, a plain-text file) is counted as the reference tokenizers
/// library encodes that document whole without special tokens. Special added tokens (a beginning-of-text marker, say)
/// are not looked for: their text counts as ordinary text. Added tokens that are not special are matched as the
/// reference matches them.
/// </summary>
/// <remarks>
/// Two engines, chosen per file by <see cref="TokenizerJsonLoader"/>: byte-level BPE files (Llama 3, Qwen3 style:
/// regex Split + ByteLevel, optional NFC) run on our own pre-tokenizer, merge loop and distinct-chunk cache; every
/// other file (byte-fallback BPE with Metaspace, Unigram, WordPiece…) is encoded document by document by the reference
/// library itself (<see cref="ReferenceJsonTokenizer"/>).
/// </remarks>
public abstract class TokenizerJsonTokenizer : ITokenizer
{
    private protected const int CutAt = 1 << 20; // characters buffered before a long document is cut (when it may be)
    private readonly string[] _display;

    private readonly Utf8Vocabulary _vocab;
    private readonly int[] _entry;     // id → vocabulary entry + 1 (0: none); texts are made only for ids shown
    private readonly string?[] _added; // id → added token's text, which takes precedence
    private readonly bool _byteLevel;

    private protected TokenizerJsonTokenizer(string path, string normalization, bool cutSafe, TokenizerJsonFile f, bool byteLevel, string engine)
    {
        _vocab = f.Vocab;
        _entry = new int[f.IdLimit];
        for (int e = 0; e < _vocab.Count; e++) _entry[_vocab.Id(e)] = e + 1; // a repeated id: the later entry, as before
        _added = new string[_entry.Length];
        foreach (var a in f.Added) _added[a.Id] = a.Content;
        _byteLevel = byteLevel;
        _display = new string[_entry.Length];
        Spec = (f.ParseSpecials ? TokenizerJsonLoader.SpecialsPrefix : "hf:") + path;
        Normalization = normalization;
        CutSafe = cutSafe;
        Engine = engine;
    }

    /// <inheritdoc/>
    public string Spec { get; }
    /// <inheritdoc/>
    public string Normalization { get; }
    /// <inheritdoc/>
    public string CaseRule => "kept";
    /// <inheritdoc/>
    public TokenIdentity Identity => TokenIdentity.Ids;
    /// <inheritdoc/>
    public int VocabularySize => _display.Length;

    /// <summary>Which engine counts with this file, and why (shown by tests and benchmarks).</summary>
    public string Engine { get; }

    /// <summary>
    /// A newline followed by an ASCII letter can never lie inside a token nor change the tokens on either side (shown
    /// for the file's normalizer, pre-tokenizer, model vocabulary and added tokens by <see cref="TokenizerJsonLoader"/>),
    /// so a document may be cut there and its parts encoded apart.
    /// </summary>
    public bool CutSafe { get; }

    /// <inheritdoc/>
    public Sources.RangeCut RangeCut => CutSafe ? Sources.RangeCut.NewlineBeforeAsciiLetter : Sources.RangeCut.None;

    /// <inheritdoc/>
    public string DisplayToken(int id)
    {
        if ((uint)id >= (uint)_display.Length) return $"<id {id}>";
        if (_display[id] is { } shown) return shown;
        string? raw = _added[id] ?? (_entry[id] > 0 ? _vocab.Text(_entry[id] - 1) : null);
        if (raw is null) return $"<id {id}>";
        // made on first use: most ids are never shown
        return _display[id] ??= _byteLevel && ByteLevelAlphabet.ToBytes(raw) is { } b ? SubwordTokenizer.Readable(b) : raw;
    }

    /// <inheritdoc/>
    public abstract ITokenizerSession CreateSession(ITokenSink sink);

    /// <summary>The ids of one document, encoded whole (the form the tests compare with the reference).</summary>
    public List<int> EncodeDocument(string text)
    {
        var sink = new ListSink();
        var s = CreateSession(sink);
        s.Feed(Encoding.UTF8.GetBytes(text), endOfDocument: true);
        return sink.Ids;
    }

    private sealed class ListSink : ITokenSink
    {
        public List<int> Ids { get; } = [];
        public void AddToken(ReadOnlySpan<byte> utf8) => throw new InvalidOperationException("id tokenizer");
        public void AddId(int id) => Ids.Add(id);
    }

    /// <summary>
    /// Buffers a document's text as UTF-16 and hands it on whole at its end, or in parts cut before an ASCII letter that
    /// follows a newline once it grows past <see cref="CutAt"/> characters (only when <see cref="CutSafe"/>).
    /// </summary>
    private protected abstract class BufferingSession(bool cutSafe) : ITokenizerSession
    {
        private char[] _buf = new char[4096];
        private int _len;

        public void Feed(ReadOnlySpan<byte> utf8, bool endOfDocument)
        {
            int need = _len + Encoding.UTF8.GetMaxCharCount(utf8.Length);
            if (_buf.Length < need) Array.Resize(ref _buf, Math.Max(need, _buf.Length * 2));
            _len += Encoding.UTF8.GetChars(utf8, _buf.AsSpan(_len));
            if (endOfDocument)
            {
                if (_len > 0) Encode(_buf.AsSpan(0, _len));
                _len = 0;
                if (_buf.Length > 4 * CutAt) _buf = new char[4096];
                return;
            }
            if (!cutSafe || _len < CutAt) return;
            var t = _buf.AsSpan(0, _len);
            int cut = -1;
            for (int p = t.Length - 1; p > 0; p--)
                if (t[p - 1] == '\n' && char.IsAsciiLetter(t[p])) { cut = p; break; }
            if (cut <= 0) return;
            Encode(t[..cut]);
            t[cut..].CopyTo(_buf);
            _len -= cut;
        }

        /// <summary>Encodes a whole document, or a part of one cut where <see cref="CutSafe"/> allows.</summary>
        protected abstract void Encode(ReadOnlySpan<char> text);
    }
}
