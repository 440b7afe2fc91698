using RankFreq.Comparison;
using RankFreq.Counting;

namespace RankFreq.Jobs;

/// <summary>What the tokenizer-shift job needs.</summary>
/// <param name="Count">How to read the inputs; its tokenizer is ignored (each side uses its own), its threads are split
/// between the two counts.</param>
/// <param name="Baseline">Tokenizer spec of the baseline.</param>
/// <param name="Candidate">Tokenizer spec of the candidate.</param>
/// <param name="Options">Fit settings and Rényi order.</param>
/// <param name="OutputDirectory">Folder for shift.parquet and the unseen-entry lists, or null to write nothing.</param>
public sealed record ShiftSettings(CountSettings Count, string Baseline, string Candidate, ShiftOptions Options,
    string? OutputDirectory = null);
