using RankFreq.Counting;

namespace RankFreq.Fitting;

/// <summary>
/// The observed spectrum averaged over logarithmic bins of frequency, on the same scale as
/// <see cref="TailModelCurves.Spectrum"/> (types per exact frequency). Far in a heavy tail most frequencies are held by
/// one type or none, so single points cannot be compared with an expectation far below one; bin averages can.
/// </summary>
public static class SpectrumBins
{
    /// <summary>
    /// Bins of integer frequencies from <paramref name="from"/> up to the largest observed value, with edges at
    /// ⌈from · 10^(k/perDecade)⌉ (each bin at least one integer wide). For each bin holding at least one type:
    /// the geometric centre √(lo·hi) of its integer range [lo, hi] and the observed types in it divided by its width
    /// hi − lo + 1. Empty bins are left out (zero has no place on a log axis).
    /// </summary>
    /// <remarks>Σ average · width over the bins equals the number of types at or above <paramref name="from"/> (tested).</remarks>
    public static (double[] X, double[] TypesPerFrequency, long[] Width) LogBinned(FrequencySpectrum s, long from, int perDecade = 5)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(from, 1);
        ArgumentOutOfRangeException.ThrowIfLessThan(perDecade, 1);
        var xs = new List<double>();
        var avg = new List<double>();
        var widths = new List<long>();
        var v = s.Values;
        if (v.Length == 0) return ([], [], []);
        long top = v[^1];
        int i = Array.BinarySearch(v, from);
        if (i < 0) i = ~i;
        long lo = from;
        for (int k = 1; lo <= top; k++)
        {
            long next = Math.Max(lo + 1, (long)Math.Ceiling(from * Math.Pow(10, k / (double)perDecade) - 1e-9));
            long hi = next - 1, types = 0;
            for (; i < v.Length && v[i] <= hi; i++) types += s.Types[i];
            if (types > 0)
            {
                long width = hi - lo + 1;
                xs.Add(Math.Sqrt((double)lo * hi));
                avg.Add(types / (double)width);
                widths.Add(width);
            }
            lo = next;
        }
        return (xs.ToArray(), avg.ToArray(), widths.ToArray());
    }
}
