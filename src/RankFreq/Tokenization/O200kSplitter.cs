namespace RankFreq.Tokenization;

/// <summary>
/// A hand-written equivalent of the o200k_base pre-tokenizer regex, which dominates the cost of counting with that
/// vocabulary. It follows the regex alternative by alternative, with the same backtracking outcomes, on UTF-16 code
/// units classified by <see cref="char.GetUnicodeCategory(char)"/> exactly as .NET's regex engine does (so a surrogate
/// is neither a letter nor a number):
/// <code>
/// [^\r\n\p{L}\p{N}]?[\p{Lu}\p{Lt}\p{Lm}\p{Lo}\p{M}]*[\p{Ll}\p{Lm}\p{Lo}\p{M}]+(?i:'s|'t|'re|'ve|'m|'ll|'d)?
/// |[^\r\n\p{L}\p{N}]?[\p{Lu}\p{Lt}\p{Lm}\p{Lo}\p{M}]+[\p{Ll}\p{Lm}\p{Lo}\p{M}]*(?i:'s|'t|'re|'ve|'m|'ll|'d)?
/// |\p{N}{1,3}| ?[^\s\p{L}\p{N}]+[\r\n/]*|\s*[\r\n]+|\s+(?!\S)|\s+
/// </code>
/// Tested chunk for chunk against the regex on every UDHR translation and the Bible and address corpora.
/// </summary>
internal static class O200kSplitter
{
    /// <summary>The regex this splitter replaces, as Microsoft.ML.Tokenizers 2.0.1 builds it.</summary>
    public const string Pattern =
        @"[^\r\n\p{L}\p{N}]?[\p{Lu}\p{Lt}\p{Lm}\p{Lo}\p{M}]*[\p{Ll}\p{Lm}\p{Lo}\p{M}]+(?i:'s|'t|'re|'ve|'m|'ll|'d)?"
        + @"|[^\r\n\p{L}\p{N}]?[\p{Lu}\p{Lt}\p{Lm}\p{Lo}\p{M}]+[\p{Ll}\p{Lm}\p{Lo}\p{M}]*(?i:'s|'t|'re|'ve|'m|'ll|'d)?"
        + @"|\p{N}{1,3}| ?[^\s\p{L}\p{N}]+[\r\n/]*|\s*[\r\n]+|\s+(?!\S)|\s+";

    private const byte Upperish = CharClasses.Upperish, Lowerish = CharClasses.Lowerish, Letter = CharClasses.Letter,
        Number = CharClasses.Number, Space = CharClasses.Space, Newline = CharClasses.Newline;

    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static byte Class(char c) => CharClasses.Of(c);

    /// <summary>End of the chunk starting at <paramref name="p"/>, or <paramref name="p"/> when nothing matches.</summary>
    internal static int Match(ReadOnlySpan<char> t, int p)
    {
        int n = t.Length;
        byte c0 = Class(t[p]);
        bool prefix = (c0 & (Letter | Number | Newline)) == 0; // [^\r\n\p{L}\p{N}]
        int e;
        // alternative 1: P? U* W+ C?
        if (prefix && p + 1 < n && (e = UpperStarLowerPlus(t, p + 1)) > 0) return Contraction(t, e);
        if ((e = UpperStarLowerPlus(t, p)) > 0) return Contraction(t, e);
        // alternative 2: P? U+ W* C?
        if (prefix && p + 1 < n && (e = UpperPlusLowerStar(t, p + 1)) > 0) return Contraction(t, e);
        if ((e = UpperPlusLowerStar(t, p)) > 0) return Contraction(t, e);
        // alternative 3: \p{N}{1,3}
        if ((c0 & Number) != 0)
        {
            e = p + 1;
            while (e < n && e < p + 3 && (Class(t[e]) & Number) != 0) e++;
            return e;
        }
        // alternative 4: ' '? [^\s\p{L}\p{N}]+ [\r\n/]*
        int q = t[p] == ' ' && p + 1 < n && IsOther(t[p + 1]) ? p + 1 : IsOther(t[p]) ? p : -1;
        if (q >= 0)
        {
            e = q + 1;
            while (e < n && IsOther(t[e])) e++;
            while (e < n && (t[e] == '\r' || t[e] == '\n' || t[e] == '/')) e++;
            return e;
        }
        if ((c0 & Space) == 0) return p;
        int k = p + 1;
        while (k < n && (Class(t[k]) & Space) != 0) k++;
        // alternative 5: \s* [\r\n]+ — the run must hold a newline; the chunk ends after its last one
        for (int j = k - 1; j >= p; j--)
            if (t[j] == '\r' || t[j] == '\n') return j + 1;
        // alternative 6: \s+(?!\S)
        if (k == n) return k;
        if (k - 1 > p) return k - 1;
        // alternative 7: \s+
        return k;
    }

    private static bool IsOther(char c) => (Class(c) & (Space | Letter | Number)) == 0;

    private static int UpperStarLowerPlus(ReadOnlySpan<char> t, int q)
    {
        int n = t.Length, k = q;
        while (k < n && (Class(t[k]) & Upperish) != 0) k++;
        for (int m = k; m >= q; m--)
        {
            if (m < n && (Class(t[m]) & Lowerish) != 0)
            {
                int e = m + 1;
                while (e < n && (Class(t[e]) & Lowerish) != 0) e++;
                return e;
            }
        }
        return -1;
    }

    private static int UpperPlusLowerStar(ReadOnlySpan<char> t, int q)
    {
        int n = t.Length, k = q;
        while (k < n && (Class(t[k]) & Upperish) != 0) k++;
        if (k == q) return -1;
        while (k < n && (Class(t[k]) & Lowerish) != 0) k++;
        return k;
    }

    /// <summary>(?i:'s|'t|'re|'ve|'m|'ll|'d)? after a letter run ending at <paramref name="e"/>.</summary>
    private static int Contraction(ReadOnlySpan<char> t, int e) =>
        e < t.Length && t[e] == '\'' ? TiktokenSplitters.ContractionIgnoreCase(t, e) : e;
}
