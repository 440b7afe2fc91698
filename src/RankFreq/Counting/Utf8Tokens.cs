using System.Text;

namespace RankFreq.Counting;

/// <summary>
/// A column of tokens as UTF-8 bytes laid end to end: token <c>i</c> is <c>Bytes[Starts[i]..Starts[i + 1]]</c>.
/// Rank tables carry their tokens this way from the counting engine to the table writer, so no string is made per
/// type on the way (at millions of types the strings and their collection were a tenth of a count's time).
/// </summary>
public sealed class Utf8Tokens
{
    /// <summary>A column of <c>starts.Length - 1</c> tokens over <paramref name="bytes"/>.</summary>
    public Utf8Tokens(byte[] bytes, int[] starts)
    {
        if (starts.Length == 0) throw new ArgumentException("starts holds one more entry than there are tokens");
        Bytes = bytes;
        Starts = starts;
    }

    /// <summary>The tokens' bytes, end to end.</summary>
    public byte[] Bytes { get; }

    /// <summary>Where each token starts in <see cref="Bytes"/>, and one past the last token's end.</summary>
    public int[] Starts { get; }

    /// <summary>Number of tokens.</summary>
    public int Length => Starts.Length - 1;

    /// <summary>The bytes of token <paramref name="i"/>.</summary>
    public ReadOnlySpan<byte> this[int i] => Bytes.AsSpan(Starts[i], Starts[i + 1] - Starts[i]);

    /// <summary>The tokens as strings (made on each call).</summary>
    public string?[] ToStrings()
    {
        var s = new string?[Length];
        for (int i = 0; i < s.Length; i++) s[i] = Encoding.UTF8.GetString(this[i]);
        return s;
    }

    /// <summary>Tokens <paramref name="start"/> to <paramref name="start"/> + <paramref name="n"/> as a column of their own.</summary>
    public Utf8Tokens Slice(int start, int n)
    {
        if (start == 0 && n == Length) return this;
        int from = Starts[start], to = Starts[start + n];
        var starts = new int[n + 1];
        for (int i = 0; i <= n; i++) starts[i] = Starts[start + i] - from;
        return new Utf8Tokens(Bytes[from..to], starts);
    }

    /// <summary>Builds a column of <paramref name="n"/> tokens, token <c>i</c> written by <paramref name="key"/>
    /// (which returns its bytes, using the 16-byte scratch buffer it is given where it likes).</summary>
    internal static Utf8Tokens Build(int n, KeyOf key)
    {
        var starts = new int[n + 1];
        Span<byte> scratch = stackalloc byte[16];
        long total = 0;
        for (int i = 0; i < n; i++) total += key(i, scratch).Length;
        var bytes = new byte[checked((int)total)];
        int at = 0;
        for (int i = 0; i < n; i++)
        {
            starts[i] = at;
            var k = key(i, scratch);
            k.CopyTo(bytes.AsSpan(at));
            at += k.Length;
        }
        starts[n] = at;
        return new Utf8Tokens(bytes, starts);
    }

    /// <summary>The key bytes of row <paramref name="i"/> of a column being built.</summary>
    internal delegate ReadOnlySpan<byte> KeyOf(int i, Span<byte> scratch);
}
