using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Jobs;
using RankFreq.Lexical;
using Xunit;
using Xunit.Abstractions;

namespace RankFreq.Tests.Lexical;

/// <summary>
/// Held-out checks on real text: thin a corpus to 15% of its tokens (binomial thinning, seeded: a type with count c
/// keeps Binomial(c, 0.15)), fit, forecast to the full size, and compare with the full corpus's V and V_1.
/// Thinning makes the small sample a random sample of the full one, so this tests the models' extrapolation alone
/// (not text order). LNRE forecasts are biased in a known direction: the Zipf–Mandelbrot model, with infinitely many
/// types, overestimates growth, and the finite models (fZM, GIGP) underestimate it as they level off towards their
/// population vocabulary S (Baayen 2001, ch. 3; Evert 2004; from memory). So the test asserts that the full corpus's
/// V and V_1 lie between the ZM forecast and the chosen finite model's, and bounds the chosen model's error: V within
/// 12% and V_1 within 45% at 6.7× (measured on these corpora: V −6% to −9%, V_1 −30% to −37%). Why V_1 needs the wide
/// bound (docs/forecast.md, "Why hapaxes are forecast low"): the shortfall is the finite models' shape below the
/// smallest probabilities a 15% sample resolves, not the fit — the fitted elements (k = 3 … 60), the cost's
/// weighting and a multivariate χ² cost all left it at −22% to −52% on the KJV, while on random samples of finite
/// Zipf–Mandelbrot populations the same code forecast V_1 within +6% (<see cref="LnreModelTests"/>). Thinning is random,
/// so text order does not enter, and clumping of words (Baayen 2001, ch. 5) makes the models forecast more hapaxes,
/// not fewer. The bound is the measured worst case with a margin for the thinning's randomness, not a target.
/// </summary>
public class ForecastCorpusTests(ITestOutputHelper output)
{
    private static FrequencySpectrum Thin(FrequencySpectrum s, double p, ulong seed)
    {
        var rng = new Xoshiro(seed, 77);
        var b = new SpectrumBuilder();
        for (int i = 0; i < s.Values.Length; i++)
            for (long t = 0; t < s.Types[i]; t++)
            {
                long k = Samplers.Binomial(rng, s.Values[i], p);
                if (k > 0) b.Add(k, 1);
            }
        return b.Build();
    }

    [CorpusTheory]
    [InlineData("kjv-bible.txt")]
    [InlineData("sotu.jsonl")]
    [InlineData("udhr")]
    public void ForecastFromAThinnedSampleMeetsTheFullCorpus(string corpus)
    {
        string path = Path.Combine(Corpora.Root ?? throw new InvalidOperationException("RANKFREQ_CORPORA is not set (required under CI=true)"), corpus);
        Assert.True(File.Exists(path) || Directory.Exists(path), $"corpus missing: {path}");
        using var counted = CountJob.Count([path], new CountSettings(Threads: 2));
        var full = counted.Spectrum;
        var thin = Thin(full, 0.15, 2026);
        var r = Forecaster.Run(thin, new ForecastOptions([new ForecastTarget(full.TokenCount, false)], Points: 20, Reps: 50, Threads: 2));
        Assert.NotNull(r.Chosen);
        var at = r.Points.Single(p => p.Tokens == full.TokenCount);
        double v1 = full.Values[0] == 1 ? full.Types[0] : 0;
        double errV = at.Types / full.TypeCount - 1, errV1 = at.Hapax / v1 - 1;
        double cover = Forecaster.ObservedCoverageTypes(full, 0.99), errC = at.CoverageTypes / cover - 1;
        output.WriteLine($"{corpus}: N {full.TokenCount:N0} V {full.TypeCount:N0} V1 {v1:N0}; sample N {thin.TokenCount:N0} V {thin.TypeCount:N0}; "
            + $"{r.Chosen!.Family}: V {at.Types:N0} [{at.TypesLo:N0}, {at.TypesHi:N0}] ({errV:P1}), V1 {at.Hapax:N0} ({errV1:P1}), "
            + $"99% coverage {at.CoverageTypes:N0} [{at.CoverageLo:N0}, {at.CoverageHi:N0}] vs {cover:N0} ({errC:P1})");
        foreach (var fit in r.Fits)
            output.WriteLine($"  {fit.Family} {LnreStatusNames.Of(fit.Status)} χ² {fit.ChiSquared:F1} df {fit.DegreesOfFreedom} "
                + (fit.Model is { } m ? $"V {m.ExpectedTypes(full.TokenCount):N0} V1 {m.ExpectedSpectrum(full.TokenCount, 1)[1]:N0}" : fit.Message));
        var zm = r.Fits.Single(x => x.Family == "zm").Model!;
        Assert.NotEqual("zm", r.Chosen.Family);
        Assert.InRange(full.TypeCount, at.Types, zm.ExpectedTypes(full.TokenCount));
        Assert.InRange(v1, at.Hapax, zm.ExpectedSpectrum(full.TokenCount, 1)[1]);
        // the point's range over all models holds the truth for both (the hapax range is what the cautions point to)
        Assert.InRange(full.TypeCount, at.TypesModelsMin, at.TypesModelsMax);
        Assert.InRange(v1, at.HapaxModelsMin, at.HapaxModelsMax);
        Assert.InRange(at.Hapax, at.HapaxModelsMin, at.HapaxModelsMax);
        Assert.True(Math.Abs(errV) < 0.12, $"{corpus}: V forecast {at.Types:N0} vs {full.TypeCount:N0} ({errV:P1})");
        // the vocabulary covering 99% of tokens rests on the frequent types, which the sample shows well: within 5%
        // (measured −1.3% to −1.5%)
        Assert.True(Math.Abs(errC) < 0.05, $"{corpus}: 99% coverage {at.CoverageTypes:N0} vs {cover:N0} ({errC:P1})");
        Assert.True(Math.Abs(errV1) < 0.45, $"{corpus}: V1 forecast {at.Hapax:N0} vs {v1:N0} ({errV1:P1})");
        // the self-check on the thinned sample alone (forecasting it from a random part of it) warns of the hapax
        // shortfall with the same sign as the truth shows: the user can see it without the full corpus
        var check = r.SelfCheck!;
        output.WriteLine($"  {check.Describe()}");
        Assert.Equal("ok", check.Status);
        Assert.Equal(Math.Sign(errV1), Math.Sign(check.HapaxError));
    }
}
