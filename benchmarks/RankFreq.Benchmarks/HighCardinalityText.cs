using RankFreq.Fitting;
using RankFreq.Storage;

namespace RankFreq.Benchmarks;

/// <summary>
/// Seeded high-cardinality text for the counting benchmarks (`tools make-highcard`): lines of lower-case letter
/// strings separated by spaces, twelve to a line.
/// </summary>
/// <remarks>
/// <para><b>zipf</b>: each token is a rank r drawn from the Zipf law p(r) ∝ r^−s on r ≥ 1 (rejection–inversion,
/// <see cref="Samplers.PowerLaw"/>) and spelled in bijective base 26, so frequent ranks are short words and every rank
/// has exactly one spelling (distinct ranks give distinct strings; letter i of a word is shifted by 7i mod 26, a
/// bijection within each length, so the words are not plain counter spellings). With s = 1.1, 2·10^7 tokens give about
/// 6.5·10^6 types (most of them hapaxes), which is the high-cardinality shape of web text with numbers and names.</para>
/// <para><b>unique</b>: uniformly random letter strings of 5 to 9 letters: nearly every token a new type.</para>
/// <para>The same (mode, tokens, s, seed) always writes the same bytes: one <see cref="Xoshiro"/> stream.</para>
/// </remarks>
internal static class HighCardinalityText
{
    public const string Usage = "tools make-highcard FILE TOKENS [zipf|unique] [s] [seed]   (high-cardinality text; "
        + "zipf: Zipf ranks with exponent s, default 1.1, spelled as letter strings; unique: random 5-9 letter strings)";

    /// <summary>Writes the text; returns the exit code.</summary>
    public static int Run(string[] args)
    {
        if (args.Length < 2 || !long.TryParse(args[1], System.Globalization.NumberStyles.Float,
                System.Globalization.CultureInfo.InvariantCulture, out long tokens) || tokens <= 0)
        {
            Console.Error.WriteLine("usage: RankFreq.Benchmarks " + Usage);
            return 2;
        }
        string mode = args.Length > 2 ? args[2] : "zipf";
        double s = args.Length > 3 ? double.Parse(args[3], System.Globalization.CultureInfo.InvariantCulture) : 1.1;
        ulong seed = args.Length > 4 ? ulong.Parse(args[4], System.Globalization.CultureInfo.InvariantCulture) : 1;
        if (mode is not ("zipf" or "unique") || s <= 1)
        {
            Console.Error.WriteLine("usage: RankFreq.Benchmarks " + Usage + "; s must be above 1");
            return 2;
        }
        long bytes = 0;
        try
        {
            AtomicFile.WriteAsync(args[0], stream =>
            {
                bytes = Write(stream, tokens, mode == "unique", s, seed);
                return Task.CompletedTask;
            }).GetAwaiter().GetResult();
        }
        catch (StorageException e)
        {
            Console.Error.WriteLine(e.Message);
            return 1;
        }
        Console.WriteLine($"{args[0]}: {tokens:N0} tokens, {bytes:N0} bytes ({mode}, s = {s}, seed {seed})");
        return 0;
    }

    /// <summary>Writes <paramref name="tokens"/> tokens to <paramref name="output"/>; returns the bytes written.</summary>
    public static long Write(Stream output, long tokens, bool unique, double s, ulong seed)
    {
        var rng = new Xoshiro(seed, stream: unique ? 2UL : 1UL);
        var buf = new byte[1 << 20];
        int pos = 0;
        long written = 0;
        Span<byte> word = stackalloc byte[16];
        for (long i = 0; i < tokens; i++)
        {
            int len = unique ? RandomWord(rng, word) : Spell(Samplers.PowerLaw(rng, s, 1), word);
            if (pos + len + 1 > buf.Length)
            {
                output.Write(buf, 0, pos);
                written += pos;
                pos = 0;
            }
            word[..len].CopyTo(buf.AsSpan(pos));
            pos += len;
            buf[pos++] = (byte)(i % 12 == 11 || i == tokens - 1 ? '\n' : ' ');
        }
        output.Write(buf, 0, pos);
        return written + pos;
    }

    /// <summary>Rank r ≥ 1 in bijective base 26 (a..z, aa.., one spelling per rank), letters shifted by position.</summary>
    internal static int Spell(long r, Span<byte> word)
    {
        int n = 0;
        Span<byte> rev = stackalloc byte[16];
        while (r > 0)
        {
            r--;
            rev[n] = (byte)(r % 26);
            r /= 26;
            n++;
        }
        for (int i = 0; i < n; i++) word[i] = (byte)('a' + (rev[n - 1 - i] + 7 * i) % 26);
        return n;
    }

    private static int RandomWord(Xoshiro rng, Span<byte> word)
    {
        int len = 5 + (int)rng.NextLong(5);
        for (int i = 0; i < len; i++) word[i] = (byte)('a' + rng.NextLong(26));
        return len;
    }
}
