using ScottPlot;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Lexical;

namespace RankFreq.Reporting;

/// <summary>A plot written as SVG (always) and PNG (when a font file was found).</summary>
public sealed record PlotFile(string Name, string Title, string SvgPath, string? PngPath);
