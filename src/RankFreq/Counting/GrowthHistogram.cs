using System.Runtime.CompilerServices;
using System.Diagnostics;
using System.Text;
using RankFreq.Sources;
using RankFreq.Tokenization;
using RankFreq.Primitives;

namespace RankFreq.Counting;

/// <summary>Counts types by the growth checkpoint at which each was first seen.</summary>
internal sealed class GrowthHistogram(long[] checkpoints, long[]? unitStart)
{
    private readonly long[] _hist = new long[checkpoints.Length + 1];

    /// <summary>Records a type first seen at packed position <paramref name="first"/>.</summary>
    public void Add(long first)
    {
        if (unitStart is null || first == long.MaxValue) return;
        long global = unitStart[(int)(first >> 40)] + (first & ((1L << 40) - 1));
        // first checkpoint c with checkpoints[c] > global: the type is counted from there on. Halving without a branch
        // on the comparison (a conditional move): first positions come in no order, so a branch would mispredict
        int lo = 0, n = checkpoints.Length;
        while (n > 1)
        {
            int half = n >> 1;
            lo = checkpoints[lo + half - 1] <= global ? lo + half : lo;
            n -= half;
        }
        if (n == 1 && checkpoints[lo] <= global) lo++;
        _hist[lo]++;
    }

    /// <summary>An empty histogram with the same checkpoints, to fill on another thread and <see cref="Absorb"/>.</summary>
    public GrowthHistogram Fork() => new(checkpoints, unitStart);

    /// <summary>Adds the types recorded in <paramref name="other"/> (a <see cref="Fork"/> of this one).</summary>
    public void Absorb(GrowthHistogram other)
    {
        for (int i = 0; i < _hist.Length; i++) _hist[i] += other._hist[i];
    }

    public GrowthCurve ToCurve()
    {
        if (unitStart is null) return new GrowthCurve([], []);
        var types = new long[checkpoints.Length];
        long run = 0;
        for (int c = 0; c < checkpoints.Length; c++) { run += _hist[c]; types[c] = run; }
        return new GrowthCurve(checkpoints, types);
    }
}
