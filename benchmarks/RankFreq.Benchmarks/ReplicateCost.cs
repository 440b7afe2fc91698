using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Benchmarks;

/// <summary>One goodness-of-fit replicate done two ways on the same 10^6-type power law (α = 2, xmin = 1): as a
/// spectrum (the replicate the fitter runs: binomial splitting + rejection–inversion tail, full xmin search) and per
/// type (10^6 sampled values, sorted, MLE and KS per candidate over the array). The Ratio column is the speed-up.</summary>
/// <remarks>Each invocation draws a new replicate (stream index counts up), as a bootstrap does.</remarks>
[DefaultJob("ShortRun", RunStrategy.Throughput, launchCount: 1, warmupCount: 3, iterationCount: 3)]
public class ReplicateCost
{
    private FrequencySpectrum _data = null!;
    private double _alpha;
    private long _xmin;
    private readonly SpectrumBuffer _buf = new();
    private ulong _replicate;

    [GlobalSetup]
    public void Setup()
    {
        _data = SyntheticSpectra.PowerLaw(1_000_000);
        var fit = new TailSearch(_data.Values, _data.Types, _data.Values.Length).Search(50);
        (_alpha, _xmin) = (fit.Alpha, fit.Xmin);
        Console.WriteLine($"// data: {_data.TypeCount:N0} types, {_data.Values.Length:N0} distinct values, "
            + $"fit α = {fit.Alpha:F4}, xmin = {fit.Xmin}");
    }

    [Benchmark(Baseline = true, Description = "spectrum-level replicate")]
    public double SpectrumLevel()
    {
        var rng = new Xoshiro(7, 1, _replicate++);
        _buf.Clear();
        Synthetic.PowerLawTail(rng, _alpha, _xmin, _data.TypeCount, _buf);
        return new TailSearch(_buf.Values, _buf.Mult, _buf.Count).Search(50).Alpha;
    }

    [Benchmark(Description = "per-type replicate")]
    public double PerType() => NaiveReplicate(new Xoshiro(7, 1, _replicate++), _alpha, _xmin, _data.TypeCount);

    /// <summary>The straightforward procedure: an array of one value per type, sorted; for every distinct candidate
    /// xmin, the MLE by Newton on sums over the tail values, and the KS distance over the sorted tail.</summary>
    private static double NaiveReplicate(Xoshiro rng, double alpha, long xmin, long n)
    {
        var x = new long[n];
        for (long i = 0; i < n; i++) x[i] = Samplers.PowerLaw(rng, alpha, xmin);
        Array.Sort(x);
        double best = double.PositiveInfinity;
        int start = 0;
        while (start < n - 50)
        {
            long c = x[start];
            double sumLn = 0;
            for (long i = start; i < n; i++) sumLn += Math.Log(x[i]);
            long nt = n - start;
            double a = 2;
            for (int it = 0; it < 50; it++)
            {
                var z = HurwitzZeta.Evaluate(a, c);
                double r1 = z.D1 / z.Value, score = -sumLn / nt - r1, info = z.D2 / z.Value - r1 * r1;
                double next = Math.Max(1.0001, a + score / info);
                if (Math.Abs(next - a) < 1e-10) { a = next; break; }
                a = next;
            }
            double z0 = HurwitzZeta.Value(a, c), d = 0;
            for (long i = start; i < n; i++)
            {
                if (i + 1 < n && x[i + 1] == x[i]) continue;
                double emp = (i - start + 1) / (double)nt, model = 1 - HurwitzZeta.Value(a, x[i] + 1) / z0;
                d = Math.Max(d, Math.Abs(emp - model));
            }
            best = Math.Min(best, d);
            while (start < n && x[start] == c) start++;
        }
        return best;
    }
}
