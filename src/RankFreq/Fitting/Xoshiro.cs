namespace RankFreq.Fitting;

/// <summary>
/// xoshiro256** (Blackman &amp; Vigna 2018), seeded by SplitMix64 from (seed, stream, index) so that a bootstrap
/// replicate's numbers depend only on the seed and its index, never on the thread that runs it.
/// </summary>
public sealed class Xoshiro
{
    private ulong _s0, _s1, _s2, _s3;
    private double _spareNormal;
    private bool _hasSpare;

    /// <summary>A generator for replicate <paramref name="index"/> of stream <paramref name="stream"/> under <paramref name="seed"/>.</summary>
    public Xoshiro(ulong seed, ulong stream = 0, ulong index = 0)
    {
        ulong x = seed ^ (stream * 0x9E3779B97F4A7C15UL) ^ (index * 0xD1B54A32D192ED03UL);
        _s0 = SplitMix(ref x); _s1 = SplitMix(ref x); _s2 = SplitMix(ref x); _s3 = SplitMix(ref x);
    }

    private static ulong SplitMix(ref ulong x)
    {
        ulong z = x += 0x9E3779B97F4A7C15UL;
        z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9UL;
        z = (z ^ (z >> 27)) * 0x94D049BB133111EBUL;
        return z ^ (z >> 31);
    }

    /// <summary>Next 64 random bits.</summary>
    public ulong NextUInt64()
    {
        ulong result = ulong.RotateLeft(_s1 * 5, 7) * 9;
        ulong t = _s1 << 17;
        _s2 ^= _s0; _s3 ^= _s1; _s1 ^= _s2; _s0 ^= _s3; _s2 ^= t;
        _s3 = ulong.RotateLeft(_s3, 45);
        return result;
    }

    /// <summary>The next <c>into.Length</c> values of <see cref="NextUInt64"/>, in order (the state kept in registers
    /// for the whole run instead of in the object between calls).</summary>
    internal void Fill(Span<ulong> into)
    {
        ulong s0 = _s0, s1 = _s1, s2 = _s2, s3 = _s3;
        for (int i = 0; i < into.Length; i++)
        {
            into[i] = ulong.RotateLeft(s1 * 5, 7) * 9;
            ulong t = s1 << 17;
            s2 ^= s0; s3 ^= s1; s1 ^= s2; s0 ^= s3; s2 ^= t;
            s3 = ulong.RotateLeft(s3, 45);
        }
        _s0 = s0; _s1 = s1; _s2 = s2; _s3 = s3;
    }

    /// <summary>Uniform on [0, 1).</summary>
    public double NextDouble() => (NextUInt64() >> 11) * (1.0 / (1UL << 53));

    /// <summary>Uniform on (0, 1).</summary>
    public double NextOpen() => ((NextUInt64() >> 11) + 0.5) * (1.0 / (1UL << 53));

    /// <summary>Uniform integer in [0, n).</summary>
    public long NextLong(long n) => (long)(NextDouble() * n) is var v && v < n ? v : n - 1;

    /// <summary>Standard normal (Marsaglia polar method).</summary>
    public double NextNormal()
    {
        if (_hasSpare) { _hasSpare = false; return _spareNormal; }
        double u, v, s;
        do { u = 2 * NextDouble() - 1; v = 2 * NextDouble() - 1; s = u * u + v * v; } while (s >= 1 || s == 0);
        double f = Math.Sqrt(-2 * Math.Log(s) / s);
        _spareNormal = v * f; _hasSpare = true;
        return u * f;
    }
}
