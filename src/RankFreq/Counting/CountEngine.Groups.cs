using RankFreq.Sources;
using RankFreq.Tokenization;

namespace RankFreq.Counting;

/// <summary>One group's counts from a grouped count.</summary>
/// <param name="Group">Label.</param>
/// <param name="Documents">Documents (records, or work units of a file for per-file keys) counted in it.</param>
/// <param name="Tokens">Tokens.</param>
/// <param name="Rows">Its rank table (ranks within the group).</param>
/// <param name="Spectrum">Its frequency spectrum.</param>
public sealed record CountGroup(string Group, long Documents, long Tokens, ICountRows Rows, FrequencySpectrum Spectrum);

/// <summary>The outcome of a grouped count: the run's summary (whole input) and one rank table per group.</summary>
public sealed class GroupedCountResult(CountSummary summary, IReadOnlyList<CountGroup> groups, long badGroupValues, bool hasTokenIds) : IDisposable
{
    /// <summary>What the run did (tokens over all groups; types is the sum of the groups' types).</summary>
    public CountSummary Summary => summary;
    /// <summary>The groups, in ordinal label order.</summary>
    public IReadOnlyList<CountGroup> Groups => groups;
    /// <summary>Records skipped because their group value could not be binned (with --skip-bad).</summary>
    public long BadGroupValues => badGroupValues;
    /// <summary>Whether rows carry vocabulary ids.</summary>
    public bool HasTokenIds => hasTokenIds;
    /// <inheritdoc/>
    public void Dispose()
    {
        foreach (var g in groups) g.Rows.Dispose();
    }
}

/// <summary>A worker's counts of one group.</summary>
internal sealed class GroupPart(string label, SpillSet spill, long[]? idCounts, long[]? idFirst)
{
    public string Label => label;
    public SpillSet Spill => spill;
    public TokenTable Table { get; } = new();
    public long[]? IdCounts => idCounts;
    public long[]? IdFirst => idFirst;
    public long Tokens;
    public long Documents;
}

public static partial class CountEngine
{
    /// <summary>
    /// Counts every group of <paramref name="key"/> in one pass over <paramref name="files"/>, with the same readers,
    /// tokenizer sessions, tables and spill path as <see cref="Count"/>: each document's group (from its file, or
    /// from the record as it is extracted) selects the worker's table for that group; the groups' tables are ranked
    /// separately at the end. A grouped count equals counting each group on its own. Observed growth is not kept per
    /// group. Throws as <see cref="Count"/> does.
    /// </summary>
    public static GroupedCountResult CountGroups(ITokenizer tokenizer, IReadOnlyList<InputFile> files, IReadOnlyList<SkippedFile> skipped,
        CountSettings settings, GroupKey key, IProgress<CountProgress>? progress = null, CancellationToken ct = default)
    {
        var pass = Run(tokenizer, files, skipped, settings, key, progress, ct);
        var parts = pass.Workers.SelectMany(w => w.Groups!.Values).GroupBy(p => p.Label, StringComparer.Ordinal)
            .OrderBy(g => g.Key, StringComparer.Ordinal).ToList();
        var groups = new List<CountGroup>();
        bool ids = pass.Tokenizer.Identity == TokenIdentity.Ids;
        try
        {
            long tokens = pass.UnitTokens.Sum();
            if (tokens == 0) throw NoTokensFound(pass);
            foreach (var g in parts)
            {
                ct.ThrowIfCancellationRequested();
                var list = g.ToList();
                long groupTokens = list.Sum(p => p.Tokens);
                var growth = new GrowthHistogram(GrowthCurve.Checkpoints(Math.Max(1, groupTokens)), null);
                var (rows, spectrum) = ids
                    ? RankIds(pass.Tokenizer, list.Select(p => (p.IdCounts!, p.IdFirst!)), growth)
                    : RankBuilder.Build(list.Select(p => p.Table).ToList(), list[0].Spill, pass.Budget, growth);
                groups.Add(new CountGroup(g.Key, list.Sum(p => p.Documents), groupTokens, rows, spectrum));
            }
            var summary = pass.Summary(tokens, groups.Sum(g => g.Spectrum.TypeCount));
            return new GroupedCountResult(summary, groups, pass.Stats().BadGroupValues, ids);
        }
        catch
        {
            foreach (var g in groups) g.Rows.Dispose();
            foreach (var p in parts.SelectMany(x => x)) p.Spill.Dispose();
            throw;
        }
        finally
        {
            pass.Spill.Dispose();
        }
    }
}
