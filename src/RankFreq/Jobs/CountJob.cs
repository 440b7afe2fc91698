using RankFreq.Counting;
using RankFreq.Primitives;
using RankFreq.Sources;
using RankFreq.Storage;
using RankFreq.Tokenization;

namespace RankFreq.Jobs;

/// <summary>What the count job writes: the table path and the counting summary.</summary>
/// <param name="Summary">Tokens, types, bytes, records and the other counting figures.</param>
/// <param name="TablePath">The count table written.</param>
/// <param name="Warnings">Things the user should know (files skipped and why).</param>
public sealed record CountJobResult(CountSummary Summary, string TablePath, IReadOnlyList<string> Warnings);

/// <summary>
/// Counting as a job: expands the inputs, picks a shard, builds the tokenizer, runs the counting engine and, for
/// <see cref="RunAsync"/>, writes the rank table.
/// </summary>
public static class CountJob
{
    /// <summary>Counts <paramref name="inputs"/> (files, folders, "-") in memory (spilling past the budget) and
    /// returns the ranked rows, spectrum and growth; the caller disposes the result.</summary>
    public static CountResult Count(IReadOnlyList<string> inputs, CountSettings settings,
        IProgress<CountProgress>? progress = null, CancellationToken ct = default)
    {
        CoreLimit.Set(settings.Threads); // ranking and writing keep to --threads too
        var tokenizer = TokenizerFactory.Create(settings.Tokenizer);
        var (files, skipped) = InputPlanner.Expand(inputs, settings.Source ?? new SourceOptions());
        return CountEngine.Count(tokenizer, Shard(files, settings), skipped, settings, progress, ct);
    }

    /// <summary>Counts and writes the count table to <paramref name="output"/> atomically; with
    /// <paramref name="reproducible"/> the footer holds no creation time, so the same inputs and tokenizer give the
    /// same bytes whatever the thread count, memory budget or hour.</summary>
    public static async Task<CountJobResult> RunAsync(IReadOnlyList<string> inputs, CountSettings settings, string output,
        long redactBelow = 0, IProgress<CountProgress>? progress = null, CancellationToken ct = default, bool reproducible = false)
    {
        // the table is never its own input (a second run writing into a folder it counts)
        using var result = Count(inputs, settings with { Source = (settings.Source ?? new()).Skipping(output) }, progress, ct);
        var meta = CountTableMetadata.From(result.Summary, redactBelow);
        if (reproducible) meta = meta.WithoutCreationTime();
        await CountTableFile.WriteAsync(output, result.Rows, result.HasTokenIds, meta, ct);
        return new CountJobResult(result.Summary, output, Warnings(result.Summary));
    }

    /// <summary>One line per skipped input, for the console.</summary>
    internal static List<string> Warnings(CountSummary s) => s.SkippedFiles.Select(f => $"skipped {f.Path}: {f.Reason}").ToList();

    /// <summary>Shard K of N: every N-th file of the sorted list, starting at the K-th.</summary>
    private static IReadOnlyList<InputFile> Shard(IReadOnlyList<InputFile> files, CountSettings settings)
    {
        if (settings.ShardCount <= 0) return files;
        if (settings.ShardIndex < 1 || settings.ShardIndex > settings.ShardCount)
            throw new SettingsException($"shard {settings.ShardIndex}/{settings.ShardCount}: K must be between 1 and N");
        var part = files.Where((_, i) => i % settings.ShardCount == settings.ShardIndex - 1).ToList();
        if (part.Count == 0)
            throw new CountingException($"shard {settings.ShardIndex}/{settings.ShardCount} has no files: shards split by "
                + $"file, and the inputs hold {files.Count} file{(files.Count == 1 ? "" : "s")}, so N can be at most {files.Count}");
        return part;
    }
}
