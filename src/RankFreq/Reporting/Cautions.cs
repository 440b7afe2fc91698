using System.Globalization;
using RankFreq.Lexical;

namespace RankFreq.Reporting;

/// <summary>How the results can be misread, in the words every output uses (summary.json, the report, the console).</summary>
public static class Cautions
{
    /// <summary>The cautions for a run that redacted token strings below <paramref name="redactBelow"/> (0: none),
    /// with those that the growth curve calls for when <paramref name="growth"/> is given.</summary>
    public static IReadOnlyList<string> For(long redactBelow, GrowthAnalysis? growth) =>
        growth is not null && HeapsBetaCaution(growth) is { } heaps ? [.. For(redactBelow), heaps] : For(redactBelow);

    /// <summary>
    /// A Heaps β above 1 says the vocabulary grew faster than the text over the fitted stretch, which no sample drawn
    /// from one steady source does in the long run (V ≤ N, and the expected V(N) of a random sample is concave). It
    /// comes from the order of the text: sets, topics or languages placed one after another. Null when β ≤ 1.
    /// </summary>
    public static string? HeapsBetaCaution(GrowthAnalysis growth) =>
        growth.HeapsBeta > 1
            ? string.Create(CultureInfo.InvariantCulture, $"Heaps' β is above 1 here ({growth.HeapsBeta:F2}): in the upper ")
                + "part of the growth curve the vocabulary grew faster than the text, which no steady source does; it "
                + "comes from the order of the input (sets, topics or languages one after another). Read the expected "
                + "growth under random order instead, and do not extrapolate with this β."
            : null;

    /// <summary>The cautions for a run that redacted token strings below <paramref name="redactBelow"/> (0: none).</summary>
    public static IReadOnlyList<string> For(long redactBelow) =>
    [
        "A large goodness-of-fit p means the power law is not ruled out at this sample size, not that it is proven; "
            + "with more data, small departures become detectable.",
        "A good fit says nothing about the mechanism that generated the text.",
        "The goodness-of-fit test and the comparisons with other families answer different questions: a power law "
            + "that is not ruled out can still fit worse than an alternative, such as the power law with a cut-off. "
            + "Read both.",
        "Exponents and lexical figures depend on sample size: collections of very different sizes are not directly "
            + "comparable. Compare them at a matched number of tokens.",
        "Lists of rare types from private text can expose personal data (names, addresses, secrets). " + (redactBelow > 1
            ? $"In this run, token strings with count below {redactBelow} were written as null (counts kept)."
            : "Use --redact-below K to write their strings as null while keeping the counts."),
        "The least-squares slope of the log–log rank plot is shown only for comparison: it is a biased estimator.",
    ];
}
