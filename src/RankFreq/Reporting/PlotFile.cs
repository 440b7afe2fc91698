namespace RankFreq.Reporting;

/// <summary>A plot as written to an output folder: SVG (always) and PNG (when a font file was found).</summary>
public sealed record PlotFile(string Name, string Title, string SvgPath, string? PngPath);
