using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Lexical;

/// <summary>
/// The forecast tried on the sample itself: the models are fitted to a random part of the sample (binomial thinning)
/// and forecast the whole sample, whose types and hapaxes are known. The errors show the size and sign to expect when
/// forecasting the same multiple beyond the sample, on this kind of text.
/// </summary>
/// <param name="Fraction">Share of the tokens kept, 1 / the largest target multiple (between 1/20 and 1/2).</param>
/// <param name="SampleTokens">Tokens of the thinned part.</param>
/// <param name="Status">"ok", or why no model fitted the thinned part.</param>
/// <param name="Family">The model chosen on the thinned part, as the forecast chooses; null when none fitted.</param>
/// <param name="Types">Its forecast of V at the sample size.</param>
/// <param name="Hapax">Its forecast of V_1 at the sample size.</param>
/// <param name="HapaxModelsMin">Lowest V_1 forecast among the models fitted to the thinned part.</param>
/// <param name="HapaxModelsMax">Highest V_1 forecast among them.</param>
/// <param name="ObservedTypes">V of the sample.</param>
/// <param name="ObservedHapax">V_1 of the sample.</param>
public sealed record ForecastSelfCheck(double Fraction, double SampleTokens, string Status, string? Family, double Types,
    double Hapax, double HapaxModelsMin, double HapaxModelsMax, double ObservedTypes, double ObservedHapax)
{
    /// <summary>Relative error of the types forecast (negative: too few).</summary>
    public double TypesError => Types / ObservedTypes - 1;

    /// <summary>Relative error of the hapax forecast (negative: too few).</summary>
    public double HapaxError => ObservedHapax > 0 ? Hapax / ObservedHapax - 1 : double.NaN;

    /// <summary>Xoshiro stream of the thinning ("SELF"), apart from the bootstrap's.</summary>
    private const ulong Stream = 0x53454C46;

    /// <summary>Thins the sample to 1 / (largest target multiple), fits as the forecast does, forecasts the sample.</summary>
    public static ForecastSelfCheck Run(FrequencySpectrum s, ForecastOptions o, IReadOnlyList<string> families)
    {
        double n = s.TokenCount;
        double multiple = o.Targets.Count == 0 ? 10 : o.Targets.Max(t => t.TokensFor(n)) / n;
        double fraction = 1 / Math.Clamp(multiple, 2, 20);
        var thin = SpectrumThinning.Thin(s, fraction, new Xoshiro(o.Seed, Stream, 0));
        double v1 = s.Values.Length > 0 && s.Values[0] == 1 ? s.Types[0] : 0;
        var fits = families.Select(f => LnreFitter.Fit(thin, f)).ToList();
        var chosen = LnreFitter.Best(fits);
        if (chosen?.Model is not { } model)
        {
            var failed = fits.FirstOrDefault();
            return new ForecastSelfCheck(fraction, thin.TokenCount, failed is null ? "no_solution" : LnreStatusNames.Of(failed.Status),
                null, double.NaN, double.NaN, double.NaN, double.NaN, s.TypeCount, v1);
        }
        var hapax = fits.Where(f => f.Model is not null).Select(f => f.Model!.ExpectedSpectrum(n, 1)[1]).ToList();
        return new ForecastSelfCheck(fraction, thin.TokenCount, "ok", chosen.Family, model.ExpectedTypes(n),
            model.ExpectedSpectrum(n, 1)[1], hapax.Min(), hapax.Max(), s.TypeCount, v1);
    }

    /// <summary>The check in one sentence.</summary>
    public string Describe() => Status != "ok"
        ? $"Self-check not possible: no model fitted a random {Pct(Fraction)} of the sample ({Status})."
        : $"Self-check: fitted to a random {Pct(Fraction)} of this sample ({SampleTokens:N0} tokens), the {Family} model "
            + $"forecast the whole sample's types {Signed(TypesError)} and its hapaxes {Signed(HapaxError)} off "
            + $"(all models: hapaxes {Signed(HapaxModelsMin / ObservedHapax - 1)} to "
            + $"{Signed(HapaxModelsMax / ObservedHapax - 1)}). "
            + $"Expect errors of about this size and sign at {Times(1 / Fraction)} beyond it.";

    private static string Times(double x) => x.ToString("0.#", CultureInfo.InvariantCulture) + "×";

    private static string Pct(double x) => (100 * x).ToString("0.#", CultureInfo.InvariantCulture) + "%";

    private static string Signed(double x) =>
        double.IsFinite(x) ? (x >= 0 ? "+" : "−") + (100 * Math.Abs(x)).ToString("0.0", CultureInfo.InvariantCulture) + "%" : "–";
}
