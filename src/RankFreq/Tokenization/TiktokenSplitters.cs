using System.Globalization;
using System.Runtime.CompilerServices;

namespace RankFreq.Tokenization;

/// <summary>
/// Hand-written equivalents of the cl100k_base and r50k_base pre-tokenizer regexes (as Microsoft.ML.Tokenizers 2.0.1
/// builds them; see <see cref="SubwordTokenizer.TiktokenPatterns"/>), which dominate the cost of counting with those
/// vocabularies. Each follows its regex alternative by alternative, with the same outcomes of greedy, atomic and
/// backtracking parts, on UTF-16 code units classified as .NET's regex engine classifies them (\p{L}: Lu Ll Lt Lm Lo;
/// \p{N}: Nd Nl No; \s: <see cref="char.IsWhiteSpace(char)"/>; a surrogate is none of these). Tested chunk for chunk
/// against the library's regexes on every UDHR translation and the Bible and address corpora.
/// </summary>
internal static class TiktokenSplitters
{
    /// <summary>The hand-written splitter of a tiktoken encoding.</summary>
    public static ChunkMatcher For(string encoding) => encoding switch
    {
        "o200k_base" => O200kSplitter.Match,
        "cl100k_base" => MatchCl100k,
        "r50k_base" => MatchR50k,
        _ => throw new ArgumentException($"no splitter for {encoding}", nameof(encoding)),
    };

    /// <summary>(offset, length) of every chunk of <paramref name="t"/>, in order; a character no rule matches is skipped, as the regex skips it.</summary>
    public static List<(int Offset, int Length)> Chunks(ChunkMatcher match, ReadOnlySpan<char> t)
    {
        var list = new List<(int, int)>();
        int p = 0;
        while (p < t.Length)
        {
            int e = match(t, p);
            if (e <= p) { p++; continue; }
            list.Add((p, e - p));
            p = e;
        }
        return list;
    }

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static byte Class(char c) => CharClasses.Of(c);

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static bool IsOther(char c) => (CharClasses.Of(c) & (L | N | S)) == 0; // [^\s\p{L}\p{N}]

    private const byte L = CharClasses.Letter, N = CharClasses.Number, S = CharClasses.Space, Nl = CharClasses.Newline;

    /// <summary>
    /// End of the cl100k_base chunk starting at <paramref name="p"/>:
    /// <code>'(?i:[sdmt]|ll|ve|re)|(?>[^\r\n\p{L}\p{N}]?)(?>\p{L}+)|(?>\p{N}{1,3})| ?(?>[^\s\p{L}\p{N}]+)(?>[\r\n]*)|(?>\s+)$|\s*[\r\n]|\s+(?!\S)|\s</code>
    /// </summary>
    internal static int MatchCl100k(ReadOnlySpan<char> t, int p)
    {
        int n = t.Length, e;
        char c = t[p];
        // 1: a contraction, case-insensitive
        if (c == '\'' && (e = ContractionIgnoreCase(t, p)) > p) return e;
        byte k = Class(c);
        // 2: one optional character that is not a newline, letter or number, then letters
        int q = (k & (Nl | L | N)) == 0 ? p + 1 : p;
        if (q < n && (Class(t[q]) & L) != 0)
        {
            e = q + 1;
            while (e < n && (Class(t[e]) & L) != 0) e++;
            return e;
        }
        // 3: one to three numbers
        if ((k & N) != 0)
        {
            e = p + 1;
            while (e < n && e < p + 3 && (Class(t[e]) & N) != 0) e++;
            return e;
        }
        // 4: an optional space, other characters, then any newlines
        q = c == ' ' && p + 1 < n && IsOther(t[p + 1]) ? p + 1 : IsOther(c) ? p : -1;
        if (q >= 0)
        {
            e = q + 1;
            while (e < n && IsOther(t[e])) e++;
            while (e < n && (t[e] == '\r' || t[e] == '\n')) e++;
            return e;
        }
        return Whitespace(t, p, newlineRule: true);
    }

    /// <summary>
    /// End of the r50k_base chunk starting at <paramref name="p"/>:
    /// <code>'(?:[sdmt]|ll|ve|re)| ?(?>\p{L}+)| ?(?>\p{N}+)| ?(?>[^\s\p{L}\p{N}]+)|(?>\s+)$|\s+(?!\S)|\s</code>
    /// </summary>
    internal static int MatchR50k(ReadOnlySpan<char> t, int p)
    {
        int n = t.Length;
        char c = t[p];
        // 1: a contraction, case-sensitive
        if (c == '\'' && p + 1 < n)
        {
            char a = t[p + 1];
            if (a is 's' or 'd' or 'm' or 't') return p + 2;
            if (p + 2 < n)
            {
                char b = t[p + 2];
                if ((a == 'l' && b == 'l') || (a == 'v' && b == 'e') || (a == 'r' && b == 'e')) return p + 3;
            }
        }
        // 2-4: an optional space, then a run of letters, of numbers, or of other characters
        int q = c == ' ' && p + 1 < n && (Class(t[p + 1]) & S) == 0 ? p + 1 : p;
        byte k = Class(t[q]);
        if ((k & S) == 0)
        {
            byte kind = (k & L) != 0 ? L : (k & N) != 0 ? N : (byte)0;
            int e = q + 1;
            if (kind == 0) while (e < n && IsOther(t[e])) e++;
            else while (e < n && (Class(t[e]) & kind) != 0) e++;
            return e;
        }
        return Whitespace(t, p, newlineRule: false);
    }

    /// <summary>
    /// The whitespace alternatives at a whitespace character: (?>\s+)$, then (cl100k only) \s*[\r\n], then
    /// \s+(?!\S), then \s.
    /// </summary>
    private static int Whitespace(ReadOnlySpan<char> t, int p, bool newlineRule)
    {
        int n = t.Length, k = p + 1;
        while (k < n && (Class(t[k]) & S) != 0) k++;
        if (k == n) return n;                   // (?>\s+)$ — the run reaches the end
        if (newlineRule)
            for (int j = k - 1; j >= p; j--)    // \s*[\r\n] — up to the run's last newline
                if (t[j] == '\r' || t[j] == '\n') return j + 1;
        if (k - 1 > p) return k - 1;            // \s+(?!\S) — all but the last, which stays with what follows
        return p + 1;                           // \s
    }

    /// <summary>(?i:[sdmt]|ll|ve|re) after an apostrophe at <paramref name="p"/>; <paramref name="p"/> when none matches.</summary>
    internal static int ContractionIgnoreCase(ReadOnlySpan<char> t, int p)
    {
        if (p + 1 >= t.Length) return p;
        char a = char.ToLowerInvariant(t[p + 1]);
        if (a is 's' or 'd' or 'm' or 't' || t[p + 1] == '\u017F') return p + 2; // ſ is a case variant of s for .NET's regex
        if (p + 2 < t.Length)
        {
            char b = char.ToLowerInvariant(t[p + 2]);
            if ((a == 'l' && b == 'l') || (a == 'v' && b == 'e') || (a == 'r' && b == 'e')) return p + 3;
        }
        return p;
    }
}
