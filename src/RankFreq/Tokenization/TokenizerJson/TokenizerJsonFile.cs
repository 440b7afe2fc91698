using System.Text;
using System.Text.Json;

namespace RankFreq.Tokenization;

/// <summary>An entry of a tokenizer.json file's <c>added_tokens</c> list.</summary>
/// <param name="Id">Vocabulary id.</param>
/// <param name="Content">The text the entry matches.</param>
/// <param name="Special">A special token (a control marker such as a beginning-of-text id).</param>
/// <param name="Normalized">Matched in the normalised text rather than the original.</param>
/// <param name="Strips">Any of <c>lstrip</c>, <c>rstrip</c> or <c>single_word</c> is set.</param>
internal sealed record AddedTokenEntry(int Id, string Content, bool Special, bool Normalized, bool Strips);

/// <summary>
/// The parts of a Hugging Face tokenizer.json file that counting needs, read with <see cref="JsonDocument"/> (no
/// serializer reflection, so the native build can read it): the model, its vocabulary and merges, the normalizer and
/// pre-tokenizer descriptions and the added tokens. Every structural fault becomes one <see cref="TokenizerException"/>
/// line naming the file.
/// </summary>
internal sealed class TokenizerJsonFile : IDisposable
{
    private readonly JsonDocument _doc;
    private int? _idLimit;

    private TokenizerJsonFile(string path, JsonDocument doc)
    {
        Path = path;
        _doc = doc;
    }

    /// <summary>The file read.</summary>
    public string Path { get; }
    /// <summary>The whole document.</summary>
    public JsonElement Root => _doc.RootElement;
    /// <summary>The <c>model</c> object.</summary>
    public JsonElement Model { get; private set; }
    /// <summary>BPE, Unigram, WordPiece or WordLevel.</summary>
    public string ModelType { get; private set; } = "";
    /// <summary>The <c>normalizer</c> node (null kind when absent).</summary>
    public JsonElement Normalizer => Prop(Root, "normalizer");
    /// <summary>The <c>pre_tokenizer</c> node (null kind when absent).</summary>
    public JsonElement PreTokenizer => Prop(Root, "pre_tokenizer");
    /// <summary>Model vocabulary: token (UTF-8) → id.</summary>
    public Utf8Vocabulary Vocab { get; private set; } = new();
    /// <summary>BPE merges in rank order, as ids: left, right and the merged token.</summary>
    public List<(int Left, int Right, int Merged)> Merges { get; } = [];
    /// <summary>Whether special added tokens are matched in the text (<c>--specials</c>) rather than counted as text.
    /// </summary>
    public bool ParseSpecials { get; set; }

    /// <summary>Whether added token <paramref name="a"/> is looked for in the text: every added token that is not
    /// special, and the special ones too with <see cref="ParseSpecials"/>.</summary>
    public bool Matched(AddedTokenEntry a) => ParseSpecials || !a.Special;

    /// <summary>Added tokens, special or not.</summary>
    public List<AddedTokenEntry> Added { get; } = [];

    /// <summary>One past the largest id of the vocabulary and the added tokens.</summary>
    public int IdLimit => _idLimit ??= Math.Max(Vocab.MaxId() + 1, Added.Count == 0 ? 0 : Added.Max(a => a.Id) + 1);

    /// <summary>Reads and checks a tokenizer.json file.</summary>
    public static TokenizerJsonFile Read(string path)
    {
        if (!File.Exists(path)) throw new TokenizerException($"{path}: tokenizer file not found");
        JsonDocument doc;
        try
        {
            using var s = File.OpenRead(path);
            doc = JsonDocument.Parse(s, new JsonDocumentOptions { MaxDepth = 256 });
        }
        catch (JsonException e)
        {
            throw new TokenizerException($"{path}: not a valid tokenizer.json ({e.Message})", e);
        }
        catch (IOException e)
        {
            throw new TokenizerException($"{path}: cannot read the tokenizer file ({e.Message})", e);
        }
        var f = new TokenizerJsonFile(path, doc);
        try
        {
            f.Load();
            return f;
        }
        catch
        {
            doc.Dispose();
            throw;
        }
    }

    private TokenizerException Bad(string what) => new($"{Path}: {what}");

    private void Load()
    {
        if (Root.ValueKind != JsonValueKind.Object) throw Bad("not a tokenizer.json (the top level is not an object)");
        Model = Prop(Root, "model");
        if (Model.ValueKind != JsonValueKind.Object) throw Bad("no \"model\" object");
        var vocab = Prop(Model, "vocab");
        ModelType = Prop(Model, "type") is { ValueKind: JsonValueKind.String } t ? t.GetString()! : Guess(vocab);
        if (vocab.ValueKind is JsonValueKind.Undefined or JsonValueKind.Null)
            throw Bad($"the {ModelType} model has no \"vocab\"");
        switch (ModelType)
        {
            case "BPE" or "WordPiece" or "WordLevel":
                if (vocab.ValueKind != JsonValueKind.Object) throw Bad($"the {ModelType} model's \"vocab\" is not an object");
                Vocab = new Utf8Vocabulary(vocab.GetPropertyCount());
                foreach (var p in vocab.EnumerateObject())
                {
                    if (p.Value.ValueKind != JsonValueKind.Number || !p.Value.TryGetInt32(out int id) || id < 0)
                        throw Bad($"vocab entry \"{p.Name}\" has no valid id");
                    Vocab.Set(Utf8Vocabulary.NameBytes(p), id);
                }
                break;
            case "Unigram":
                if (vocab.ValueKind != JsonValueKind.Array) throw Bad("the Unigram model's \"vocab\" is not a list");
                Vocab = new Utf8Vocabulary(vocab.GetArrayLength());
                int i = 0;
                foreach (var e in vocab.EnumerateArray())
                {
                    if (e.ValueKind != JsonValueKind.Array || e.GetArrayLength() != 2 || e[0].ValueKind != JsonValueKind.String)
                        throw Bad($"Unigram vocab entry {i} is not a [piece, score] pair");
                    Vocab.TryAdd(Utf8Vocabulary.StringBytes(e[0]), i);
                    i++;
                }
                break;
            default:
                throw Bad($"model type '{ModelType}' is not supported (BPE, Unigram, WordPiece, WordLevel)");
        }
        if (Vocab.Count == 0) throw Bad($"the {ModelType} model's vocabulary is empty");
        if (ModelType == "BPE") ReadMerges();
        if (Prop(Root, "added_tokens") is { ValueKind: JsonValueKind.Array } added)
            foreach (var a in added.EnumerateArray())
            {
                if (Prop(a, "id") is not { ValueKind: JsonValueKind.Number } idEl || !idEl.TryGetInt32(out int id) ||
                    Prop(a, "content") is not { ValueKind: JsonValueKind.String } content)
                    throw Bad("an added_tokens entry lacks an id or content");
                Added.Add(new AddedTokenEntry(id, content.GetString()!, Flag(a, "special"), Flag(a, "normalized"),
                    Flag(a, "lstrip") || Flag(a, "rstrip") || Flag(a, "single_word")));
            }
    }

    // As the reference library does when "type" is absent: the fields present tell the model apart.
    private static string Guess(JsonElement vocab) => vocab.ValueKind == JsonValueKind.Array ? "Unigram" : "BPE";

    private void ReadMerges()
    {
        var merges = Prop(Model, "merges");
        if (merges.ValueKind is JsonValueKind.Undefined or JsonValueKind.Null) return;
        if (merges.ValueKind != JsonValueKind.Array) throw Bad("the BPE model's \"merges\" is not a list");
        Merges.Capacity = merges.GetArrayLength();
        byte[] prefix = Encoding.UTF8.GetBytes(
            Prop(Model, "continuing_subword_prefix") is { ValueKind: JsonValueKind.String } cp ? cp.GetString()! : "");
        byte[] joined = new byte[256];
        int n = 0;
        // UTF-8 straight from the document: no string per merge (see Utf8Vocabulary for why this matters)
        foreach (var m in merges.EnumerateArray())
        {
            n++;
            ReadOnlySpan<byte> a, b;
            if (m.ValueKind == JsonValueKind.String)
            {
                var s = Utf8Vocabulary.StringBytes(m);
                int split = s.Length > 1 ? s[1..].IndexOf((byte)' ') + 1 : 0;
                if (split <= 0 || s[(split + 1)..].IndexOf((byte)' ') >= 0)
                    throw Bad($"merge {n} (\"{m.GetString()}\") is not two tokens separated by a space");
                a = s[..split];
                b = s[(split + 1)..];
            }
            else if (m.ValueKind == JsonValueKind.Array && m.GetArrayLength() == 2 &&
                     m[0].ValueKind == JsonValueKind.String && m[1].ValueKind == JsonValueKind.String)
            {
                a = Utf8Vocabulary.StringBytes(m[0]);
                b = Utf8Vocabulary.StringBytes(m[1]);
            }
            else throw Bad($"merge {n} is neither \"A B\" nor [\"A\", \"B\"]");
            if (!Vocab.TryGet(a, out int ia)) throw Bad($"merge {n} names \"{Encoding.UTF8.GetString(a)}\", which is not in the vocabulary");
            if (!Vocab.TryGet(b, out int ib)) throw Bad($"merge {n} names \"{Encoding.UTF8.GetString(b)}\", which is not in the vocabulary");
            if (prefix.Length > 0 && b.StartsWith(prefix)) b = b[prefix.Length..];
            if (joined.Length < a.Length + b.Length) joined = new byte[a.Length + b.Length];
            a.CopyTo(joined);
            b.CopyTo(joined.AsSpan(a.Length));
            var ab = joined.AsSpan(0, a.Length + b.Length);
            if (!Vocab.TryGet(ab, out int iab)) throw Bad($"merge {n} makes \"{Encoding.UTF8.GetString(ab)}\", which is not in the vocabulary");
            Merges.Add((ia, ib, iab));
        }
    }

    /// <summary>A property of an object, or an undefined element.</summary>
    public static JsonElement Prop(JsonElement e, string name) =>
        e.ValueKind == JsonValueKind.Object && e.TryGetProperty(name, out var v) ? v : default;

    /// <summary>A string property, or null.</summary>
    public static string? Str(JsonElement e, string name) =>
        Prop(e, name) is { ValueKind: JsonValueKind.String } v ? v.GetString() : null;

    /// <summary>A boolean property (false when absent).</summary>
    public static bool Flag(JsonElement e, string name) => Prop(e, name).ValueKind == JsonValueKind.True;

    /// <summary>The steps of a normalizer or pre-tokenizer node, with <c>Sequence</c> nodes flattened.</summary>
    public static List<JsonElement> Steps(JsonElement node, string listName)
    {
        var list = new List<JsonElement>();
        void Walk(JsonElement n)
        {
            if (n.ValueKind != JsonValueKind.Object) return;
            if (Str(n, "type") == "Sequence" && Prop(n, listName) is { ValueKind: JsonValueKind.Array } items)
                foreach (var i in items.EnumerateArray()) Walk(i);
            else list.Add(n);
        }
        Walk(node);
        return list;
    }

    /// <inheritdoc/>
    public void Dispose() => _doc.Dispose();
}
