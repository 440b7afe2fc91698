using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Reporting;

namespace RankFreq.Jobs;

/// <summary>What a profile produced.</summary>
public sealed record ProfileResult(CountSummary Count, TailFitResult Fit, LexicalSummary Lexical, GrowthAnalysis Growth,
    IReadOnlyList<PlotFile> Plots, string ReportPath, string SummaryPath, string SummaryJson, IReadOnlyList<string> Warnings);
