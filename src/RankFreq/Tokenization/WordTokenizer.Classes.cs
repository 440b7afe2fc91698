using System.Globalization;
using System.Text;

namespace RankFreq.Tokenization;

// The rule's character classes.
public sealed partial class WordTokenizer
{
    // ASCII classes: 0 separator, 1 lower/digit, 2 upper, 3 apostrophe.
    private static readonly byte[] AsciiClass = BuildAsciiClass();

    private static byte[] BuildAsciiClass()
    {
        var t = new byte[128];
        for (int c = 'a'; c <= 'z'; c++) t[c] = 1;
        for (int c = '0'; c <= '9'; c++) t[c] = 1;
        for (int c = 'A'; c <= 'Z'; c++) t[c] = 2;
        t['\''] = 3;
        return t;
    }

    internal enum Kind { Separator, Word, Apostrophe, Han }

    internal static Kind Classify(Rune r)
    {
        int v = r.Value;
        if (v < 0x10000) return (Kind)(Bmp.Table[v] & 3);
        return ClassifySlow(r);
    }

    /// <summary>The rule's classes of every code point below U+10000, computed once: bits 0–1 <see cref="Kind"/>, bit 2 letter or digit.</summary>
    private static class Bmp
    {
        public static readonly byte[] Table = Build();

        private static byte[] Build()
        {
            var t = new byte[0x10000];
            for (int v = 0; v < t.Length; v++)
            {
                if (v is >= 0xD800 and <= 0xDFFF) continue; // surrogates are never decoded runes
                var r = new Rune(v);
                t[v] = (byte)((int)ClassifySlow(r) | (IsLetterOrDigitSlow(r) ? 4 : 0));
            }
            return t;
        }
    }

    private static Kind ClassifySlow(Rune r)
    {
        int v = r.Value;
        if (v < 0x80)
        {
            byte c = AsciiClass[v];
            return c == 3 ? Kind.Apostrophe : c != 0 ? Kind.Word : Kind.Separator;
        }
        if (v == 0x2019) return Kind.Apostrophe;
        if (IsHan(v)) return Kind.Han;
        switch (Rune.GetUnicodeCategory(r))
        {
            case UnicodeCategory.UppercaseLetter:
            case UnicodeCategory.LowercaseLetter:
            case UnicodeCategory.TitlecaseLetter:
            case UnicodeCategory.ModifierLetter:
            case UnicodeCategory.OtherLetter:
            case UnicodeCategory.NonSpacingMark:
            case UnicodeCategory.SpacingCombiningMark:
            case UnicodeCategory.EnclosingMark:
            case UnicodeCategory.DecimalDigitNumber:
                return Kind.Word;
            default:
                return Kind.Separator;
        }
    }

    private static bool IsLetterOrDigit(Rune r) => r.Value < 0x10000 ? (Bmp.Table[r.Value] & 4) != 0 : IsLetterOrDigitSlow(r);

    private static bool IsLetterOrDigitSlow(Rune r)
    {
        if (r.Value < 0x80) return AsciiClass[r.Value] is 1 or 2;
        var c = Rune.GetUnicodeCategory(r);
        return c <= UnicodeCategory.OtherLetter || c == UnicodeCategory.DecimalDigitNumber;
    }

    /// <summary>CJK Unified Ideographs and their extensions and compatibility blocks.</summary>
    internal static bool IsHan(int v) =>
        (v >= 0x4E00 && v <= 0x9FFF) || (v >= 0x3400 && v <= 0x4DBF) || (v >= 0xF900 && v <= 0xFAFF) ||
        (v >= 0x20000 && v <= 0x2FA1F) || (v >= 0x30000 && v <= 0x323AF);
}
