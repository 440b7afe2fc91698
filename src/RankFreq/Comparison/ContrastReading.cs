using System.Globalization;

namespace RankFreq.Comparison;

/// <summary>Plain-language reading of a contrast: which pairs differ after adjustment, and what could be misread.</summary>
public static class ContrastReading
{
    private static string F(double x, string fmt = "F3") => x.ToString(fmt, CultureInfo.InvariantCulture);

    /// <summary>Findings (one line per pair that differs, or one line saying none does) and cautions.</summary>
    public static (IReadOnlyList<string> Findings, IReadOnlyList<string> Cautions) Explain(IReadOnlyList<GroupContrast> groups,
        IReadOnlyList<PairContrast> pairs, long target, ContrastOptions o)
    {
        var findings = new List<string>();
        var cautions = new List<string>();
        string level = F(o.Level, "0.###");
        var fitted = groups.Where(g => g.Status == ContrastStatus.Ok).ToList();
        foreach (var g in groups.Where(g => g.Status != ContrastStatus.Ok))
            cautions.Add($"group \"{g.Group}\" ({g.Raw.Tokens:N0} tokens) is not compared: {g.Message}");
        foreach (var g in fitted.Where(g => g.Matched is { Status: not ContrastStatus.Ok }))
            cautions.Add($"group \"{g.Group}\": {g.Matched!.Message}; its raw figures are shown, its matched ones are not used");
        if (fitted.Count < 2)
        {
            findings.Add(fitted.Count == 0
                ? "no group could be fitted, so nothing is compared"
                : $"only one group (\"{fitted[0].Group}\") could be fitted, so nothing is compared");
            return (findings, cautions);
        }
        string basis = target > 0 ? $"at a matched size of {target:N0} tokens" : "at the groups' own sizes";
        foreach (var p in pairs.Where(p => p.Headline.Significant))
        {
            var h = p.Headline;
            string heavier = h.Diff < 0 ? p.A : p.B;
            findings.Add($"\"{p.A}\" and \"{p.B}\" differ in α {basis}: difference {F(h.Diff)} (95% interval {F(h.Lo)} to {F(h.Hi)}), " +
                $"Holm-adjusted p {F(h.PHolm, "G3")}; \"{heavier}\" has the heavier tail (smaller α)");
        }
        if (findings.Count == 0)
            findings.Add($"no pair of groups differs in α {basis} after Holm's adjustment over {pairs.Count} pair(s) at the {level} level");
        foreach (var p in pairs.Where(p => p.Matched is not null && p.Raw.Significant && !p.Matched.Significant))
            findings.Add($"\"{p.A}\" and \"{p.B}\" differ at their own sizes but not at matched size: the raw difference may come from sample size (or " +
                "matching costs power)");

        if (pairs.Count > 0)
        {
            double median = pairs.Select(p => p.Headline.DetectableDiff).Where(double.IsFinite).Order().ToArray() is { Length: > 0 } d
                ? d[d.Length / 2] : double.NaN;
            if (double.IsFinite(median) && median > 0.05)
                cautions.Add($"low power: {basis} a typical pair detects only differences in α of about {F(median, "F2")} or more " +
                    "(80% power at the unadjusted 5% level; Holm's adjustment needs more); a pair not flagged is not shown to be alike");
        }
        var shortTails = fitted.Where(g => (g.Matched?.Figures["n_tail"].Mean ?? g.Fit!.PowerLaw.NTail) < 100).Select(g => g.Group).ToList();
        if (shortTails.Count > 0)
            cautions.Add($"tails of fewer than 100 types ({string.Join(", ", shortTails.Select(x => $"\"{x}\""))}): α is poorly determined there");
        var lowGof = fitted.Where(g => g.Fit!.GofP < 0.1).Select(g => g.Group).ToList();
        if (lowGof.Count > 0)
            cautions.Add($"the power law is doubtful (gof_p < 0.1) for {string.Join(", ", lowGof.Select(x => $"\"{x}\""))}: α then summarises the " +
                "tail's slope, not a law");
        cautions.Add("p-values say whether a difference exceeds sampling noise, not how large or why; a large p is not evidence of equal tails");
        cautions.Add(target > 0
            ? "types, hapax share, unseen mass, entropy, Rényi efficiency and Heaps β depend on sample size: compare their matched values, not the raw ones"
            : "size matching is off: types, hapax share, unseen mass, entropy, Rényi efficiency and Heaps β of groups of different sizes are not comparable");
        return (findings, cautions);
    }
}
