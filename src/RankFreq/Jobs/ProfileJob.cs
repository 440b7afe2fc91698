using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Primitives;
using RankFreq.Reporting;
using RankFreq.Storage;

namespace RankFreq.Jobs;

/// <summary>The main job: count, fit, compare, vocabulary growth and richness, plots, report.</summary>
public static class ProfileJob
{
    /// <summary>Runs the profile; every file is written atomically, and nothing is written before counting succeeds.</summary>
    public static async Task<ProfileResult> RunAsync(IReadOnlyList<string> inputs, ProfileSettings s, IProgress<CountProgress>? countProgress = null,
        IProgress<FitProgress>? fitProgress = null, CancellationToken ct = default)
    {
        // the output folder is never an input, so a second run over a folder holding it does not read the first's tables
        var count = s.Count with { Source = (s.Count.Source ?? new()).Skipping(s.OutputDirectory) };
        using var counted = CountJob.Count(inputs, count, countProgress, ct);
        var warnings = CountJob.Warnings(counted.Summary);
        var fit = TailFitter.Fit(counted.Spectrum, s.Fit, fitProgress, ct);
        var lex = Lexicon.Summarize(counted.Spectrum);
        var growth = Lexicon.Growth(counted.Spectrum, counted.Growth);
        var forecast = Forecaster.Run(counted.Spectrum, ProfileForecast.Options(s.Fit), ct);

        // everything is written into a temporary folder that is renamed into place at the end
        using var folder = OutputFolder.Create(s.OutputDirectory);
        string dir = folder.Path;

        var sum = counted.Summary;
        var meta = CountTableMetadata.From(sum, s.RedactBelow);
        await CountTableFile.WriteAsync(Path.Combine(dir, "counts.parquet"), counted.Rows, counted.HasTokenIds, meta, ct);
        await TableFiles.WriteSpectrumAsync(Path.Combine(dir, "spectrum.parquet"), counted.Spectrum, ct);
        await FitTableFile.WriteAsync(Path.Combine(dir, "fit.parquet"), [("all", fit)], ct);
        await TableFiles.WriteGrowthAsync(Path.Combine(dir, "growth.parquet"), growth, ct);
        await FieldTableFile.WriteAsync(Path.Combine(dir, "forecast.parquet"), "forecast", ForecastFields.Point, forecast.Points, ct);

        var rendered = new[]
        {
            Plots.RankFrequency(counted.Spectrum, fit), Plots.Ccdf(counted.Spectrum, fit), Plots.Spectrum(counted.Spectrum, fit),
            Plots.AlphaBootstrap(fit), Plots.Growth(growth), forecast.Points.Count > 0 ? ForecastPlot.Growth(forecast, growth) : null,
        }.OfType<RenderedPlot>().ToArray();
        var plots = (await PlotFiles.WriteAsync(dir, rendered))
            .Select(p => p with { SvgPath = folder.Final(p.SvgPath), PngPath = p.PngPath is null ? null : folder.Final(p.PngPath) })
            .ToList();
        if (Plots.Font is null)
        {
            warnings.Add("no font file found (looked in the fontconfig folders), so PNG plots were skipped; "
                + "install a font (Debian: fonts-dejavu-core) to get them. SVG plots and the report are complete.");
        }

        var summary = new Dictionary<string, object?>();
        foreach (var part in new[]
        {
            ResultFields.ToMap(CountSummaryFields.All, sum), ResultFields.ToMap(TailFitFields.FitWithAlternatives, fit),
            ResultFields.ToMap(LexicalFields.Summary, lex), ResultFields.ToMap(LexicalFields.Growth, growth),
        })
            foreach (var kv in part) summary[kv.Key] = kv.Value;
        summary["forecast"] = ProfileForecast.Summary(forecast);
        summary["settings"] = new Dictionary<string, object?>
        {
            ["tokenizer"] = s.Count.Tokenizer,
            ["format"] = (s.Count.Source ?? new()).Format.ToString().ToLowerInvariant(),
            ["text_field"] = (s.Count.Source ?? new()).TextField,
            ["min_tail"] = s.Fit.MinTail,
            ["xmin"] = s.Fit.Xmin > 0 ? s.Fit.Xmin : null,
            ["reps"] = s.Fit.Reps,
            ["ci_reps"] = s.Fit.CiReps,
            ["threads"] = s.Fit.EffectiveThreads,
            ["redact_below"] = s.RedactBelow,
        };
        summary["inputs"] = sum.Inputs.Select(i => new Dictionary<string, object> { ["path"] = i.Path, ["bytes"] = i.Bytes }).ToList();
        summary["version"] = CountTableMetadata.CurrentVersion;
        summary["cautions"] = Cautions.For(s.RedactBelow, growth);
        string summaryPath = Path.Combine(dir, "summary.json");
        string summaryJson = JsonText.Write(summary);
        await AtomicFile.WriteTextAsync(summaryPath, summaryJson);

        string title = s.Title ?? (inputs.Count != 1 ? $"{inputs.Count} inputs" : inputs[0] == "-" ? "standard input"
            : Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(inputs[0]))));
        string reportPath = Path.Combine(dir, "report.html");
        await AtomicFile.WriteTextAsync(reportPath, ReportHtml.Build(title, sum, fit, lex, growth, rendered, s.RedactBelow,
            forecast));
        ct.ThrowIfCancellationRequested();
        folder.Publish();
        return new ProfileResult(sum, fit, lex, growth, plots, folder.Final(reportPath), folder.Final(summaryPath), summaryJson,
            warnings);
    }
}
