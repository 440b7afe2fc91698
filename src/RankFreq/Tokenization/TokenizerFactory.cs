using RankFreq.Primitives;

namespace RankFreq.Tokenization;

/// <summary>Builds tokenizers from spec strings and lists the specs available.</summary>
public static class TokenizerFactory
{
    /// <summary>Every spec with a one-line description.</summary>
    public static IReadOnlyList<(string Spec, string Description)> Available { get; } =
    [
        ("words", "Unicode word rule (letters, marks, digits; inner apostrophes), NFC, case folded (default)"),
        ("words:keep-case", "the words rule with case kept"),
        ("whitespace", "runs of non-white-space characters, bytes as they are"),
        ("chars", "extended grapheme clusters, NFC, white space skipped"),
        ("cl100k_base", "tiktoken cl100k_base vocabulary (embedded, offline)"),
        ("o200k_base", "tiktoken o200k_base vocabulary (embedded, offline)"),
        ("r50k_base", "tiktoken r50k_base vocabulary (embedded, offline)"),
        ("bpe:VOCAB.json,MERGES.txt", "byte-level BPE from a vocabulary and merges file"),
        ("sentencepiece:MODEL", "SentencePiece model file (encoded line by line)"),
        ("wordpiece:VOCAB.txt", "WordPiece vocabulary, one token a line"),
        ("hf:TOKENIZER.json", "Hugging Face tokenizer.json (also any path ending in .json); special tokens count as text"),
        ("hf-specials:TOKENIZER.json", "the same, with special-token text counted as the special token (--specials)"),
    ];

    /// <summary>Creates the tokenizer a spec names; throws <see cref="SettingsException"/> for a spec that names no
    /// tokenizer and <see cref="TokenizerException"/> for one whose files cannot be used.</summary>
    public static ITokenizer Create(string spec)
    {
        spec = spec.Trim();
        switch (spec)
        {
            case "words": return new WordTokenizer(keepCase: false);
            case "words:keep-case": return new WordTokenizer(keepCase: true);
            case "whitespace": return new WhitespaceTokenizer();
            case "chars": return new GraphemeTokenizer();
            case "cl100k_base" or "o200k_base" or "r50k_base": return SubwordTokenizer.Tiktoken(spec);
        }
        if (spec.StartsWith("hf:", StringComparison.Ordinal)) return TokenizerJsonLoader.Load(spec[3..]);
        if (spec.StartsWith(TokenizerJsonLoader.SpecialsPrefix, StringComparison.Ordinal))
            return TokenizerJsonLoader.Load(spec[TokenizerJsonLoader.SpecialsPrefix.Length..], specials: true);
        if (spec.EndsWith(".json", StringComparison.OrdinalIgnoreCase)) return TokenizerJsonLoader.Load(spec);
        int colon = spec.IndexOf(':');
        if (colon > 0)
        {
            string kind = spec[..colon], arg = spec[(colon + 1)..];
            switch (kind)
            {
                case "bpe":
                    var parts = arg.Split(',');
                    if (parts.Length != 2) throw new SettingsException($"tokenizer '{spec}': expected bpe:VOCAB.json,MERGES.txt");
                    return SubwordTokenizer.Bpe(parts[0], parts[1]);
                case "sentencepiece": return SubwordTokenizer.SentencePiece(arg);
                case "wordpiece": return SubwordTokenizer.WordPiece(arg);
            }
        }
        var known = Available.Select(a => a.Spec.Split(':')[0]).Distinct();
        throw new SettingsException($"unknown tokenizer '{spec}' (known: {string.Join(", ", known)}; "
            + "run 'rankfreq tokenizers' for details)");
    }
}
