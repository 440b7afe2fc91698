using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Comparison;

public class GroupComparisonTests
{
    private static FrequencySpectrum PowerLaw(ulong seed, int n, double alpha, long xmin = 1)
    {
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(seed), alpha, xmin, n, buf);
        return new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
    }

    private static readonly ContrastOptions Quick = new(Reps: 0, BootReps: 100, ThinReps: 20, Seed: 5);

    [Fact]
    public void FindsADifferenceThatExistsAndListsATooSmallGroup()
    {
        // two pure discrete power laws (α = 1.8 and 2.3, xmin = 1, 20,000 types each): the MLE's standard error is about
        // (α − 1)/√n ≈ 0.01 (Clauset et al. 2009, eq. 3.2), so a difference of 0.5 must be found raw and matched;
        // a group of 8 types cannot be fitted and must be listed with its reason, not dropped
        var groups = new[]
        {
            new GroupSpectrum("a", PowerLaw(1, 20_000, 1.8)),
            new GroupSpectrum("b", PowerLaw(2, 20_000, 2.3)),
            new GroupSpectrum("tiny", FrequencySpectrum.FromCounts([1, 1, 2, 3, 5, 8, 13, 21])),
        };
        var r = GroupComparison.Compare(groups, Quick);
        Assert.Equal(3, r.Groups.Count);
        var tiny = r.Groups.Single(g => g.Group == "tiny");
        Assert.Equal(ContrastStatus.FitFailed, tiny.Status);
        Assert.Contains("tail points", tiny.Message);
        Assert.Contains(r.Cautions, c => c.Contains("\"tiny\"") && c.Contains("not compared"));
        var pair = Assert.Single(r.Pairs);
        Assert.True(pair.Raw.Significant && pair.Matched!.Significant, $"raw p {pair.Raw.PHolm}, matched p {pair.Matched?.PHolm}");
        Assert.InRange(pair.Raw.Diff, -0.6, -0.4);
        Assert.True(pair.Raw.Lo < pair.Raw.Diff && pair.Raw.Diff < pair.Raw.Hi);
        Assert.Contains(r.Findings, f => f.Contains("\"a\" has the heavier tail"));
        var a = r.Groups[0];
        Assert.True(a.AlphaLo < a.Alpha && a.Alpha < a.AlphaHi);
        // the smaller of a and b sets the common size; that group is thinned with p = 1
        Assert.Equal(Math.Min(groups[0].Spectrum.TokenCount, groups[1].Spectrum.TokenCount), r.TargetTokens);
        Assert.Contains(r.Groups.Take(2), g => g.Matched!.KeepProbability == 1);
    }

    [Fact]
    public void ResultsDoNotDependOnThreads()
    {
        var groups = new[] { new GroupSpectrum("x", PowerLaw(3, 5000, 2.0)), new GroupSpectrum("y", PowerLaw(4, 8000, 2.1)) };
        var one = GroupComparison.Compare(groups, Quick with { Threads = 1 });
        var two = GroupComparison.Compare(groups, Quick with { Threads = 2 });
        Assert.Equal(one.Pairs[0].Raw, two.Pairs[0].Raw);
        Assert.Equal(one.Pairs[0].Matched, two.Pairs[0].Matched);
        Assert.Equal(one.Groups[1].Matched!.Figures["types"], two.Groups[1].Matched!.Figures["types"]);
    }

    [Fact]
    public void ThinnedLexicalFiguresMatchTheExpectedTypeCount()
    {
        // at matched size the mean number of types over thinning replicates must match Baayen's (2001) binomial
        // interpolation E[V(M)] = V − Σ V_f (1 − p)^f for the larger group (p = M/N), within 4.5 standard errors
        var big = PowerLaw(6, 30_000, 2.0);
        var small = PowerLaw(7, 6_000, 2.0);
        var r = GroupComparison.Compare([new("big", big), new("small", small)], Quick with { ThinReps = 40 });
        var m = r.Groups[0].Matched!;
        var types = m.Figures["types"];
        double expected = RankFreq.Lexical.Lexicon.BinomialTypes(big, (long)Math.Round(m.KeepProbability * big.TokenCount));
        Assert.True(Math.Abs(types.Mean - expected) < 4.5 * types.Sd / Math.Sqrt(types.Count) + 1, $"{types.Mean} vs {expected}");
        Assert.True(r.Groups[0].Raw.Types > types.Mean);
    }

    [Fact]
    public void RenyiEfficiencyMatchesTheProfileFigureAndTheDefinition()
    {
        // Zouhar et al. (2023): efficiency = H_a(p)/log V, H_a = log(Σ p^a)/(1 − a). Counts 3, 2, 1 (N = 6, V = 3):
        // order 2 by hand is −log2((9 + 4 + 1)/36) / log2 3
        var s = FrequencySpectrum.FromCounts([3, 2, 1]);
        Assert.Equal(-Math.Log2(14 / 36.0) / Math.Log2(3), VocabularyFigures.Of(s, 2).RenyiEfficiency, 12);
        Assert.Equal(RankFreq.Lexical.Lexicon.Summarize(s).RenyiEfficiency, VocabularyFigures.Of(s, 2.5).RenyiEfficiency, 12);
    }

    [CorpusFact]
    public void MatchedAlphaOfTwoHalvesOfOneShuffledTextAgree()
    {
        // the KJV's verses shuffled with a fixed seed and cut in two halves of unequal size (40% / 60%): both halves
        // sample one population, so their matched α must agree within their intervals and no difference may be flagged
        var lines = File.ReadAllLines(Corpora.File("kjv-bible.txt"));
        var rng = new Xoshiro(2024);
        for (int i = lines.Length - 1; i > 0; i--) { int j = (int)rng.NextLong(i + 1); (lines[i], lines[j]) = (lines[j], lines[i]); }
        using var tmp = new TempDir();
        int cut = lines.Length * 2 / 5;
        File.WriteAllLines(tmp["a.txt"], lines[..cut]);
        File.WriteAllLines(tmp["b.txt"], lines[cut..]);
        var spectra = new[] { "a.txt", "b.txt" }.Select(f =>
        {
            using var c = RankFreq.Jobs.CountJob.Count([tmp[f]], new CountSettings(Threads: 2));
            return new GroupSpectrum(f, c.Spectrum);
        }).ToArray();
        var r = GroupComparison.Compare(spectra, Quick with { BootReps = 120 });
        var ma = r.Groups[0].Matched!;
        var mb = r.Groups[1].Matched!;
        Assert.Equal(ContrastStatus.Ok, ma.Status);
        Assert.InRange(ma.Figures["alpha"].Mean, mb.AlphaLo, mb.AlphaHi);
        Assert.InRange(mb.Figures["alpha"].Mean, ma.AlphaLo, ma.AlphaHi);
        Assert.False(r.Pairs[0].Matched!.Significant, $"matched p_holm {r.Pairs[0].Matched!.PHolm}");
        // the larger half is really thinned
        Assert.InRange(mb.KeepProbability, 0.6, 0.7);
    }
}
