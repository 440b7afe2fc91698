using System.Runtime.CompilerServices;
using System.Diagnostics;
using System.Text;
using RankFreq.Sources;
using RankFreq.Tokenization;
using RankFreq.Primitives;

namespace RankFreq.Counting;

/// <summary>Counts types by the growth checkpoint at which each was first seen.</summary>
internal sealed class GrowthHistogram
{
    private readonly long[] _checkpoints;
    private readonly long[]? _unitStart;
    private readonly long[] _hist;
    // where to start looking for a position's checkpoint: _from[p >> _shift] checkpoints lie at or below p's bucket
    // start, so a type costs a table read and a step or two instead of a binary search (at millions of types the
    // search was a twentieth of a count's time)
    private readonly int[] _from;
    private readonly int _shift;

    public GrowthHistogram(long[] checkpoints, long[]? unitStart)
    {
        _checkpoints = checkpoints;
        _unitStart = unitStart;
        _hist = new long[checkpoints.Length + 1];
        long last = checkpoints.Length == 0 ? 0 : checkpoints[^1];
        _shift = Math.Max(0, 64 - System.Numerics.BitOperations.LeadingZeroCount((ulong)last) - 14);
        _from = new int[(int)(last >> _shift) + 1];
        for (int b = 0, c = 0; b < _from.Length; b++)
        {
            long at = (long)b << _shift;
            while (c < checkpoints.Length && checkpoints[c] <= at) c++;
            _from[b] = c;
        }
    }

    /// <summary>Records a type first seen at packed position <paramref name="first"/>.</summary>
    public void Add(long first)
    {
        if (_unitStart is null || first == long.MaxValue) return;
        long global = _unitStart[(int)(first >> 40)] + (first & ((1L << 40) - 1));
        // the number of checkpoints at or below the position: the type is counted from the next one on
        long b = global >> _shift;
        int c = _from[b < _from.Length ? (int)b : _from.Length - 1];
        var cp = _checkpoints;
        while (c < cp.Length && cp[c] <= global) c++;
        _hist[c]++;
    }

    /// <summary>An empty histogram with the same checkpoints, to fill on another thread and <see cref="Absorb"/>.</summary>
    public GrowthHistogram Fork() => new(_checkpoints, _unitStart);

    /// <summary>Adds the types recorded in <paramref name="other"/> (a <see cref="Fork"/> of this one).</summary>
    public void Absorb(GrowthHistogram other)
    {
        for (int i = 0; i < _hist.Length; i++) _hist[i] += other._hist[i];
    }

    public GrowthCurve ToCurve()
    {
        if (_unitStart is null) return new GrowthCurve([], []);
        var types = new long[_checkpoints.Length];
        long run = 0;
        for (int c = 0; c < _checkpoints.Length; c++) { run += _hist[c]; types[c] = run; }
        return new GrowthCurve(_checkpoints, types);
    }
}
