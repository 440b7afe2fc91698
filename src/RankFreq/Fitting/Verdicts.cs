namespace RankFreq.Fitting;

/// <summary>
/// The decision rules applied to p-values, in one place: the goodness-of-fit test rules the power law out below
/// <see cref="Level"/> (Clauset, Shalizi &amp; Newman 2009, §4.1, use 0.1), and a likelihood-ratio comparison
/// favours a family only when its p is at most <see cref="Level"/>.
/// </summary>
public static class Verdicts
{
    /// <summary>The significance level of every verdict: 0.1.</summary>
    public const double Level = 0.1;

    /// <summary>True when the goodness-of-fit p rules the power law out.</summary>
    public static bool RuledOut(double gofP) => gofP < Level;

    /// <summary>The goodness-of-fit verdict in words: "ruled out" or "not ruled out (not proven)".</summary>
    public static string GoodnessOfFit(double gofP) => RuledOut(gofP) ? "power law ruled out" : "power law not ruled out (not proven)";

    /// <summary>
    /// Which model a likelihood-ratio comparison favours: <c>power_law</c>, the alternative's name, or
    /// <c>inconclusive</c> when p exceeds <see cref="Level"/>. A nested alternative (the power law with cut-off) can
    /// only be favoured or not: the power law is its special case, so a sign in its favour is not evidence.
    /// </summary>
    public static string Favours(string alternative, double llr, double p, bool nested)
    {
        if (!double.IsFinite(p) || p > Level) return "inconclusive";
        if (llr > 0) return nested ? "inconclusive" : "power_law";
        return alternative;
    }
}
