using System.Diagnostics;
using System.Text;
using RankFreq.Counting;
using RankFreq.Storage;

namespace RankFreq.Jobs;

/// <summary>What a merge did.</summary>
/// <param name="Tables">Tables read.</param>
/// <param name="Tokens">Tokens in the merged table.</param>
/// <param name="Types">Types in the merged table.</param>
/// <param name="SpilledRuns">Sorted runs written to disk on the way.</param>
/// <param name="Seconds">Wall time.</param>
/// <param name="Warnings">Things the user should know (a table given twice is counted twice).</param>
public sealed record MergeSummary(int Tables, long Tokens, long Types, int SpilledRuns, double Seconds, IReadOnlyList<string> Warnings);

/// <summary>Exact merge of count tables made with the same tokenizer settings, in bounded memory.</summary>
public static class MergeJob
{
    /// <summary>Merges <paramref name="inputs"/> into <paramref name="output"/>; refuses mixed tokenizer settings and
    /// redacted tables. With <paramref name="reproducible"/> the footer holds no creation time.</summary>
    public static async Task<MergeSummary> RunAsync(IReadOnlyList<string> inputs, string output, long memoryBytes = 0,
        string? tempDir = null, CancellationToken ct = default, bool reproducible = false)
    {
        var sw = Stopwatch.StartNew();
        if (inputs.Count == 0) throw new StorageException("merge: no count tables given");
        var warnings = inputs.GroupBy(p => Path.GetFullPath(p)).Where(g => g.Count() > 1)
            .Select(g => $"{g.First()} is given {g.Count()} times; its counts are added {g.Count()} times").ToList();
        using var merger = new CountMerger(memoryBytes, tempDir);
        CountTableMetadata? first = null;
        bool ids = false;
        long tokens = 0;
        var allInputs = new List<InputInfo>();
        foreach (var path in inputs)
        {
            await using var r = await CountTableFile.OpenAsync(path, ct);
            var m = r.Metadata;
            if (first is null) { first = m; ids = r.HasTokenIds; }
            else if (m.Tokenizer != first.Tokenizer || m.Normalization != first.Normalization || m.CaseRule != first.CaseRule)
                throw new StorageException($"{path}: made with tokenizer '{m.Tokenizer}' ({m.Normalization}, case {m.CaseRule}), "
                    + $"but {inputs[0]} with '{first.Tokenizer}' ({first.Normalization}, case {first.CaseRule}); tables can only "
                    + "be merged when these agree");
            if (m.RedactedBelow > 1)
                throw new StorageException($"{path}: token strings below count {m.RedactedBelow} were redacted, so its rare types "
                    + "cannot be matched with other tables; merge unredacted tables, then redact the result");
            tokens += m.Tokens;
            allInputs.AddRange(m.Inputs);
            foreach (var b in r.Batches())
            {
                ct.ThrowIfCancellationRequested();
                for (int i = 0; i < b.Counts.Length; i++)
                {
                    var key = Encoding.UTF8.GetBytes(b.Tokens[i]
                        ?? throw new StorageException($"{path}: row {b.FirstRank + i} has no token string"));
                    merger.Add(key, b.Counts[i], b.TokenIds?[i] ?? -1);
                }
            }
        }
        var (rows, spectrum) = merger.Rank(ids);
        using (rows)
        {
            if (spectrum.TokenCount != tokens)
                throw new StorageException($"merge: the tables' footers say {tokens} tokens but their rows add up to "
                    + $"{spectrum.TokenCount}; a table may be damaged");
            var meta = first! with
            {
                Tokens = tokens,
                Types = spectrum.TypeCount,
                Inputs = allInputs,
                ToolVersion = CountTableMetadata.CurrentVersion,
                CreatedUtc = reproducible ? default : DateTime.UtcNow,
                RedactedBelow = 0,
            };
            await CountTableFile.WriteAsync(output, rows, ids, meta, ct);
        }
        return new MergeSummary(inputs.Count, tokens, spectrum.TypeCount, merger.SpilledRuns, sw.Elapsed.TotalSeconds, warnings);
    }
}
