using RankFreq.Primitives;
using System.Diagnostics;
using System.Runtime.ExceptionServices;
using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Reporting;
using RankFreq.Sources;
using RankFreq.Storage;
using RankFreq.Tokenization;

namespace RankFreq.Jobs;

/// <summary>What the tokenizer-shift job produced.</summary>
/// <param name="Shift">The figures of both sides and their differences.</param>
/// <param name="Files">Files written (empty without an output folder).</param>
/// <param name="Warnings">Inputs skipped and why.</param>
public sealed record ShiftJobResult(ShiftResult Shift, IReadOnlyList<string> Files, IReadOnlyList<string> Warnings)
{
    /// <summary>Wall time of each phase, in order (loading the tokenizers, counting, comparing, writing), for a user
    /// asking where the time went.</summary>
    public IReadOnlyList<(string Phase, double Seconds)> Timings { get; init; } = [];
}

/// <summary>
/// "What does this new tokenizer do to our distribution?": counts the same inputs with a baseline and a candidate
/// tokenizer and compares the two distributions (<see cref="ShiftAnalysis"/>).
/// </summary>
/// <remarks>
/// Both tokenizers count in one pass (<see cref="CountEngine.CountPair"/>): the text is read, decompressed and parsed
/// once and each block goes to both tokenizers, each with its own tables, so each side equals a <c>count</c> with that
/// tokenizer. Bytes per token use the text the tokenizers read (for JSON Lines and Parquet, the text fields only).
/// </remarks>
public static class ShiftJob
{
    /// <summary>Counts, compares and, with an output folder, writes shift.parquet, unseen.parquet (the candidate's
    /// vocabulary entries never seen), baseline-unseen.parquet (the baseline's, when it has a vocabulary),
    /// shift-groups.parquet (with a group key), the overlay plots shift-rank-frequency and shift-ccdf (SVG, and PNG
    /// when a font was found) and report.html, each file atomically.</summary>
    public static async Task<ShiftJobResult> RunAsync(IReadOnlyList<string> inputs, ShiftSettings s,
        IProgress<CountProgress>? progress = null, CancellationToken ct = default)
    {
        CoreLimit.Set(s.Count.Threads); // ranking and writing keep to --threads too
        var source = s.Count.Source ?? new();
        if (s.OutputDirectory is not null) source = source.Skipping(s.OutputDirectory);
        if (s.Key is not null) source = source with { Group = s.Key };
        var warnings = new List<string>();
        var clock = Stopwatch.StartNew();
        var timings = new List<(string, double)>();
        void Phase(string name)
        {
            timings.Add((name, clock.Elapsed.TotalSeconds));
            clock.Restart();
        }
        // the two vocabularies load side by side (a tiktoken or tokenizer.json load takes a few tenths of a second)
        var (baseTok, candTok) = await BothAsync(() => TokenizerFactory.Create(s.Baseline), () => TokenizerFactory.Create(s.Candidate));
        Phase("load tokenizers");
        var (files, skipped) = InputPlanner.Expand(inputs, source);
        if (s.Key is not null) ContrastJob.CheckFormats(files, s.Key);
        var count = s.Count with { Source = source };
        ShiftResult shift;
        CountSummary summary;
        using (var pair = CountEngine.CountPair(baseTok, candTok, files, skipped, count, s.Key, progress, ct))
        {
            if (s.Key is not null) ContrastJob.CheckKeyFound(pair.Groups.Select(g => g.Group), files, s.Key);
            summary = pair.First.Summary;
            warnings.AddRange(CountJob.Warnings(summary));
            Phase("count both");
            // the two sides' figures and fits are independent (each fit's draws are seeded by replicate), so they run
            // side by side: the sequential parts of one (xmin search, alternatives) overlap the other's
            var (b, c) = await BothAsync(() => ShiftAnalysis.Describe(pair.First, baseTok, s.Options, ct, pair.TextBytes),
                () => ShiftAnalysis.Describe(pair.Second, candTok, s.Options, ct, pair.TextBytes));
            shift = ShiftAnalysis.Compare(b, c);
            Phase("fit and compare");
            if (s.Key is { } key)
                shift = shift with
                {
                    GroupKey = key.Spec,
                    Groups = ShiftGroups.From(pair.Groups, key.Order(pair.Groups.Select(g => g.Group)), shift.Fertility),
                };
        }

        var written = new List<string>();
        if (s.OutputDirectory is not null)
        {
            // written into a temporary folder that is renamed into place at the end
            using var folder = OutputFolder.Create(s.OutputDirectory);
            string dir = folder.Path;
            async Task Table<T>(string name, string table, IReadOnlyList<Primitives.ResultField<T>> fields, IReadOnlyList<T> rows)
            {
                string path = Path.Combine(dir, name);
                await FieldTableFile.WriteAsync(path, table, fields, rows, ct);
                written.Add(path);
            }
            await Table("shift.parquet", "shift", ShiftFields.Flat, [shift]);
            if (shift.Candidate.VocabularySize > 0) await Table("unseen.parquet", "unseen", ShiftFields.Unseen, shift.Unseen);
            if (shift.Baseline.VocabularySize > 0)
                await Table("baseline-unseen.parquet", "unseen", ShiftFields.Unseen, shift.BaselineUnseen);
            if (shift.GroupKey is not null) await Table("shift-groups.parquet", "shift_groups", ShiftGroups.Fields, shift.Groups);
            var rendered = new[] { Plots.ShiftRankFrequency(shift), Plots.ShiftCcdf(shift), Plots.ShiftByGroup(shift) }
                .OfType<RenderedPlot>().ToList();
            foreach (var p in await PlotFiles.WriteAsync(dir, rendered))
            {
                written.Add(p.SvgPath);
                if (p.PngPath is not null) written.Add(p.PngPath);
            }
            if (Plots.Font is null)
                warnings.Add("no font file found (looked in the fontconfig folders), so PNG plots were skipped; install a font "
                    + "(Debian: fonts-dejavu-core) to get them. SVG plots and the report are complete.");
            string title = s.Title ?? (inputs.Count == 1
                ? Path.GetFileName(Path.TrimEndingDirectorySeparator(Path.GetFullPath(inputs[0]))) : $"{inputs.Count} inputs");
            string report = Path.Combine(dir, "report.html");
            await AtomicFile.WriteTextAsync(report, ReportHtml.BuildShift(title, summary, shift, ShiftFindings.Of(shift), rendered));
            written.Add(report);
            ct.ThrowIfCancellationRequested();
            folder.Publish();
            written = written.Select(folder.Final).ToList();
            Phase("write");
        }
        return new ShiftJobResult(shift, written, warnings) { Timings = timings };
    }

    /// <summary>Runs <paramref name="first"/> on the thread pool while <paramref name="second"/> runs here; when both
    /// fail, the first's exception leaves, as if they had run one after the other.</summary>
    private static async Task<(T First, T Second)> BothAsync<T>(Func<T> first, Func<T> second)
    {
        var a = Task.Run(first, CancellationToken.None);
        T b;
        try { b = second(); }
        catch
        {
            await ((Task)a).ConfigureAwait(ConfigureAwaitOptions.SuppressThrowing);
            if (a.Exception?.InnerException is { } e) ExceptionDispatchInfo.Capture(e).Throw();
            throw;
        }
        return (await a, b);
    }
}
