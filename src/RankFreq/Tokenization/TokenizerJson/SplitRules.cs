using System.Text.RegularExpressions;

namespace RankFreq.Tokenization;

/// <summary>
/// One Split step of a tokenizer.json pre-tokenizer with the <c>Isolated</c> behaviour: every match is a piece and so
/// is every stretch between matches.
/// </summary>
internal sealed class SplitRule
{
    private readonly ChunkMatcher? _matcher;
    private readonly Regex? _regex;

    private SplitRule(ChunkMatcher? matcher, Regex? regex, bool cutSafe, string describe)
    {
        _matcher = matcher; _regex = regex; CutSafe = cutSafe; Describe = describe;
    }

    /// <summary>
    /// A newline followed by an ASCII letter is always a piece boundary, and the pieces before it are the same whether
    /// or not the text goes on.
    /// </summary>
    public bool CutSafe { get; }

    /// <summary>The hand-written splitter (null when .NET's regex engine runs): the end of the match at a position.
    /// </summary>
    public ChunkMatcher? Matcher => _matcher;

    /// <summary>Which splitter runs (for the tokenizer's description and the tests).</summary>
    public string Describe { get; }

    /// <summary>The cl100k_base pattern as tokenizer.json files write it (Llama 3): no <c>\s+$</c> rule.</summary>
    public const string Cl100kForm = @"(?i:'s|'t|'re|'ve|'m|'ll|'d)|[^\r\n\p{L}\p{N}]?\p{L}+|\p{N}{1,3}| ?[^\s\p{L}\p{N}]+[\r\n]*|\s*[\r\n]+|\s+(?!\S)|\s+";
    /// <summary>The same with single-digit numbers (Qwen2 and Qwen3).</summary>
    public const string SingleDigitForm = @"(?i:'s|'t|'re|'ve|'m|'ll|'d)|[^\r\n\p{L}\p{N}]?\p{L}+|\p{N}| ?[^\s\p{L}\p{N}]+[\r\n]*|\s*[\r\n]+|\s+(?!\S)|\s+";
    /// <summary>The pattern of the ByteLevel pre-tokenizer's <c>use_regex</c> (r50k_base's rule).</summary>
    public const string ByteLevelForm = @"'s|'t|'re|'ve|'m|'ll|'d| ?\p{L}+| ?\p{N}+| ?[^\s\p{L}\p{N}]+|\s+(?!\S)|\s+";

    /// <summary>
    /// The rule for a Split pattern: a hand-written splitter when the pattern is exactly one of the known ones, else
    /// .NET's regex engine (null when the pattern uses syntax .NET reads differently, such as possessive quantifiers).
    /// </summary>
    public static SplitRule? For(string pattern)
    {
        switch (pattern)
        {
            case Cl100kForm: return new SplitRule((t, p) => MatchCl100kForm(t, p, 3), null, true, "cl100k rule (hand-written)");
            case SingleDigitForm: return new SplitRule((t, p) => MatchCl100kForm(t, p, 1), null, true, "cl100k rule, single digits (hand-written)");
            case O200kSplitter.Pattern: return new SplitRule(O200kSplitter.Match, null, true, "o200k rule (hand-written)");
            case ByteLevelForm: return new SplitRule(TiktokenSplitters.MatchR50k, null, false, "r50k rule (hand-written)");
        }
        // possessive quantifiers (x*+, x++, x?+) mean something else to .NET
        if (Regex.IsMatch(pattern, @"(?<!\\)[*+?}]\+")) return null;
        try
        {
            var options = RegexOptions.CultureInvariant |
                          (System.Runtime.CompilerServices.RuntimeFeature.IsDynamicCodeSupported ? RegexOptions.Compiled : RegexOptions.None);
            return new SplitRule(null, new Regex(pattern, options), false, ".NET regex");
        }
        catch (ArgumentException)
        {
            return null;
        }
    }

    /// <summary>Appends the pieces of <paramref name="t"/> (start, end) to <paramref name="into"/>, offsets shifted by <paramref name="shift"/>.</summary>
    public void Split(ReadOnlySpan<char> t, int shift, List<(int Start, int End)> into)
    {
        int gap = 0;
        if (_matcher is { } match)
        {
            int p = 0;
            while (p < t.Length)
            {
                int e = match(t, p);
                if (e <= p) { p++; continue; }
                if (gap < p) into.Add((shift + gap, shift + p));
                into.Add((shift + p, shift + e));
                p = gap = e;
            }
        }
        else
        {
            foreach (var m in _regex!.EnumerateMatches(t))
            {
                if (m.Length == 0) continue;
                if (gap < m.Index) into.Add((shift + gap, shift + m.Index));
                into.Add((shift + m.Index, shift + m.Index + m.Length));
                gap = m.Index + m.Length;
            }
        }
        if (gap < t.Length) into.Add((shift + gap, shift + t.Length));
    }

    /// <summary>
    /// <see cref="Cl100kForm"/>: the cl100k_base splitter, except that a white-space run reaching the end of the text
    /// ends after its last newline (<c>\s*[\r\n]+</c> comes first here; tiktoken's current form tries <c>\s+$</c> first).
    /// </summary>
    internal static int MatchCl100kForm(ReadOnlySpan<char> t, int p, int maxDigits)
    {
        char c = t[p];
        if ((CharClasses.Of(c) & CharClasses.Space) == 0 || p + 1 >= t.Length && c is not ('\r' or '\n'))
            return TiktokenSplitters.MatchCl100kFamily(t, p, maxDigits);
        if (p + 1 < t.Length)
        {
            byte next = CharClasses.Of(t[p + 1]);
            bool newline = c is '\r' or '\n';
            // " word" / "\tword" and " ..." chunks start at a white-space character
            if (!newline && (next & CharClasses.Letter) != 0) return TiktokenSplitters.MatchCl100kFamily(t, p, maxDigits);
            if (c == ' ' && (next & (CharClasses.Letter | CharClasses.Number | CharClasses.Space)) == 0)
                return TiktokenSplitters.MatchCl100kFamily(t, p, maxDigits);
        }
        int n = t.Length, k = p + 1;
        while (k < n && (CharClasses.Of(t[k]) & CharClasses.Space) != 0) k++;
        for (int j = k - 1; j >= p; j--)              // \s*[\r\n]+ — up to the run's last newline
            if (t[j] is '\r' or '\n') return j + 1;
        if (k == n) return n;                          // \s+(?!\S) at the end of the text
        return k - 1 > p ? k - 1 : p + 1;              // \s+(?!\S), else \s+ of one character
    }
}
