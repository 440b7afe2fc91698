namespace RankFreq.Reporting;

/// <summary>A plot drawn in memory: SVG text (always) and PNG bytes (when a font file was found).</summary>
/// <param name="Name">File stem, e.g. "ccdf".</param>
/// <param name="Title">Caption.</param>
/// <param name="Svg">The SVG document.</param>
/// <param name="Png">The PNG image, or null without a font.</param>
public sealed record RenderedPlot(string Name, string Title, string Svg, byte[]? Png);
