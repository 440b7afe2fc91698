using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>What a counting run did.</summary>
public sealed record CountSummary(
    string TokenizerSpec,
    string Normalization,
    string CaseRule,
    long Tokens,
    long Types,
    long StoredBytes,
    long TextBytes,
    long ReplacedBytes,
    long Records,
    long MalformedRecords,
    long MissingField,
    IReadOnlyList<SkippedFile> SkippedFiles,
    IReadOnlyList<InputInfo> Inputs,
    int Threads,
    int SpilledRuns,
    double Seconds);
