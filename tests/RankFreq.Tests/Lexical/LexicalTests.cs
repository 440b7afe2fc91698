using MathNet.Numerics;
using System.Numerics;
using RankFreq.Counting;
using RankFreq.Lexical;
using Xunit;
using RankFreq.Jobs;

namespace RankFreq.Tests.Lexical;

public class LexicalTests
{
    [Fact]
    public void HandComputedFigures()
    {
        // tokens "a a a b b c": N = 6, V = 3, V1 = 1, V2 = 1.
        var s = FrequencySpectrum.FromCounts([3, 2, 1]);
        var l = Lexicon.Summarize(s);
        Assert.Equal(1, l.Hapax);
        Assert.Equal(1, l.Dis);
        Assert.Equal(1 / 6.0, l.GoodTuringUnseen, 12);             // Good (1953): N1/N
        Assert.Equal(3 + 1 / 2.0, l.Chao1, 12);                   // Chao (1984): V + V1²/(2 V2)
        Assert.Equal(1e4 * (9 + 4 + 1 - 6) / 36.0, l.YuleK, 9);   // Yule (1944): 10⁴ (Σ f² V_f − N)/N²
        double h = -(0.5 * Math.Log2(0.5) + 1 / 3.0 * Math.Log2(1 / 3.0) + 1 / 6.0 * Math.Log2(1 / 6.0));
        Assert.Equal(h, l.EntropyBits, 12);
        Assert.Equal(h + 2 / (12 * Math.Log(2)), l.EntropyMillerMadowBits, 12); // Miller–Madow: + (V−1)/(2N) nats
        var noDis = Lexicon.Summarize(FrequencySpectrum.FromCounts([5, 1, 1, 1]));
        Assert.Equal(4 + 3 * 2 / 2.0, noDis.Chao1, 12);          // bias-corrected form when V2 = 0
    }

    [Fact]
    public void ExpectedGrowthEqualsExactHypergeometricEnumeration()
    {
        // E[V(M)] by direct combinatorics with exact integers: a type of frequency f is missing from a sample of
        // M of the N tokens (without replacement) in C(N−f, M) of the C(N, M) samples.
        var counts = new long[] { 7, 4, 4, 2, 1, 1, 1 };
        var s = FrequencySpectrum.FromCounts(counts);
        long n = counts.Sum();
        static BigInteger C(long a, long b)
        {
            if (b < 0 || b > a) return 0;
            BigInteger r = 1;
            for (long i = 0; i < b; i++) r = r * (a - i) / (i + 1);
            return r;
        }
        for (long m = 1; m <= n; m++)
        {
            double exact = counts.Sum(f => 1 - (double)C(n - f, m) / (double)C(n, m));
            Assert.Equal(exact, Lexicon.ExpectedTypes(s, m), 9);
        }
        Assert.Equal(s.TypeCount, Lexicon.ExpectedTypes(s, n), 9);
    }

    [Fact]
    public void ExpectedGrowthMatchesTheHypergeometricDistributionAcrossRunsAndGaps()
    {
        // a spectrum with a run of consecutive values (summed step by step) and values far apart (recomputed from
        // ln Γ), against the probability of drawing none of a type's f tokens, C(N − f, M)/C(N, M), from
        // MathNet.Numerics 5.0.0's ln C (SpecialFunctions.BinomialLn)
        var pairs = new List<(long, long)>();
        for (long f = 1; f <= 300; f++) pairs.Add((f, Math.Max(1, 4000 / (f * f))));
        foreach (long f in new long[] { 400, 1000, 5000, 20_000, 90_000 }) pairs.Add((f, 1));
        var s = FrequencySpectrum.FromPairs(pairs);
        int n = (int)s.TokenCount;
        foreach (int m in new[] { 10, n / 1000, n / 50, n / 3, n - 5000, n - 1 })
        {
            double want = 0;
            for (int i = 0; i < s.Values.Length; i++)
                want += s.Types[i] * -double.ExpM1(SpecialFunctions.BinomialLn(n - (int)s.Values[i], m) - SpecialFunctions.BinomialLn(n, m));
            // both subtract the expected missing types from V, so they agree to a fraction of V, not of the result
            Assert.True(Math.Abs(Lexicon.ExpectedTypes(s, m) - want) <= 1e-9 * s.TypeCount, $"M = {m}: {Lexicon.ExpectedTypes(s, m):R} vs {want:R}");
        }
    }

    [Fact]
    public void BinomialInterpolationApproachesTheExactCurveOnLargeData()
    {
        var s = FrequencySpectrum.FromCounts(Enumerable.Range(1, 3000).Select(r => (long)Math.Max(1, 100000 / r)));
        long m = s.TokenCount / 3;
        Assert.True(Math.Abs(Lexicon.BinomialTypes(s, m) / Lexicon.ExpectedTypes(s, m) - 1) < 0.01);
    }

    [CorpusTheory]
    [InlineData("kjv-bible.txt")]
    [InlineData("sotu.jsonl")]
    public void EnglishHeapsExponentIsInTheUsualRange(string file)
    {
        // 0.4–0.7 for English is common practice, no single source.
        using var r = CountJob.Count([Corpora.File(file)], new CountSettings());
        var g = Lexicon.Growth(r.Spectrum, r.Growth);
        Assert.InRange(g.HeapsBeta, 0.4, 0.7);
        Assert.Equal(r.Spectrum.TypeCount, g.Observed[^1]);
        Assert.Equal(r.Spectrum.TypeCount, g.Expected[^1], 6);
    }
}
