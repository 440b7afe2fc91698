using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Sources;

namespace RankFreq.Jobs;

/// <summary>What the tokenizer-shift job needs.</summary>
/// <param name="Count">How to read the inputs; its tokenizer is ignored (each side uses its own).</param>
/// <param name="Baseline">Tokenizer spec of the baseline.</param>
/// <param name="Candidate">Tokenizer spec of the candidate.</param>
/// <param name="Options">Fit settings and Rényi order.</param>
/// <param name="OutputDirectory">Folder for shift.parquet, the unseen-entry lists, plots and report.html, or null to
/// write nothing.</param>
/// <param name="Key">Group key for per-group fertility (<c>--by</c>), or null.</param>
/// <param name="Title">Report title (default: the input name).</param>
public sealed record ShiftSettings(CountSettings Count, string Baseline, string Candidate, ShiftOptions Options,
    string? OutputDirectory = null, GroupKey? Key = null, string? Title = null);
