using RankFreq.Comparison;
using RankFreq.Reporting;
using RankFreq.Storage;
using RankFreq.Tokenization;

namespace RankFreq.Jobs;

/// <summary>What the tokenizer-shift job produced.</summary>
/// <param name="Shift">The figures of both sides and their differences.</param>
/// <param name="Files">Files written (empty without an output folder).</param>
/// <param name="Warnings">Inputs skipped and why.</param>
public sealed record ShiftJobResult(ShiftResult Shift, IReadOnlyList<string> Files, IReadOnlyList<string> Warnings);

/// <summary>
/// "What does this new tokenizer do to our distribution?": counts the same inputs with a baseline and a candidate
/// tokenizer and compares the two distributions (<see cref="ShiftAnalysis"/>).
/// </summary>
/// <remarks>
/// The two counts run concurrently through <see cref="CountJob.Count"/>, each on half the threads, so the text is read
/// (and decompressed, parsed) twice. Tokenizing both ways in one pass over the text is future work.
/// </remarks>
public static class ShiftJob
{
    /// <summary>Counts, compares and, with an output folder, writes shift.parquet, unseen.parquet (the candidate's
    /// vocabulary entries never seen) and baseline-unseen.parquet (the baseline's, when it has a vocabulary)
    /// and the overlay plots shift-rank-frequency and
    /// shift-ccdf (SVG, and PNG when a font was found).</summary>
    public static async Task<ShiftJobResult> RunAsync(IReadOnlyList<string> inputs, ShiftSettings s,
        CancellationToken ct = default)
    {
        var source = s.Count.Source ?? new();
        if (s.OutputDirectory is not null) source = source.Skipping(s.OutputDirectory);
        int threads = Math.Max(1, s.Count.EffectiveThreads / 2);
        var count = s.Count with { Source = source, Threads = threads };
        var options = s.Options with { Fit = s.Options.Fit with { Threads = threads } };
        var warnings = new List<string>();

        (TokenizerFigures, IReadOnlyList<UnseenEntry>) Side(string spec, bool report)
        {
            var tokenizer = TokenizerFactory.Create(spec);
            using var counted = CountJob.Count(inputs, count with { Tokenizer = spec }, null, ct);
            if (report) lock (warnings) warnings.AddRange(CountJob.Warnings(counted.Summary));
            return ShiftAnalysis.Describe(counted, tokenizer, options, ct);
        }
        var baseline = Task.Run(() => Side(s.Baseline, true), ct);
        var candidate = Task.Run(() => Side(s.Candidate, false), ct);
        await Task.WhenAll(baseline, candidate);
        var shift = ShiftAnalysis.Compare(await baseline, await candidate);

        var files = new List<string>();
        if (s.OutputDirectory is not null)
        {
            // written into a temporary folder that is renamed into place at the end
            using var folder = OutputFolder.Create(s.OutputDirectory);
            string dir = folder.Path;
            string path = Path.Combine(dir, "shift.parquet");
            await FieldTableFile.WriteAsync(path, "shift", ShiftFields.Flat, [shift], ct);
            files.Add(path);
            if (shift.Candidate.VocabularySize > 0)
            {
                path = Path.Combine(dir, "unseen.parquet");
                await FieldTableFile.WriteAsync(path, "unseen", ShiftFields.Unseen, shift.Unseen, ct);
                files.Add(path);
            }
            if (shift.Baseline.VocabularySize > 0)
            {
                path = Path.Combine(dir, "baseline-unseen.parquet");
                await FieldTableFile.WriteAsync(path, "unseen", ShiftFields.Unseen, shift.BaselineUnseen, ct);
                files.Add(path);
            }
            foreach (var plot in new[] { Plots.ShiftRankFrequency(shift), Plots.ShiftCcdf(shift) }.OfType<RenderedPlot>())
            {
                path = Path.Combine(dir, plot.Name + ".svg");
                await AtomicFile.WriteTextAsync(path, plot.Svg);
                files.Add(path);
                if (plot.Png is null) continue;
                path = Path.Combine(dir, plot.Name + ".png");
                await AtomicFile.WriteBytesAsync(path, plot.Png);
                files.Add(path);
            }
            ct.ThrowIfCancellationRequested();
            folder.Publish();
            files = files.Select(folder.Final).ToList();
        }
        return new ShiftJobResult(shift, files, warnings);
    }
}
