using System.Text.Json;

namespace RankFreq.Tokenization;

/// <summary>
/// Reads a tokenizer.json file and picks its engine: <see cref="ByteLevelJsonTokenizer"/> when the file is byte-level
/// BPE that our own pipeline reproduces exactly, else <see cref="ReferenceJsonTokenizer"/>. Also decides whether a
/// document may be cut before an ASCII letter that follows a newline (<see cref="TokenizerJsonTokenizer.CutSafe"/>).
/// </summary>
public static class TokenizerJsonLoader
{
    /// <summary>Spec prefix of a tokenizer.json file read with special-token parsing (<c>--specials</c>).</summary>
    public const string SpecialsPrefix = "hf-specials:";

    /// <summary>The spec <paramref name="spec"/> with special-token parsing when it names a tokenizer.json file
    /// (<c>hf:PATH</c> or a path ending in .json); any other spec unchanged.</summary>
    public static string WithSpecials(string spec) =>
        spec.StartsWith("hf:", StringComparison.Ordinal) ? SpecialsPrefix + spec[3..]
        : !spec.StartsWith(SpecialsPrefix, StringComparison.Ordinal) && spec.EndsWith(".json", StringComparison.OrdinalIgnoreCase)
            && !spec.StartsWith("bpe:", StringComparison.Ordinal) ? SpecialsPrefix + spec
        : spec;

    /// <summary>Loads a tokenizer.json file; <see cref="TokenizerException"/> with one line naming the file otherwise.
    /// With <paramref name="specials"/>, special added tokens written in the text count as their ids (as the reference
    /// encodes with special-token parsing, but still without adding any); by default their text counts as text.</summary>
    public static TokenizerJsonTokenizer Load(string path, bool specials = false)
    {
        using var f = TokenizerJsonFile.Read(path);
        f.ParseSpecials = specials;
        var pre = TokenizerJsonFile.Steps(f.PreTokenizer, "pretokenizers");
        bool byteLevel = pre.Any(p => TokenizerJsonFile.Str(p, "type") == "ByteLevel");
        var fast = TryFast(f, pre, out string why);
        if (fast is not null) return fast;
        return new ReferenceJsonTokenizer(f, CutSafe(f, pre), byteLevel, why);
    }

    /// <summary>
    /// The fast engine when the file is: BPE without byte fallback, dropout, word prefixes or suffixes; normalizer
    /// absent or NFC; pre-tokenizer a chain of Isolated, non-inverted regex Splits ending in ByteLevel without a prefix
    /// space; a token for every byte; added tokens that are not special matched on the raw text without stripping.
    /// </summary>
    private static ByteLevelJsonTokenizer? TryFast(TokenizerJsonFile f, List<JsonElement> pre, out string why)
    {
        var m = f.Model;
        why = "";
        if (f.ModelType != "BPE") { why = $"{f.ModelType} model"; return null; }
        if (TokenizerJsonFile.Flag(m, "byte_fallback")) { why = "BPE with byte fallback"; return null; }
        if (TokenizerJsonFile.Prop(m, "dropout").ValueKind == JsonValueKind.Number) { why = "BPE dropout"; return null; }
        if (TokenizerJsonFile.Str(m, "continuing_subword_prefix") is { Length: > 0 } ||
            TokenizerJsonFile.Str(m, "end_of_word_suffix") is { Length: > 0 }) { why = "subword prefix or suffix"; return null; }
        var norms = TokenizerJsonFile.Steps(f.Normalizer, "normalizers");
        if (norms.Any(n => TokenizerJsonFile.Str(n, "type") != "NFC")) { why = "normalizer other than NFC"; return null; }
        if (pre.Count == 0 || TokenizerJsonFile.Str(pre[^1], "type") != "ByteLevel") { why = "no ByteLevel pre-tokenizer last"; return null; }
        var last = pre[^1];
        if (TokenizerJsonFile.Flag(last, "add_prefix_space")) { why = "ByteLevel adds a prefix space"; return null; }
        var rules = new List<SplitRule>();
        foreach (var step in pre.Take(pre.Count - 1))
        {
            if (TokenizerJsonFile.Str(step, "type") != "Split" || TokenizerJsonFile.Str(step, "behavior") != "Isolated" ||
                TokenizerJsonFile.Flag(step, "invert") ||
                TokenizerJsonFile.Str(TokenizerJsonFile.Prop(step, "pattern"), "Regex") is not { } pattern)
            { why = "pre-tokenizer other than Isolated regex Splits"; return null; }
            if (SplitRule.For(pattern) is not { } rule) { why = "split pattern .NET cannot run alike"; return null; }
            rules.Add(rule);
        }
        // ByteLevel's own regex is on unless use_regex is false
        if (TokenizerJsonFile.Prop(last, "use_regex").ValueKind != JsonValueKind.False) rules.Add(SplitRule.For(SplitRule.ByteLevelForm)!);
        if (rules.Count == 0) { why = "no pre-tokenizer split"; return null; }
        if (f.Added.Any(a => f.Matched(a) && (a.Normalized || a.Strips))) { why = "added tokens matched after normalisation or stripped"; return null; }
        var bpe = ByteLevelBpe.TryCreate(f, TokenizerJsonFile.Flag(m, "ignore_merges"), out var reason);
        if (bpe is null) { why = reason!; return null; }
        bool cutSafe = rules.All(r => r.CutSafe) && !f.Added.Any(a => f.Matched(a) && NewlineLetter(a.Content));
        return new ByteLevelJsonTokenizer(f, bpe, [.. rules], norms.Count > 0, cutSafe);
    }

    /// <summary>
    /// Whether cutting a document before an ASCII letter that follows a newline leaves every token unchanged, for the
    /// reference engine: no step depends on where the document starts (Prepend, Strip, a Metaspace or ByteLevel
    /// prefix); each normalizer maps the two sides apart; each pre-tokenizer is known to split there or only splits
    /// more finely; no vocabulary entry or added token holds a newline followed by an ASCII letter (so no BPE merge,
    /// Unigram piece or WordPiece piece can span the cut); and every ASCII letter is a token (so no unknown-token
    /// fusing reaches across).
    /// </summary>
    internal static bool CutSafe(TokenizerJsonFile f, List<JsonElement> pre)
    {
        foreach (var n in TokenizerJsonFile.Steps(f.Normalizer, "normalizers"))
        {
            switch (TokenizerJsonFile.Str(n, "type"))
            {
                case "NFC" or "NFD" or "NFKC" or "NFKD" or "Lowercase" or "StripAccents" or "BertNormalizer" or "Nmt":
                    break;
                case "Replace" when TokenizerJsonFile.Str(TokenizerJsonFile.Prop(n, "pattern"), "String") is { } s &&
                                    !NewlineLetter(s) && !(TokenizerJsonFile.Str(n, "content") ?? "").Contains('\n'):
                    break;
                default:
                    return false;
            }
        }
        bool splitsWords = false;
        foreach (var p in pre)
        {
            switch (TokenizerJsonFile.Str(p, "type"))
            {
                case "Whitespace" or "WhitespaceSplit" or "BertPreTokenizer":
                    splitsWords = true;
                    break;
                case "Punctuation" or "Digits":
                    break;
                case "Metaspace":
                    var scheme = TokenizerJsonFile.Str(p, "prepend_scheme");
                    if (scheme is not null ? scheme != "never" : TokenizerJsonFile.Flag(p, "add_prefix_space")) return false;
                    break;
                case "ByteLevel":
                    if (TokenizerJsonFile.Flag(p, "add_prefix_space") ||
                        TokenizerJsonFile.Prop(p, "use_regex").ValueKind != JsonValueKind.False) return false;
                    break;
                case "Split":
                    var pattern = TokenizerJsonFile.Prop(p, "pattern");
                    if (TokenizerJsonFile.Str(pattern, "String") is { } s) { if (NewlineLetter(s)) return false; }
                    else if (TokenizerJsonFile.Str(pattern, "Regex") is not { } r || SplitRule.For(r) is not { CutSafe: true }) return false;
                    break;
                default:
                    return false;
            }
        }
        if (f.ModelType == "WordPiece" && !splitsWords) return false;
        if (f.Vocab.Any(NewlineLetter) || f.Added.Any(a => f.Matched(a) && NewlineLetter(a.Content))) return false;
        // unknown-token fusing (BPE, Unigram) could join an unknown letter to an unknown newline
        if (f.ModelType is not ("BPE" or "Unigram") || pre.Any(p => TokenizerJsonFile.Str(p, "type") == "ByteLevel")) return true;
        bool lower = TokenizerJsonFile.Steps(f.Normalizer, "normalizers").Any(n =>
            TokenizerJsonFile.Str(n, "type") == "Lowercase" || TokenizerJsonFile.Flag(n, "lowercase"));
        for (char c = 'A'; c <= 'z'; c++)
            if (char.IsAsciiLetter(c) && !f.Vocab.TryGet([(byte)(lower ? char.ToLowerInvariant(c) : c)], out _)) return false;
        return true;
    }

    // A newline followed by an ASCII letter, as text or in the byte-level alphabet (Ċ stands for \n there).
    private static bool NewlineLetter(string s)
    {
        for (int i = 0; i + 1 < s.Length; i++)
            if ((s[i] == '\n' || s[i] == '\u010A') && char.IsAsciiLetter(s[i + 1])) return true;
        return false;
    }
}
