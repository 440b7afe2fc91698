using System.Globalization;
using RankFreq.Fitting;

namespace RankFreq.Comparison;

/// <summary>Plain-language lines on what a tokenizer shift changed, for the console and reports.</summary>
public static class ShiftFindings
{
    /// <summary>One sentence per finding, most important first.</summary>
    public static IReadOnlyList<string> Of(ShiftResult r)
    {
        var ic = CultureInfo.InvariantCulture;
        var (b, c) = (r.Baseline, r.Candidate);
        var lines = new List<string>();
        double change = r.TokenChange;
        if (double.IsFinite(change))
        {
            string how = Math.Abs(change) < 0.005 ? "about as many tokens as"
                : string.Create(ic, $"{Math.Abs(change) * 100:0.#}% {(change < 0 ? "fewer" : "more")} tokens than");
            lines.Add($"{c.Spec} needs {how} {b.Spec} for this text "
                + string.Create(ic, $"({c.Tokens:N0} against {b.Tokens:N0}; {r.Fertility:F3} per {Unit(b)})."));
        }
        lines.Add(string.Create(ic, $"Each {c.Spec} token carries {c.BytesPerToken:F2} bytes of text, each {b.Spec} token {b.BytesPerToken:F2}."));
        foreach (var f in new[] { b, c })
            if (f.Utilisation is { } u)
                lines.Add(string.Create(ic, $"The text uses {u * 100:F1}% of {f.Spec}'s {f.VocabularySize:N0} vocabulary entries "
                    + $"({f.VocabularySize - f.SeenEntries:N0} never appear)."));
        if (double.IsFinite(r.AlphaDiff))
        {
            bool clear = r.AlphaDiffLo > 0 || r.AlphaDiffHi < 0;
            lines.Add(string.Create(ic, $"The tail exponent α moves from {b.Fit.PowerLaw.Alpha:F3} to {c.Fit.PowerLaw.Alpha:F3} "
                + $"({r.AlphaDiff:+0.000;-0.000}")
                + (double.IsFinite(r.AlphaDiffLo)
                    ? string.Create(ic, $", 95% interval {r.AlphaDiffLo:+0.000;-0.000} to {r.AlphaDiffHi:+0.000;-0.000}); ")
                      + (clear ? "the interval excludes zero, so the tail did change." : "the interval includes zero, so no clear change.")
                    : "; no bootstrap interval)."));
        }
        else
            lines.Add($"α could not be compared: {Why(b.Fit) ?? Why(c.Fit)}.");
        lines.AddRange(ShiftGroups.Findings(r));
        lines.Add("Figures such as types and entropy depend on the amount of text; compare tokenizers on the same text only.");
        return lines;
    }

    private static string Unit(TokenizerFigures b) => b.Spec == "words" ? "word" : $"{b.Spec} token";

    private static string? Why(TailFitResult f) => f.PowerLaw.Status == FitStatus.Ok ? null
        : $"{FitStatusNames.Of(f.PowerLaw.Status)} ({f.PowerLaw.Message})";
}
