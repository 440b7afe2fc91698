using RankFreq.Counting;
using RankFreq.Lexical;
using RankFreq.Primitives;
using RankFreq.Reporting;
using RankFreq.Storage;

namespace RankFreq.Jobs;

/// <summary>Settings of the forecast job.</summary>
/// <param name="Input">A count table, a count list or a spectrum (as <c>fit</c> reads it).</param>
/// <param name="Options">The forecast settings.</param>
/// <param name="OutputDirectory">Folder for forecast.parquet, forecast.fits.parquet, forecast.json and the plot; null
/// for none.</param>
public sealed record ForecastSettings(string Input, ForecastOptions Options, string? OutputDirectory = null);

/// <summary>What the forecast job produced.</summary>
/// <param name="Forecast">The models and the curve.</param>
/// <param name="Description">What the input was.</param>
/// <param name="Json">The forecast as one JSON document (as written to forecast.json).</param>
/// <param name="Files">Files written (empty without an output folder).</param>
/// <param name="Warnings">Things the user should know (e.g. PNG skipped without a font).</param>
public sealed record ForecastJobResult(ForecastResult Forecast, string Description, string Json, IReadOnlyList<string> Files,
    IReadOnlyList<string> Warnings);

/// <summary>Vocabulary forecasting as a job: loads a spectrum, fits LNRE models, forecasts, writes tables and a plot.</summary>
public static class ForecastJob
{
    /// <summary>Runs the forecast; files are written atomically and only after the forecast succeeded.</summary>
    public static async Task<ForecastJobResult> RunAsync(ForecastSettings s, CancellationToken ct = default)
    {
        var (spectrum, description, _) = await SpectrumInput.LoadAsync(s.Input, ct);
        var forecast = await Task.Run(() => Forecaster.Run(spectrum, s.Options, ct), ct);
        var map = ForecastFields.ToMap(forecast);
        map["input"] = s.Input;
        map["description"] = description;
        map["version"] = CountTableMetadata.CurrentVersion;
        string json = JsonText.Write(map);
        var files = new List<string>();
        var warnings = new List<string>();
        if (s.OutputDirectory is not null)
        {
            // written into a temporary folder that is renamed into place at the end
            using var folder = OutputFolder.Create(s.OutputDirectory);
            string dir = folder.Path;
            string points = Path.Combine(dir, "forecast.parquet"), fits = Path.Combine(dir, "forecast.fits.parquet");
            await FieldTableFile.WriteAsync(points, "forecast", ForecastFields.Point, forecast.Points, ct);
            await FieldTableFile.WriteAsync(fits, "forecast_fits", ForecastFields.Fit, forecast.Fits, ct);
            string jsonPath = Path.Combine(dir, "forecast.json");
            await AtomicFile.WriteTextAsync(jsonPath, json);
            files.AddRange([points, fits, jsonPath]);
            if (forecast.Points.Count > 0)
            {
                var plot = ForecastPlot.Growth(forecast);
                string svg = Path.Combine(dir, plot.Name + ".svg");
                await AtomicFile.WriteTextAsync(svg, plot.Svg);
                files.Add(svg);
                if (plot.Png is { } png)
                {
                    string pngPath = Path.Combine(dir, plot.Name + ".png");
                    await AtomicFile.WriteBytesAsync(pngPath, png);
                    files.Add(pngPath);
                }
                else warnings.Add("no font file found, so the PNG plot was skipped (Debian: fonts-dejavu-core); the SVG is complete.");
            }
            ct.ThrowIfCancellationRequested();
            folder.Publish();
            files = files.Select(folder.Final).ToList();
        }
        return new ForecastJobResult(forecast, description, json, files, warnings);
    }
}
