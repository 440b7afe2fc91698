namespace RankFreq.Lexical;

/// <summary>A vocabulary forecast: the models tried, the one used and why, and the curve.</summary>
/// <param name="Tokens">N of the sample.</param>
/// <param name="Types">V of the sample.</param>
/// <param name="Hapax">V_1 of the sample.</param>
/// <param name="Fits">Every family tried, in <see cref="LnreFitter.Families"/> order.</param>
/// <param name="Chosen">The fit used for the curve, or null when none fitted.</param>
/// <param name="Reason">Why that model, in words (or why none).</param>
/// <param name="Points">The curve, tokens increasing (empty when no model fitted).</param>
/// <param name="Options">The settings.</param>
/// <param name="RepsUsed">Bootstrap replicates that refitted (the intervals rest on these).</param>
/// <param name="Cautions">How the forecast can mislead, in words.</param>
/// <param name="SelfCheck">The forecast tried on the sample itself from a random part of it (null when no model
/// fitted the sample).</param>
public sealed record ForecastResult(double Tokens, double Types, double Hapax, IReadOnlyList<LnreFit> Fits, LnreFit? Chosen,
    string Reason, IReadOnlyList<ForecastPoint> Points, ForecastOptions Options, int RepsUsed, IReadOnlyList<string> Cautions,
    ForecastSelfCheck? SelfCheck = null)
{
    /// <summary>"ok" when a model fitted, otherwise the status of the chosen family's failure.</summary>
    public string Status => Chosen is not null ? "ok"
        : LnreStatusNames.Of(Fits.FirstOrDefault(f => Options.Family == "auto" || f.Family == Options.Family)?.Status ?? LnreStatus.NoSolution);

    /// <summary>The message of that failure (empty when ok).</summary>
    public string Message => Chosen is not null ? ""
        : Fits.FirstOrDefault(f => Options.Family == "auto" || f.Family == Options.Family)?.Message ?? "";

    /// <summary>The point at each target size of the options, in their order (targets with no point are left out).</summary>
    public IReadOnlyList<(ForecastTarget Target, ForecastPoint Point)> AtTargets() =>
        [.. Options.Targets.Select(t => (t, Points.FirstOrDefault(p => p.Tokens == Math.Round(t.TokensFor(Tokens)))))
            .Where(x => x.Item2 is not null).Select(x => (x.t, x.Item2!))];
}
