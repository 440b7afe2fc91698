using System.Globalization;

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
    public const string Pattern = @"[^\r\n\p{L}\p{N}]?[\p{Lu}\p{Lt}\p{Lm}\p{Lo}\p{M}]*[\p{Ll}\p{Lm}\p{Lo}\p{M}]+(?i:'s|'t|'re|'ve|'m|'ll|'d)?|[^\r\n\p{L}\p{N}]?[\p{Lu}\p{Lt}\p{Lm}\p{Lo}\p{M}]+[\p{Ll}\p{Lm}\p{Lo}\p{M}]*(?i:'s|'t|'re|'ve|'m|'ll|'d)?|\p{N}{1,3}| ?[^\s\p{L}\p{N}]+[\r\n/]*|\s*[\r\n]+|\s+(?!\S)|\s+";

    // class bits
    private const byte Upperish = 1, Lowerish = 2, Letter = 4, Number = 8, Space = 16, Newline = 32;
    // every UTF-16 code unit's class bits, computed once (64 KiB): the splitter asks for one per character
    private static readonly byte[] Table = BuildTable();

    private static byte[] BuildTable()
    {
        var t = new byte[0x10000];
        for (int c = 0; c < t.Length; c++) t[c] = Slow((char)c);
        return t;
    }

    private static byte Slow(char c)
    {
        byte b = 0;
        if (char.IsWhiteSpace(c)) b |= Space;
        if (c == '\r' || c == '\n') b |= Newline;
        switch (char.GetUnicodeCategory(c))
        {
            case UnicodeCategory.UppercaseLetter: case UnicodeCategory.TitlecaseLetter: b |= Upperish | Letter; break;
            case UnicodeCategory.LowercaseLetter: b |= Lowerish | Letter; break;
            case UnicodeCategory.ModifierLetter: case UnicodeCategory.OtherLetter: b |= Upperish | Lowerish | Letter; break;
            case UnicodeCategory.NonSpacingMark: case UnicodeCategory.SpacingCombiningMark: case UnicodeCategory.EnclosingMark: b |= Upperish | Lowerish; break;
            case UnicodeCategory.DecimalDigitNumber: case UnicodeCategory.LetterNumber: case UnicodeCategory.OtherNumber: b |= Number; break;
        }
        return b;
    }

    [System.Runtime.CompilerServices.MethodImpl(System.Runtime.CompilerServices.MethodImplOptions.AggressiveInlining)]
    private static byte Class(char c) => Table[c];

    /// <summary>Calls <paramref name="chunk"/> with (offset, length) of every chunk of <paramref name="t"/>, in order.</summary>
    public static void Split(ReadOnlySpan<char> t, Action<int, int> chunk)
    {
        int n = t.Length, p = 0;
        while (p < n)
        {
            int e = Match(t, p);
            if (e <= p) { p++; continue; } // no alternative matches this character: the regex skips it
            chunk(p, e - p);
            p = e;
        }
    }

    /// <summary>Chunks as a list (used by tests).</summary>
    public static List<(int Offset, int Length)> Chunks(ReadOnlySpan<char> t)
    {
        var list = new List<(int, int)>();
        Split(t, (o, l) => list.Add((o, l)));
        return list;
    }

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
