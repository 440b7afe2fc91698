using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Storage;

namespace RankFreq.Jobs;

/// <summary>What the fit job produced.</summary>
/// <param name="Fit">The tail fit with its bootstraps and alternatives.</param>
/// <param name="Spectrum">The frequency spectrum that was fitted.</param>
/// <param name="Description">What the input was (a count table and its tokenizer, or a count list).</param>
/// <param name="TablePath">The fit table written, or null when none was asked for.</param>
/// <param name="Notes">What the reader skipped or combined (a header line, a token listed twice).</param>
public sealed record FitJobResult(TailFitResult Fit, FrequencySpectrum Spectrum, string Description, string? TablePath,
    IReadOnlyList<string>? Notes = null);

/// <summary>Fitting as a job: loads a spectrum from a count table or a list of counts, fits it, writes the fit table.</summary>
public static class FitJob
{
    /// <summary>Loads <paramref name="input"/>, fits its tail and, when <paramref name="output"/> is given, writes the
    /// fit table and the alternatives table beside it.</summary>
    public static async Task<FitJobResult> RunAsync(string input, FitOptions options, string? output = null,
        IProgress<FitProgress>? progress = null, CancellationToken ct = default)
    {
        var (spectrum, description, notes) = await SpectrumInput.LoadAsync(input, ct);
        var fit = await Task.Run(() => TailFitter.Fit(spectrum, options, progress, ct), ct);
        if (output is not null) await FitTableFile.WriteAsync(output, [("all", fit)], ct);
        return new FitJobResult(fit, spectrum, description, output, notes);
    }
}
