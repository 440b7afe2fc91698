using System.Globalization;
using System.Runtime.CompilerServices;

namespace RankFreq.Tokenization;

/// <summary>
/// Class bits of every UTF-16 code unit, computed once (64 KiB), as .NET's regex engine sees them: a surrogate is
/// neither a letter nor a number; \s is <see cref="char.IsWhiteSpace(char)"/>. Shared by the tiktoken splitters.
/// </summary>
internal static class CharClasses
{
    /// <summary>Lu, Lt, Lm, Lo or a mark (o200k's upper-case class).</summary>
    public const byte Upperish = 1;
    /// <summary>Ll, Lm, Lo or a mark (o200k's lower-case class).</summary>
    public const byte Lowerish = 2;
    /// <summary>\p{L}: Lu Ll Lt Lm Lo.</summary>
    public const byte Letter = 4;
    /// <summary>\p{N}: Nd Nl No.</summary>
    public const byte Number = 8;
    /// <summary>\s.</summary>
    public const byte Space = 16;
    /// <summary>\r or \n.</summary>
    public const byte Newline = 32;

    private static readonly byte[] Table = Build();

    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    public static byte Of(char c) => Table[c];

    private static byte[] Build()
    {
        var t = new byte[0x10000];
        for (int i = 0; i < t.Length; i++)
        {
            char c = (char)i;
            byte b = 0;
            if (char.IsWhiteSpace(c)) b |= Space;
            if (c == '\r' || c == '\n') b |= Newline;
            switch (char.GetUnicodeCategory(c))
            {
                case UnicodeCategory.UppercaseLetter: case UnicodeCategory.TitlecaseLetter: b |= Upperish | Letter; break;
                case UnicodeCategory.LowercaseLetter: b |= Lowerish | Letter; break;
                case UnicodeCategory.ModifierLetter: case UnicodeCategory.OtherLetter: b |= Upperish | Lowerish | Letter; break;
                case UnicodeCategory.NonSpacingMark:
                case UnicodeCategory.SpacingCombiningMark:
                case UnicodeCategory.EnclosingMark:
                    b |= Upperish | Lowerish;
                    break;
                case UnicodeCategory.DecimalDigitNumber: case UnicodeCategory.LetterNumber: case UnicodeCategory.OtherNumber: b |= Number; break;
            }
            t[i] = b;
        }
        return t;
    }
}
