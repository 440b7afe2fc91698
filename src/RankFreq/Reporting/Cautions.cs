namespace RankFreq.Reporting;

/// <summary>How the results can be misread, in the words every output uses (summary.json, the report, the console).</summary>
public static class Cautions
{
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
