using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Primitives;
using RankFreq.Reporting;
using RankFreq.Sources;
using RankFreq.Storage;
using RankFreq.Tokenization;

namespace RankFreq.Jobs;

/// <summary>How to contrast document sets.</summary>
/// <param name="Count">Counting settings (tokenizer, inputs, threads, memory).</param>
/// <param name="Key">What a document's group is (null: read from <paramref name="GroupsFile"/>).</param>
/// <param name="Options">Statistics settings.</param>
/// <param name="OutputDirectory">Folder for tables, plots and the report (null: nothing written).</param>
/// <param name="RedactBelow">Write token strings of types counted below this as null in the grouped count table.</param>
/// <param name="Title">Report title (default: the input name).</param>
/// <param name="GroupsFile">A file of (path, group) lines, read by <see cref="GroupKey.FromTable"/> when no key is given.</param>
public sealed record ContrastSettings(CountSettings Count, GroupKey? Key, ContrastOptions Options, string? OutputDirectory = null,
    long RedactBelow = 0, string? Title = null, string? GroupsFile = null);

/// <summary>What a contrast produced.</summary>
/// <param name="Count">Counting figures of the whole run.</param>
/// <param name="Contrast">The comparison.</param>
/// <param name="BadGroupValues">Records skipped because their group value could not be binned (--skip-bad).</param>
/// <param name="Cautions">Every caution: the comparison's, then the general ones.</param>
/// <param name="SummaryJson">The JSON document (also written as summary.json when there is an output folder).</param>
/// <param name="ReportPath">report.html, when written.</param>
/// <param name="Warnings">Things the user should know (files skipped, records skipped, no font).</param>
/// <param name="GroupKey">The key as written (<c>field:year/50</c>, <c>groups:FILE</c>).</param>
public sealed record ContrastJobResult(CountSummary Count, ContrastResult Contrast, long BadGroupValues, IReadOnlyList<string> Cautions,
    string SummaryJson, string? ReportPath, IReadOnlyList<string> Warnings, string GroupKey);

/// <summary>
/// <c>contrast</c>: counts every group in one pass, compares the groups' tails and lexical figures at their own and
/// at matched size, and writes groups.parquet, pairs.parquet, the grouped count table, plots and report.html into a
/// temporary folder that is renamed into place (or whose files are moved into an existing folder one by one).
/// </summary>
public static class ContrastJob
{
    /// <summary>Runs the contrast. Bad input throws a <see cref="Primitives.RankFreqException"/> before anything is written.</summary>
    public static async Task<ContrastJobResult> RunAsync(IReadOnlyList<string> inputs, ContrastSettings settings,
        IProgress<CountProgress>? countProgress = null,
        IProgress<ContrastProgress>? progress = null, CancellationToken ct = default)
    {
        var s = settings.Key is null
            ? settings with
            {
                Key = GroupKey.FromTable(settings.GroupsFile ?? throw new ArgumentException("a group key or a groups file is needed",
                nameof(settings)))
            }
            : settings;
        var key = s.Key!;
        // a folder input never reads this run's own output folder
        var count = s.OutputDirectory is { } outDir ? s.Count with { Source = (s.Count.Source ?? new()).Skipping(outDir) } : s.Count;
        using var counted = CountGroups(inputs, count, key, countProgress, ct);
        var byLabel = counted.Groups.ToDictionary(g => g.Group, StringComparer.Ordinal);
        var ordered = key.Order(byLabel.Keys).Select(l => byLabel[l]).ToList();
        var spectra = ordered.Select(g => new GroupSpectrum(g.Group, g.Spectrum, g.Documents)).ToList();
        var result = GroupComparison.Compare(spectra, s.Options, progress, ct);

        var warnings = CountJob.Warnings(counted.Summary);
        if (counted.BadGroupValues > 0)
            warnings.Add($"{counted.BadGroupValues:N0} record(s) skipped because their '{key.Name}' value could not be binned (--skip-bad)");
        var cautions = result.Cautions.Concat(Reporting.Cautions.For(s.RedactBelow)).ToList();
        var summary = ContrastSummary.Build(result, counted.Summary, key.Spec, counted.BadGroupValues, cautions);
        string json = JsonText.Write(summary);
        string? report = null;
        if (s.OutputDirectory is { } dir)
        {
            report = await WriteFolderAsync(dir, inputs, s, counted, ordered, spectra, result, cautions, json, warnings, ct);
        }
        return new ContrastJobResult(counted.Summary, result, counted.BadGroupValues, cautions, json, report, warnings, key.Spec);
    }

    /// <summary>
    /// Counts every group of <paramref name="key"/> in one pass over <paramref name="inputs"/> (the counting engine's
    /// grouped mode). A field key needs JSON Lines input and a column key Parquet; a record key that no record has
    /// is an error naming the file. The caller disposes the result.
    /// </summary>
    public static GroupedCountResult CountGroups(IReadOnlyList<string> inputs, CountSettings count, GroupKey key,
        IProgress<CountProgress>? progress = null, CancellationToken ct = default)
    {
        CoreLimit.Set(count.Threads); // ranking and writing keep to --threads too
        var source = (count.Source ?? new SourceOptions()) with { Group = key };
        var tokenizer = TokenizerFactory.Create(count.Tokenizer);
        var (files, skipped) = InputPlanner.Expand(inputs, source);
        CheckFormats(files, key);
        var counted = CountEngine.CountGroups(tokenizer, files, skipped, count with { Source = source }, key, progress, ct);
        try { CheckKeyFound(counted.Groups.Select(g => g.Group), files, key); }
        catch { counted.Dispose(); throw; }
        return counted;
    }

    /// <summary>A field key needs JSON Lines, a column key Parquet: any other input is an error naming it.</summary>
    internal static void CheckFormats(IReadOnlyList<InputFile> files, GroupKey key)
    {
        var need = key.Kind switch { GroupKind.Field => InputFormat.JsonLines, GroupKind.Column => InputFormat.Parquet, _ => InputFormat.Auto };
        if (need == InputFormat.Auto) return;
        if (files.FirstOrDefault(f => f.Format != need) is { } bad)
            throw new SourceException($"{bad.Path}: --by {key.Spec} needs {(need == InputFormat.JsonLines ? "JSON Lines" : "Parquet")} input, " +
                $"but this file is read as {bad.Format.ToString().ToLowerInvariant()} (use --format, or --by file)");
    }

    /// <summary>A record key that no record has is almost surely a typo: an error naming the fields the first record has.</summary>
    internal static void CheckKeyFound(IEnumerable<string> labels, IReadOnlyList<InputFile> files, GroupKey key)
    {
        if (key.PerFile || labels.Any(g => g != GroupKey.Missing)) return;
        string hint = "";
        var first = files.FirstOrDefault(f => f.Format == InputFormat.JsonLines && !f.IsStdin);
        if (key.Kind == GroupKind.Field && first is not null) hint = FirstRecordFields(first.Path);
        throw new SourceException($"{(first?.Path ?? files[0].Path)}: no record has the field '{key.Name}' to group by{hint}");
    }

    private static string FirstRecordFields(string path)
    {
        try
        {
            using var fs = File.OpenRead(path);
            Span<byte> head = stackalloc byte[8];
            int n = fs.Read(head);
            fs.Position = 0;
            using var reader = new StreamReader(Decompression.Open(fs, Decompression.Detect(head[..n])));
            string? line = reader.ReadLine();
            if (line is null) return "";
            using var doc = System.Text.Json.JsonDocument.Parse(line);
            return $" (line 1 has: {string.Join(", ", doc.RootElement.EnumerateObject().Select(p => p.Name))})";
        }
        catch (Exception e) when (e is IOException or System.Text.Json.JsonException or InvalidOperationException or InvalidDataException) { return ""; }
    }

    private static async Task<string> WriteFolderAsync(string dir, IReadOnlyList<string> inputs, ContrastSettings s, GroupedCountResult counted,
        IReadOnlyList<CountGroup> ordered, IReadOnlyList<GroupSpectrum> spectra, ContrastResult result, IReadOnlyList<string> cautions,
        string json, List<string> warnings, CancellationToken ct)
    {
        // everything is written into a temporary folder that is renamed into place at the end
        using var folder = OutputFolder.Create(dir);
        string tmp = folder.Path;
        var meta = CountTableMetadata.From(counted.Summary, s.RedactBelow);
        await ContrastTables.WriteGroupedCountsAsync(Path.Combine(tmp, "counts.parquet"), ordered, counted.HasTokenIds, meta, s.Key!.Spec, ct);
        await ContrastTables.WriteGroupsAsync(Path.Combine(tmp, "groups.parquet"), result, ct);
        await ContrastTables.WritePairsAsync(Path.Combine(tmp, "pairs.parquet"), result, ct);
        await AtomicFile.WriteTextAsync(Path.Combine(tmp, "summary.json"), json);
        var rendered = new[] { Plots.Exponents(result), Plots.RankFrequencyByGroup(spectra), Plots.CcdfByGroup(spectra) };
        await PlotFiles.WriteAsync(tmp, rendered);
        if (Plots.Font is null)
            warnings.Add("no font file found (looked in the fontconfig folders), so PNG plots were skipped; install a font (Debian: " +
                "fonts-dejavu-core) to get them. SVG plots and the report are complete.");
        string title = s.Title ?? (inputs.Count == 1 ? Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(inputs[0])))
            : $"{inputs.Count} inputs");
        await AtomicFile.WriteTextAsync(Path.Combine(tmp, "report.html"), ReportHtml.BuildContrast(title, s.Key!.Spec, counted.Summary, result,
            cautions, rendered));
        ct.ThrowIfCancellationRequested();
        folder.Publish();
        return Path.Combine(dir, "report.html");
    }
}
