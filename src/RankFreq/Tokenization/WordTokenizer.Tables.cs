using System.Runtime.CompilerServices;

namespace RankFreq.Tokenization;

// Byte tables of the ASCII fast path, built once from the rule.
public sealed partial class WordTokenizer
{
    /// <summary>256 bytes indexed by a byte: the length is a constant, so the JIT drops the bounds check.</summary>
    [InlineArray(256)]
    private struct ByteTable
    {
        private byte _element;
    }

    /// <summary>1 where a token may start: an ASCII letter or digit, or any non-ASCII byte.</summary>
    private static readonly ByteTable StartTable = BuildTable(b => b >= 0x80 || char.IsAsciiLetterOrDigit((char)b) ? (byte)1 : (byte)0);

    /// <summary>1 for a lower-case ASCII letter or digit, 3 for an upper-case letter (bit 2 marks case), 0 otherwise.</summary>
    private static readonly ByteTable WordTable = BuildTable(b =>
        b >= 0x80 ? (byte)0 : char.IsAsciiLetterUpper((char)b) ? (byte)3 : char.IsAsciiLetterOrDigit((char)b) ? (byte)1 : (byte)0);

    /// <summary>16 bytes of 0xFF then 16 of 0: loading 16 bytes at offset 16 − len masks the first len bytes.</summary>
    private static readonly byte[] LengthMask = [.. Enumerable.Repeat((byte)0xFF, 16), .. new byte[16]];

    private static ByteTable BuildTable(Func<int, byte> rule)
    {
        var t = new ByteTable();
        for (int b = 0; b < 256; b++) t[b] = rule(b);
        return t;
    }
}
