using RankFreq.Counting;
using RankFreq.Lexical;
using Xunit;

namespace RankFreq.Tests.Lexical;

/// <summary>Heaps' law V = K·N^β is fitted to the upper growth curve, and says where.</summary>
public class HeapsFitTests
{
    private static FrequencySpectrum SpectrumOf(long tokens, long types) =>
        FrequencySpectrum.FromPairs([(1, types - 1), (tokens - (types - 1), 1)]);

    [Fact]
    public void TheLawIsFittedWhereItHoldsNotOverTheStartOfTheText()
    {
        // A text whose vocabulary first grows fast, V = N^0.9 up to N = 10,000, and then as V = K·N^0.5 with
        // K = 10,000^0.4, so the two pieces meet. Heaps' law holds on the upper part only.
        const long total = 1_000_000;
        double k = Math.Pow(10_000, 0.4);
        var tokens = GrowthCurve.Checkpoints(total);
        var types = tokens.Select(n => (long)Math.Round(n <= 10_000 ? Math.Pow(n, 0.9) : k * Math.Sqrt(n))).ToArray();
        var g = Lexicon.Growth(SpectrumOf(total, types[^1]), new GrowthCurve(tokens, types));
        Assert.Equal(0.5, g.HeapsBeta, 0.002);
        Assert.Equal(k, g.HeapsK, 0.02 * k);
        Assert.True(g.HeapsFrom >= total / 10 && g.HeapsFrom < total / 10 * 1.2, $"fitted from {g.HeapsFrom}");
        Assert.Equal(types[^1], g.HeapsAt(total), 0.005 * types[^1]);
        Assert.Contains(string.Create(System.Globalization.CultureInfo.InvariantCulture, $"from N = {g.HeapsFrom:N0}"), g.HeapsMethod);
        Assert.Contains("10% of the tokens", g.HeapsMethod);
        // a fit over the whole log-spaced curve (from N = 100, the earlier rule) is pulled up by the early points
        var all = Enumerable.Range(0, tokens.Length).Where(i => tokens[i] >= 100).ToArray();
        double slope = MathNet.Numerics.Fit.Line(all.Select(i => Math.Log(tokens[i])).ToArray(), all.Select(i => Math.Log(types[i])).ToArray()).B;
        Assert.True(slope > 0.65, $"whole-curve slope {slope}");
    }

    [Fact]
    public void ATinyInputSaysWhatWasFittedAndClaimsNoThresholdItDidNotUse()
    {
        // 13 tokens: "a b c a d e b f g a h i j"
        long[] tokens = GrowthCurve.Checkpoints(13);
        var order = "a b c a d e b f g a h i j".Split(' ');
        var types = tokens.Select(n => (long)order.Take((int)n).Distinct().Count()).ToArray();
        var g = Lexicon.Growth(FrequencySpectrum.FromPairs([(1, 8), (2, 1), (3, 1)]), new GrowthCurve(tokens, types));
        Assert.DoesNotContain("N ≥ 100", g.HeapsMethod);
        Assert.Contains("to N = 13", g.HeapsMethod);
        Assert.True(double.IsFinite(g.HeapsBeta));
    }
}
