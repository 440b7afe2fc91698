using RankFreq.Fitting;
using RankFreq.Primitives;

namespace RankFreq.Storage;

/// <summary>Writes fit results: one row per group (the fit fields) and a second table with one row per (group,
/// alternative), both generated from <see cref="TailFitFields"/>.</summary>
public static class FitTableFile
{
    /// <summary>The alternatives table written beside a fit table: <c>X.parquet</c> → <c>X.alternatives.parquet</c>.</summary>
    public static string AlternativesPath(string fitPath) =>
        Path.Combine(Path.GetDirectoryName(Path.GetFullPath(fitPath))!, Path.GetFileNameWithoutExtension(fitPath) + ".alternatives.parquet");

    private static readonly ResultField<(string Group, TailFitResult Fit)>[] FitColumns =
        [new("group", FieldKind.Text, r => r.Group, "group"), .. TailFitFields.Fit.Select(f => f.From<(string Group, TailFitResult Fit)>(r => r.Fit))];

    private static readonly ResultField<(string Group, AlternativeComparison Alt)>[] AlternativeColumns =
    [
        new("group", FieldKind.Text, r => r.Group, "group"),
        .. TailFitFields.Alternative.Select(f => f.From<(string Group, AlternativeComparison Alt)>(r => r.Alt)),
    ];

    /// <summary>Writes the fit table and the alternatives table atomically.</summary>
    public static async Task WriteAsync(string path, IReadOnlyList<(string Group, TailFitResult Fit)> fits, CancellationToken ct = default)
    {
        await FieldTableFile.WriteAsync(path, "fit", FitColumns, fits, ct);
        var alternatives = fits.SelectMany(f => f.Fit.Alternatives.Select(a => (f.Group, a))).ToList();
        await FieldTableFile.WriteAsync(AlternativesPath(path), "alternatives", AlternativeColumns, alternatives, ct);
    }
}
