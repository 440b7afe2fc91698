using RankFreq.Reporting;
using RankFreq.Storage;

namespace RankFreq.Jobs;

/// <summary>Writes plots drawn in memory into an output folder.</summary>
internal static class PlotFiles
{
    /// <summary>Each plot as NAME.svg, and NAME.png when it has one, atomically.</summary>
    public static async Task<List<PlotFile>> WriteAsync(string dir, IEnumerable<RenderedPlot> rendered)
    {
        var plots = new List<PlotFile>();
        foreach (var r in rendered)
        {
            string svg = Path.Combine(dir, r.Name + ".svg");
            await AtomicFile.WriteTextAsync(svg, r.Svg);
            string? png = r.Png is null ? null : Path.Combine(dir, r.Name + ".png");
            if (png is not null) await AtomicFile.WriteBytesAsync(png, r.Png!);
            plots.Add(new PlotFile(r.Name, r.Title, svg, png));
        }
        return plots;
    }
}
