using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Tokenization;

namespace RankFreq.Comparison;

/// <summary>How to compare two tokenizers.</summary>
/// <param name="Fit">Tail-fit settings used for both (same seed, so the two fits differ only by their data).</param>
/// <param name="RenyiOrder">Order of the Rényi efficiency.</param>
public sealed record ShiftOptions(FitOptions Fit, double RenyiOrder = Renyi.DefaultOrder);

/// <summary>
/// The figures of a tokenizer shift: computed from two count results of the same text, each with the tokenizer
/// that made it.
/// </summary>
public static class ShiftAnalysis
{
    /// <summary>Figures of one count result. Reads <paramref name="counts"/>' rows once (for the vocabulary ids seen).
    /// <paramref name="textBytes"/> is the text the tokenizer read (default: the count summary's text bytes, which for
    /// JSON Lines include the record syntax).</summary>
    public static (TokenizerFigures Figures, IReadOnlyList<UnseenEntry> Unseen) Describe(CountResult counts,
        ITokenizer tokenizer, ShiftOptions options, CancellationToken ct = default, long? textBytes = null)
    {
        var s = counts.Spectrum;
        int vocab = tokenizer.VocabularySize;
        long? seenCount = null;
        IReadOnlyList<UnseenEntry> unseen = [];
        if (vocab > 0)
        {
            var seen = new bool[vocab];
            foreach (var b in counts.Rows.Batches())
                foreach (int id in b.TokenIds ?? [])
                    if ((uint)id < (uint)vocab) seen[id] = true;
            int n = 0;
            foreach (bool x in seen) n += x ? 1 : 0;
            seenCount = n;
            var ids = new int[vocab - n];
            for (int id = 0, k = 0; id < vocab; id++)
                if (!seen[id]) ids[k++] = id;
            // readable forms are made when the list is written, not here
            unseen = new UnseenList(ids, tokenizer.DisplayToken);
        }
        var fit = s.TypeCount == 0
            ? throw new FitInputException($"{tokenizer.Spec}: the text gave no tokens")
            : TailFitter.Fit(s, options.Fit, null, ct);
        long v = vocab > 0 ? vocab : s.TypeCount;
        var fig = new TokenizerFigures(tokenizer.Spec, s.TokenCount, s.TypeCount, textBytes ?? counts.Summary.TextBytes, vocab,
            seenCount, HeadShare(s, 10), HeadShare(s, 100), HeadShare(s, 1000), Renyi.EntropyBits(s, 1),
            options.RenyiOrder, Renyi.Efficiency(s, options.RenyiOrder, v), fit)
        { Spectrum = s };
        return (fig, unseen);
    }

    /// <summary>The shift from <paramref name="baseline"/> to <paramref name="candidate"/>.</summary>
    public static ShiftResult Compare((TokenizerFigures Figures, IReadOnlyList<UnseenEntry> Unseen) baseline,
        (TokenizerFigures Figures, IReadOnlyList<UnseenEntry> Unseen) candidate)
    {
        var (a, b) = (baseline.Figures.Fit, candidate.Figures.Fit);
        bool ok = a.PowerLaw.Status == FitStatus.Ok && b.PowerLaw.Status == FitStatus.Ok;
        var (lo, hi) = ok ? DifferenceInterval(a.AlphaReplicates, b.AlphaReplicates) : (double.NaN, double.NaN);
        return new ShiftResult(baseline.Figures, candidate.Figures, ok ? b.PowerLaw.Alpha - a.PowerLaw.Alpha : double.NaN,
            lo, hi, candidate.Unseen, baseline.Unseen);
    }

    /// <summary>Share of the tokens taken by the <paramref name="k"/> most frequent types (all tokens when there
    /// are fewer types); NaN with no tokens.</summary>
    public static double HeadShare(FrequencySpectrum s, long k)
    {
        if (s.TokenCount == 0) return double.NaN;
        double taken = 0;
        for (int i = s.Values.Length - 1; i >= 0 && k > 0; i--)
        {
            long m = Math.Min(k, s.Types[i]);
            taken += (double)m * s.Values[i];
            k -= m;
        }
        return taken / s.TokenCount;
    }

    /// <summary>
    /// 95% interval of α(candidate) − α(baseline) from the two fits' bootstrap α values: the 2.5th and 97.5th
    /// percentiles of every difference b − a over the pairs of replicates.
    /// </summary>
    /// <remarks>
    /// The two bootstraps resample the two count tables separately, so the pairs treat them as independent. Both come
    /// from one text, so the true estimates are likely positively correlated and this interval is, if anything, too
    /// wide (conservative). NaN when either side has fewer than two replicates.
    /// </remarks>
    public static (double Lo, double Hi) DifferenceInterval(IReadOnlyList<double> baseline, IReadOnlyList<double> candidate)
    {
        if (baseline.Count < 2 || candidate.Count < 2) return (double.NaN, double.NaN);
        var d = new double[baseline.Count * candidate.Count];
        int k = 0;
        foreach (var y in candidate)
            foreach (var x in baseline) d[k++] = y - x;
        Array.Sort(d);
        return (TailFitter.Percentile(d, 0.025), TailFitter.Percentile(d, 0.975));
    }
}
