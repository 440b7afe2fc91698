using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>Observed vocabulary growth: after the first <c>Tokens[i]</c> tokens in corpus order, <c>Types[i]</c> types had been seen.</summary>
public sealed record GrowthCurve(long[] Tokens, long[] Types)
{
    /// <summary>About <paramref name="points"/> log-spaced checkpoints from 1 to <paramref name="total"/>, always ending at the total.</summary>
    public static long[] Checkpoints(long total, int points = 200)
    {
        if (total <= 0) return [];
        var s = new long[points + 2];
        int n = 0;
        // total^(i/points) rises with i, so duplicates are adjacent
        for (int i = 0; i <= points + 1; i++)
        {
            long c = i > points ? total : Math.Min(total, Math.Max(1, (long)Math.Round(Math.Pow(total, i / (double)points))));
            if (n == 0 || c > s[n - 1]) s[n++] = c;
        }
        return s[..n];
    }
}
