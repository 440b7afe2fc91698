using System.Globalization;
using System.Text;

namespace RankFreq.Tokenization;

/// <summary>
/// The fast exact engine for byte-level BPE tokenizer.json files: added tokens that are not special are cut out
/// first, then each stretch is normalised (NFC when the file asks), split by the file's Split rules (hand-written
/// splitters when the pattern is a known one, else .NET's regex engine) and each distinct chunk is encoded once by
/// <see cref="ByteLevelBpe"/> and replayed from a <see cref="ChunkCache"/>.
/// </summary>
/// <remarks>
/// .NET's regex engine and the hand-written splitters see UTF-16 code units, while the reference matches code points:
/// a character outside the Basic Multilingual Plane is a letter or a number to the reference but two surrogates to
/// .NET. Text holding such characters is split on a stand-in string with one character of the same class per code
/// point, so the pieces are the reference's (tested with astral letters, digits and emoji).
/// </remarks>
public sealed class ByteLevelJsonTokenizer : TokenizerJsonTokenizer
{
    private readonly ByteLevelBpe _bpe;
    private readonly SplitRule[] _rules;
    private readonly bool _nfc;
    private readonly AddedTokenEntry[] _added; // matched leftmost-longest before normalisation
    private readonly System.Buffers.SearchValues<char> _addedFirst;

    internal ByteLevelJsonTokenizer(TokenizerJsonFile f, ByteLevelBpe bpe, SplitRule[] rules, bool nfc, bool cutSafe)
        : base(f.Path, nfc ? "NFC" : "none", cutSafe, f, byteLevel: true,
            $"byte-level BPE (own merge loop; split: {string.Join(", ", rules.Select(r => r.Describe))})")
    {
        _bpe = bpe;
        _rules = rules;
        _nfc = nfc;
        _added = f.Added.Where(a => f.Matched(a) && a.Content.Length > 0).OrderByDescending(a => a.Content.Length).ToArray();
        _addedFirst = System.Buffers.SearchValues.Create(_added.Select(a => a.Content[0]).Distinct().ToArray());
    }

    /// <inheritdoc/>
    public override ITokenizerSession CreateSession(ITokenSink sink) => new Session(this, sink);

    private sealed class Session(ByteLevelJsonTokenizer owner, ITokenSink sink) : BufferingSession(owner.CutSafe)
    {
        private readonly ChunkCache _cache = new(1 << 20);
        private readonly List<(int Start, int End)> _pieces = [], _next = [];
        private readonly List<int> _ids = [];
        private byte[] _bytes = new byte[256];
        private char[] _view = [];
        private int[] _map = [];

        protected override void Encode(ReadOnlySpan<char> text)
        {
            var added = owner._added;
            if (added.Length == 0) { Segment(text); return; }
            int from = 0, p = 0;
            while (p < text.Length)
            {
                int skip = text[p..].IndexOfAny(owner._addedFirst);
                if (skip < 0) break;
                p += skip;
                int id = -1, len = 0;
                foreach (var a in added) // longest first: the leftmost-longest match, as the reference's
                    if (text[p..].StartsWith(a.Content, StringComparison.Ordinal)) { id = a.Id; len = a.Content.Length; break; }
                if (id < 0) { p++; continue; }
                Segment(text[from..p]);
                sink.AddId(id);
                p += len;
                from = p;
            }
            Segment(text[from..]);
        }

        private void Segment(ReadOnlySpan<char> text)
        {
            if (text.IsEmpty) return;
            if (owner._nfc && !Ascii.IsValid(text))
            {
                var s = text.ToString();
                if (!s.IsNormalized(NormalizationForm.FormC)) text = s.Normalize(NormalizationForm.FormC);
            }
            bool astral = text.IndexOfAnyInRange('\uD800', '\uDFFF') >= 0;
            ReadOnlySpan<char> view = astral ? View(text) : text;
            if (owner._rules.Length == 1 && owner._rules[0].Matcher is { } match)
            {
                // one hand-written rule (Llama 3, Qwen): pieces go straight to the cache, as SplitRule.Split cuts them
                int gap = 0, p = 0;
                while (p < view.Length)
                {
                    int e = match(view, p);
                    if (e <= p) { p++; continue; }
                    if (gap < p) Piece(text, astral, gap, p);
                    Piece(text, astral, p, e);
                    p = gap = e;
                }
                if (gap < view.Length) Piece(text, astral, gap, view.Length);
                return;
            }
            _pieces.Clear();
            _pieces.Add((0, view.Length));
            foreach (var rule in owner._rules)
            {
                _next.Clear();
                foreach (var (a, b) in _pieces) rule.Split(view[a..b], a, _next);
                _pieces.Clear();
                _pieces.AddRange(_next);
            }
            foreach (var (a, b) in _pieces) Piece(text, astral, a, b);
        }

        private void Piece(ReadOnlySpan<char> text, bool astral, int a, int b) =>
            Chunk(astral ? text[_map[a].._map[b]] : text[a..b]);

        private void Chunk(ReadOnlySpan<char> chunk)
        {
            if (!_cache.TryGet(chunk, out var ids, out int slot))
            {
                int max = Encoding.UTF8.GetMaxByteCount(chunk.Length);
                if (_bytes.Length < max) _bytes = new byte[Math.Max(max, _bytes.Length * 2)];
                int n = Encoding.UTF8.GetBytes(chunk, _bytes);
                _ids.Clear();
                owner._bpe.Encode(_bytes.AsSpan(0, n), _ids);
                ids = _cache.Add(chunk, _ids, slot);
            }
            sink.AddIds(ids);
        }

        // One stand-in character per code point, of the same class as the reference's regex sees it.
        private ReadOnlySpan<char> View(ReadOnlySpan<char> text)
        {
            if (_view.Length < text.Length) { _view = new char[text.Length]; _map = new int[text.Length + 1]; }
            int v = 0, i = 0;
            while (i < text.Length)
            {
                _map[v] = i;
                if (char.IsHighSurrogate(text[i]) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1]))
                {
                    _view[v++] = StandIn(CharUnicodeInfo.GetUnicodeCategory(char.ConvertToUtf32(text[i], text[i + 1])));
                    i += 2;
                }
                else _view[v++] = text[i++];
            }
            _map[v] = text.Length;
            return _view.AsSpan(0, v);
        }

        private static char StandIn(UnicodeCategory c) => c switch
        {
            UnicodeCategory.UppercaseLetter => 'A',
            UnicodeCategory.LowercaseLetter => 'a',
            UnicodeCategory.TitlecaseLetter => '\u01C5',
            UnicodeCategory.ModifierLetter => '\u02B0',
            UnicodeCategory.OtherLetter => '\u00AA',
            UnicodeCategory.NonSpacingMark => '\u0300',
            UnicodeCategory.SpacingCombiningMark => '\u0903',
            UnicodeCategory.EnclosingMark => '\u20DD',
            UnicodeCategory.DecimalDigitNumber => '0',
            UnicodeCategory.LetterNumber => '\u2160',
            UnicodeCategory.OtherNumber => '\u00B2',
            _ => '\u00A6', // a symbol: not a letter, number, mark or space
        };
    }
}
