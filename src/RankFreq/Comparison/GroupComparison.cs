using System.Diagnostics;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;

namespace RankFreq.Comparison;

/// <summary>
/// Compares the vocabulary tails of document sets: per group a tail fit, bootstrap intervals and lexical figures at
/// the group's own size and at a common size reached by binomial thinning; pairwise tests of α with Holm's adjustment.
/// </summary>
/// <remarks>
/// <para>Raw figures: the tail fit of <see cref="TailFitter"/> (Clauset, Shalizi &amp; Newman 2009) with its
/// goodness-of-fit bootstrap; α's interval comes from a nonparametric bootstrap over types (each replicate a
/// multinomial resample of the spectrum with the full xmin search, as in <see cref="TailFitter"/>).</para>
/// <para>Matched figures: the common size n is the token count of the smallest group whose tail could be fitted;
/// each group is thinned to it (every token kept with probability n / N_group, <see cref="SpectrumThinning"/>)
/// <see cref="ContrastOptions.ThinReps"/> times, and each figure is reported as mean and spread over those replicates.
/// Matched α's interval and the matched tests use bootstrap-then-thin replicates, which carry both the sampling
/// noise of the group and the noise of thinning.</para>
/// <para>Pair test: with independent bootstrap distributions A_r, B_r of the two α's (separate random streams),
/// the interval of α_a − α_b is the 2.5–97.5% range of the paired differences A_r − B_r, and the p-value is the
/// two-sided normal (Wald) test of z = (α_a − α_b) / √(sd(A)² + sd(B)²) with bootstrap standard deviations, which
/// the near-normal sampling distribution of the MLE justifies (Clauset et al. 2009, §3.2). A p-value read off the
/// bootstrap distribution itself cannot go below 1/(R + 1), too coarse to survive Holm's adjustment over many
/// pairs, hence the normal form. p-values are then adjusted over all pairs of the same basis (raw or matched) by
/// <see cref="Holm"/>. A small p says the tails differ more than sampling noise explains; it says nothing about
/// why, and a large p at a small size is not evidence that the tails are alike (see the power figure
/// <see cref="AlphaDifference.DetectableDiff"/>).</para>
/// <para>Randomness: replicate r of group g draws from Xoshiro(seed, stream(g, kind), r), so results do not depend on
/// the thread count, and the groups' bootstraps are independent of each other.</para>
/// </remarks>
public static class GroupComparison
{
    private const ulong BootKind = 0, ThinKind = 1, StreamBase = 1000;

    /// <summary>Runs the comparison. Groups keep the order given; labels must be unique.</summary>
    public static ContrastResult Compare(IReadOnlyList<GroupSpectrum> groups, ContrastOptions o, IProgress<ContrastProgress>? progress = null,
        CancellationToken ct = default)
    {
        if (groups.Select(g => g.Group).Distinct(StringComparer.Ordinal).Count() != groups.Count)
            throw new ArgumentException("group labels must be unique", nameof(groups));
        var swFit = Stopwatch.StartNew();
        int k = groups.Count;
        var fits = new TailFitResult?[k];
        var raw = new VocabularyFigureSet[k];
        var status = new ContrastStatus[k];
        var message = new string[k];
        for (int g = 0; g < k; g++)
        {
            ct.ThrowIfCancellationRequested();
            var s = groups[g].Spectrum;
            raw[g] = VocabularyFigures.Of(s, o.RenyiOrder);
            message[g] = "";
            if (s.TokenCount == 0) { status[g] = ContrastStatus.Empty; message[g] = "no tokens"; continue; }
            var fo = new FitOptions(o.MinTail, 0, o.Reps, 0, GroupSeed(o.Seed, g), o.Threads, []);
            int gi = g;
            var fp = progress is null ? null : new Progress<FitProgress>(p => progress.Report(new ContrastProgress(p.Stage, groups[gi].Group, p.Done,
                p.Total)));
            try { fits[g] = TailFitter.Fit(s, fo, fp, ct); }
            catch (FitInputException e) { status[g] = ContrastStatus.FitFailed; message[g] = e.Message; continue; }
            if (fits[g]!.PowerLaw.Status != FitStatus.Ok)
            {
                status[g] = ContrastStatus.FitFailed;
                message[g] = $"tail fit failed ({FitStatusNames.Of(fits[g]!.PowerLaw.Status)}): {fits[g]!.PowerLaw.Message}";
            }
        }
        var fitted = Enumerable.Range(0, k).Where(g => status[g] == ContrastStatus.Ok).ToArray();
        long target = o.Matched && fitted.Length > 0 ? fitted.Min(g => groups[g].Spectrum.TokenCount) : 0;

        // bootstrap (and bootstrap-then-thin) replicates of α
        var bootRaw = new double[k][];
        var bootMatched = new double[k][];
        foreach (int g in fitted)
        {
            double p = target > 0 ? target / (double)groups[g].Spectrum.TokenCount : 0;
            (bootRaw[g], bootMatched[g]) = Bootstrap(groups[g], g, p, o, progress, ct);
        }
        double secondsFit = swFit.Elapsed.TotalSeconds;

        var swMatch = Stopwatch.StartNew();
        var matched = new MatchedFigures?[k];
        if (target > 0)
            foreach (int g in fitted)
                matched[g] = Thinned(groups[g], g, target, bootMatched[g], o, progress, ct);
        double secondsMatch = swMatch.Elapsed.TotalSeconds;

        var results = new GroupContrast[k];
        for (int g = 0; g < k; g++)
        {
            var a = bootRaw[g] is null ? FigureSpread.Of([]) : FigureSpread.Of(bootRaw[g]);
            results[g] = new GroupContrast(groups[g].Group, groups[g].Documents, raw[g], fits[g], a.Lo, a.Hi, a.Sd, a.Count,
                matched[g], status[g], message[g]);
        }
        var pairs = Pairs(results, bootRaw, bootMatched, o.Level);
        var (findings, cautions) = ContrastReading.Explain(results, pairs, target, o);
        return new ContrastResult(results, pairs, target, findings, cautions, o, secondsFit, secondsMatch);
    }

    internal static ulong GroupSeed(ulong seed, int g) => unchecked(seed + 0x9E3779B97F4A7C15UL * (ulong)(g + 1));

    private static Xoshiro Rng(ContrastOptions o, int g, ulong kind, int r) => new(o.Seed, StreamBase + (ulong)g * 4 + kind, (ulong)r);

    private static (double[] Raw, double[] Matched) Bootstrap(GroupSpectrum group, int g, double p, ContrastOptions o,
        IProgress<ContrastProgress>? progress, CancellationToken ct)
    {
        var s = group.Spectrum;
        long types = s.TypeCount;
        var rawA = new double[o.BootReps];
        var matchedA = new double[o.BootReps];
        int done = 0;
        var po = new ParallelOptions { MaxDegreeOfParallelism = o.EffectiveThreads, CancellationToken = ct };
        Parallel.For(0, o.BootReps, po, () => new SpectrumBuffer(), (r, _, buf) =>
        {
            var rng = Rng(o, g, BootKind, r);
            buf.Clear();
            Synthetic.Multinomial(rng, s.Values, s.Types, 0, s.Values.Length, types, buf);
            var f = buf.NewSearch().Search(o.MinTail);
            rawA[r] = f.Status == FitStatus.Ok ? f.Alpha : double.NaN;
            matchedA[r] = double.NaN;
            if (p > 0)
            {
                var t = SpectrumThinning.Thin(buf.Values, buf.Mult, buf.Count, p, rng);
                var ft = new TailSearch(t.Values, t.Types, t.Values.Length).Search(o.MinTail);
                matchedA[r] = ft.Status == FitStatus.Ok ? ft.Alpha : double.NaN;
            }
            int d = Interlocked.Increment(ref done);
            if ((d & 15) == 0 || d == o.BootReps) progress?.Report(new ContrastProgress("bootstrap", group.Group, d, o.BootReps));
            return buf;
        }, _ => { });
        return (rawA, matchedA);
    }

    private static MatchedFigures Thinned(GroupSpectrum group, int g, long target, double[] bootMatched, ContrastOptions o,
        IProgress<ContrastProgress>? progress, CancellationToken ct)
    {
        var s = group.Spectrum;
        double p = target / (double)s.TokenCount;
        var reps = new Dictionary<string, double>[o.ThinReps];
        int done = 0;
        var po = new ParallelOptions { MaxDegreeOfParallelism = o.EffectiveThreads, CancellationToken = ct };
        Parallel.For(0, o.ThinReps, po, r =>
        {
            var t = SpectrumThinning.Thin(s, p, Rng(o, g, ThinKind, r));
            var f = new TailSearch(t.Values, t.Types, t.Values.Length).Search(o.MinTail);
            reps[r] = ContrastFigures.Values(VocabularyFigures.Of(t, o.RenyiOrder), f);
            int d = Interlocked.Increment(ref done);
            if ((d & 7) == 0 || d == o.ThinReps) progress?.Report(new ContrastProgress("thinning", group.Group, d, o.ThinReps));
        });
        var figures = ContrastFigures.All.ToDictionary(fi => fi.Name, fi => FigureSpread.Of(reps.Select(x => x[fi.Name])));
        int failed = reps.Count(x => !double.IsFinite(x["alpha"]));
        var boot = FigureSpread.Of(bootMatched);
        bool tooSmall = failed * 2 > o.ThinReps || boot.Count * 2 < bootMatched.Length;
        string msg = tooSmall
            ? $"at the common size of {target:N0} tokens the tail fit failed in {failed} of {o.ThinReps} thinned replicates: too small for a matched comparison"
            : "";
        return new MatchedFigures(target, p, o.ThinReps, failed, figures, boot.Lo, boot.Hi,
            tooSmall ? ContrastStatus.TooSmallWhenMatched : ContrastStatus.Ok, msg);
    }

    private static List<PairContrast> Pairs(GroupContrast[] groups, double[][] bootRaw, double[][] bootMatched, double level)
    {
        var idx = new List<(int A, int B)>();
        for (int i = 0; i < groups.Length; i++)
            for (int j = i + 1; j < groups.Length; j++)
                if (groups[i].Status == ContrastStatus.Ok && groups[j].Status == ContrastStatus.Ok) idx.Add((i, j));
        var rawTests = idx.Select(t => Difference(groups[t.A].Alpha, groups[t.B].Alpha, bootRaw[t.A], bootRaw[t.B])).ToList();
        var matchedTests = idx.Select(t =>
            groups[t.A].Matched is { Status: ContrastStatus.Ok } ma && groups[t.B].Matched is { Status: ContrastStatus.Ok } mb
                ? Difference(ma.Figures["alpha"].Mean, mb.Figures["alpha"].Mean, bootMatched[t.A], bootMatched[t.B])
                : null).ToList();
        var rawAdj = Holm.Adjust(rawTests.Select(d => d.P).ToArray());
        var matchedAdj = Holm.Adjust(matchedTests.Select(d => d?.P ?? double.NaN).ToArray());
        var pairs = new List<PairContrast>();
        for (int n = 0; n < idx.Count; n++)
        {
            var r = rawTests[n] with { PHolm = rawAdj[n], Significant = rawAdj[n] <= level };
            var m = matchedTests[n] is { } mt ? mt with { PHolm = matchedAdj[n], Significant = matchedAdj[n] <= level } : null;
            pairs.Add(new PairContrast(groups[idx[n].A].Group, groups[idx[n].B].Group, r, m));
        }
        return pairs;
    }

    /// <summary>The difference test described in the class remarks.</summary>
    internal static AlphaDifference Difference(double a, double b, double[] bootA, double[] bootB)
    {
        var d = new List<double>();
        for (int r = 0; r < Math.Min(bootA.Length, bootB.Length); r++)
            if (double.IsFinite(bootA[r]) && double.IsFinite(bootB[r])) d.Add(bootA[r] - bootB[r]);
        var sd = d.Count > 0 ? FigureSpread.Of(d) : FigureSpread.Of([]);
        var sa = FigureSpread.Of(bootA);
        var sb = FigureSpread.Of(bootB);
        double se = Math.Sqrt(sa.Sd * sa.Sd + sb.Sd * sb.Sd);
        double diff = a - b;
        double p = se > 0 && double.IsFinite(diff) ? MathNet.Numerics.SpecialFunctions.Erfc(Math.Abs(diff) / se / Math.Sqrt(2)) : double.NaN;
        return new AlphaDifference(diff, sd.Lo, sd.Hi, se, p, double.NaN, false, 2.80 * se);
    }
}
