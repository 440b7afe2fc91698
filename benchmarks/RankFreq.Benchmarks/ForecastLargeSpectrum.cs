using BenchmarkDotNet.Attributes;
using BenchmarkDotNet.Engines;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;

namespace RankFreq.Benchmarks;

/// <summary>The vocabulary forecast on the spectrum of a 10^9-token sample: a Zipf–Mandelbrot rank population of
/// 5·10^6 types (p_i ∝ (i + 3.7)^−1.1) sampled with Binomial(10^9, p_i) counts (about 5·10^6 types seen, 14,000
/// distinct counts). "fit" fits all three models; "forecast" fits them and computes 100 points with 200 bootstrap
/// replicates on 2 threads (the command's defaults), intervals included.</summary>
[DefaultJob("ShortRun", RunStrategy.Monitoring, launchCount: 1, warmupCount: 1, iterationCount: 5)]
public class ForecastLargeSpectrum
{
    private FrequencySpectrum _s = null!;

    [GlobalSetup]
    public void Setup()
    {
        const int types = 5_000_000;
        var p = new double[types];
        double sum = 0;
        for (int i = 0; i < types; i++) sum += p[i] = Math.Pow(i + 3.7, -1.1);
        var rng = new Xoshiro(1);
        var b = new SpectrumBuilder();
        for (int i = 0; i < types; i++)
        {
            long c = Samplers.Binomial(rng, 1_000_000_000, p[i] / sum);
            if (c > 0) b.Add(c);
        }
        _s = b.Build();
        Console.WriteLine($"// data: {_s.TokenCount:N0} tokens, {_s.TypeCount:N0} types, {_s.Values.Length:N0} distinct counts");
    }

    [Benchmark(Description = "fit zm, fzm, gigp")]
    public int Fit() => LnreFitter.FitAll(_s).Count(f => f.Status == LnreStatus.Ok);

    [Benchmark(Description = "fit + 100 points, 200 replicates, 2 threads")]
    public int Forecast() =>
        Forecaster.Run(_s, new ForecastOptions([new ForecastTarget(10, true)], Points: 100, Reps: 200, Threads: 2)).RepsUsed;
}
