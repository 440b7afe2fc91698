using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;
using RankFreq.Reporting;

namespace RankFreq.Jobs;

/// <summary>How to profile: counting settings, fit options, output folder, redaction.</summary>
public sealed record ProfileSettings(CountSettings Count, FitOptions Fit, string OutputDirectory, long RedactBelow = 0, string? Title = null);
