using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Jobs;
using RankFreq.Lexical;
using Xunit;

namespace RankFreq.Tests.Comparison;

public class ShiftTests
{
    // few replicates keep the real-corpus runs short; the interval only needs a handful of bootstrap values
    private static ShiftOptions Quick => new(new FitOptions(Reps: 0, CiReps: 20, Alternatives: []));

    [Fact]
    public void RenyiEntropyMatchesHandComputedValues()
    {
        // Definition (Zouhar et al. 2023, ACL, "Tokenization and the Noiseless Channel", §3): H_α(p) =
        // log₂(Σ pᵢ^α)/(1 − α), efficiency = H_α(p)/log₂|V|. Counts 2, 1, 1 give p = (1/2, 1/4, 1/4), |V| = 3:
        //   α = 1 (Shannon): ½·1 + 2·¼·2 = 1.5 bits; efficiency 1.5/log₂3 = 0.946394630357186
        //   α = 2: Σp² = ¼ + 2/16 = 3/8, H₂ = log₂(8/3) = 1.415037499278844; efficiency 0.892789260714373
        //   α = 2.5: Σp^2.5 = 2^−2.5 + 2·2^−5 = 0.176776695296637 + 0.0625 = 0.239276695296637,
        //            H = log₂(0.239276695296637)/(−1.5) = 1.375498803040117; efficiency 0.867843120839936
        // (decimals checked with Python's math.log2)
        var s = FrequencySpectrum.FromCounts([2, 1, 1]);
        Assert.Equal(1.5, Renyi.EntropyBits(s, 1), 12);
        Assert.Equal(1.415037499278844, Renyi.EntropyBits(s, 2), 12);
        Assert.Equal(1.375498803040117, Renyi.EntropyBits(s, 2.5), 12);
        Assert.Equal(0.946394630357186, Renyi.Efficiency(s, 1, 3), 12);
        Assert.Equal(0.892789260714373, Renyi.Efficiency(s, 2, 3), 12);
        Assert.Equal(0.867843120839936, Renyi.Efficiency(s, 2.5, 3), 12);
        // a uniform distribution over its whole vocabulary is perfectly efficient at every order (same paper)
        var uniform = FrequencySpectrum.FromCounts([7, 7, 7, 7]);
        Assert.Equal(1.0, Renyi.Efficiency(uniform, 2.5, 4), 12);
        // the same text measured against a larger vocabulary is less efficient: log₂ 16 = 4 bits
        Assert.Equal(0.5, Renyi.Efficiency(uniform, 2.5, 16), 12);
        // the lexical summary's order-2.5 figure (over the types seen) is the same quantity
        Assert.Equal(Lexicon.Summarize(s).RenyiEfficiency, Renyi.Efficiency(s, 2.5, s.TypeCount), 12);
    }

    [Fact]
    public void HeadShareCountsTheTopTypes()
    {
        // counts 5, 3, 1, 1 (10 tokens): top 1 holds 5/10, top 2 8/10, top 3 9/10, top 10 everything
        var s = FrequencySpectrum.FromCounts([1, 5, 1, 3]);
        Assert.Equal(0.5, ShiftAnalysis.HeadShare(s, 1), 12);
        Assert.Equal(0.8, ShiftAnalysis.HeadShare(s, 2), 12);
        Assert.Equal(0.9, ShiftAnalysis.HeadShare(s, 3), 12);
        Assert.Equal(1.0, ShiftAnalysis.HeadShare(s, 10), 12);
    }

    [Fact]
    public void DifferenceIntervalUsesEveryPairOfReplicates()
    {
        // candidate {3, 4} − baseline {1, 2}: differences 1, 2, 2, 3; linear-interpolation ("type 7", common
        // practice) percentiles: 2.5% at h = 3·0.025 = 0.075 → 1.075, 97.5% at h = 2.925 → 2.925
        var (lo, hi) = ShiftAnalysis.DifferenceInterval([1, 2], [3, 4]);
        Assert.Equal(1.075, lo, 12);
        Assert.Equal(2.925, hi, 12);
        Assert.True(double.IsNaN(ShiftAnalysis.DifferenceInterval([1], [3, 4]).Lo));
    }

    [CorpusFact]
    public async Task WordsToO200kOnTheKjv()
    {
        string kjv = Corpora.File("kjv-bible.txt");
        var r = (await ShiftJob.RunAsync([kjv], new ShiftSettings(new CountSettings(), "words", "o200k_base", Quick))).Shift;
        using var direct = CountJob.Count([kjv], new CountSettings("o200k_base"));
        Assert.Equal(direct.Summary.Tokens, r.Candidate.Tokens);
        Assert.Equal(direct.Summary.Types, r.Candidate.Types);
        // English needs somewhat more subword tokens than words with these large vocabularies: between 1.0 and 1.7
        // tokens per word (fact of the trade, from memory)
        Assert.InRange(r.Fertility, 1.0, 1.7);
        Assert.Null(r.Baseline.Utilisation);
        Assert.Equal(r.Candidate.Types, r.Candidate.SeenEntries);           // one type per vocabulary id seen
        Assert.Equal(r.Candidate.VocabularySize - r.Candidate.Types, r.Unseen.Count);
        Assert.InRange(r.Candidate.Utilisation!.Value, 0.001, 0.5);
        var seenIds = direct.Rows.Batches().SelectMany(b => b.TokenIds!).ToHashSet();
        Assert.DoesNotContain(r.Unseen, u => seenIds.Contains(u.Id));
        Assert.Equal(r.Candidate.Fit.PowerLaw.Alpha - r.Baseline.Fit.PowerLaw.Alpha, r.AlphaDiff, 12);
        Assert.True(r.AlphaDiffLo < r.AlphaDiff && r.AlphaDiff < r.AlphaDiffHi, $"{r.AlphaDiffLo} {r.AlphaDiff} {r.AlphaDiffHi}");
        Assert.InRange(r.Candidate.RenyiEfficiency, 0.05, 1.0);
        Assert.Contains(ShiftFindings.Of(r), l => l.StartsWith("o200k_base needs ", StringComparison.Ordinal) && l.Contains("more tokens than words"));
    }

    [CorpusFact]
    public async Task Cl100kToO200kOnTheKjv()
    {
        string kjv = Corpora.File("kjv-bible.txt");
        var r = (await ShiftJob.RunAsync([kjv], new ShiftSettings(new CountSettings(), "cl100k_base", "o200k_base", Quick))).Shift;
        using var words = CountJob.Count([kjv], new CountSettings("words"));
        // each vocabulary lies between 1.0 and 1.7 tokens per English word (fact of the trade, from memory), and the
        // fertility is the ratio of the two token counts
        Assert.InRange(r.Baseline.Tokens / (double)words.Summary.Tokens, 1.0, 1.7);
        Assert.InRange(r.Candidate.Tokens / (double)words.Summary.Tokens, 1.0, 1.7);
        Assert.Equal(r.Candidate.Tokens / (double)r.Baseline.Tokens, r.Fertility, 12);
        Assert.Equal(r.Baseline.Types, r.Baseline.SeenEntries);
        Assert.Equal(r.Baseline.VocabularySize - r.Baseline.Types, r.BaselineUnseen.Count);
        Assert.True(r.Candidate.VocabularySize > r.Baseline.VocabularySize);
        // a larger vocabulary spread over the same text uses a smaller share of itself
        Assert.True(r.Candidate.Utilisation < r.Baseline.Utilisation);
    }
}
