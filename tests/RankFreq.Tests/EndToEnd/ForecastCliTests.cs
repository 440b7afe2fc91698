using System.Globalization;
using System.Text;
using System.Text.Json;
using Parquet;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

public class ForecastCliTests
{
    /// <summary>A Zipf-like spectrum as "value types" lines: V_m ≈ 6000 m^−1.8 for m ≤ 400, then single types.</summary>
    private static string Spectrum()
    {
        var sb = new StringBuilder("# value types\n");
        for (int m = 1; m <= 400; m++)
        {
            long v = (long)Math.Round(6000 * Math.Pow(m, -1.8));
            if (v > 0) sb.Append(CultureInfo.InvariantCulture, $"{m} {v}\n");
        }
        foreach (int big in new[] { 500, 800, 1500, 4000, 9000 }) sb.Append(CultureInfo.InvariantCulture, $"{big} 1\n");
        return sb.ToString();
    }

    [Fact]
    public async Task ForecastPrintsJsonAndWritesTablesAndPlot()
    {
        using var d = new TempDir();
        File.WriteAllText(d["s.txt"], Spectrum());
        var (code, o, e) = Cli.Run("forecast", d["s.txt"], "--to", "10x", "--to", "1e8", "--points", "15", "--reps", "30",
            "--json", "-o", d["out"]);
        Assert.True(code == 0, e);
        using var j = JsonDocument.Parse(o);
        var root = j.RootElement;
        Assert.Equal("ok", root.GetProperty("status").GetString());
        Assert.Contains(root.GetProperty("model").GetString(), new[] { "zm", "fzm", "gigp" });
        Assert.Equal(3, root.GetProperty("fits").GetArrayLength());
        foreach (var f in root.GetProperty("fits").EnumerateArray())
            Assert.Equal(15, f.GetProperty("spectrum_elements").GetInt64());
        long n = root.GetProperty("tokens").GetInt64();
        var points = root.GetProperty("points").EnumerateArray().ToList();
        Assert.Contains(points, p => p.GetProperty("tokens").GetInt64() == 10 * n);
        Assert.Contains(points, p => p.GetProperty("tokens").GetInt64() == 100_000_000);
        double last = 0;
        foreach (var p in points)
        {
            double t = p.GetProperty("types").GetDouble();
            Assert.True(t > last, "expected types grow with tokens");
            last = t;
            foreach (var k in new[] { "types_lo", "types_hi", "hapax", "coverage_types", "region" }) Assert.True(p.TryGetProperty(k, out _), k);
        }
        var far = points.Single(p => p.GetProperty("tokens").GetInt64() == 100_000_000);
        Assert.True(far.GetProperty("types_lo").GetDouble() <= far.GetProperty("types").GetDouble());
        Assert.True(far.GetProperty("types_hi").GetDouble() >= far.GetProperty("types").GetDouble());
        Assert.Equal(JsonValueKind.Null, far.GetProperty("types_exact").ValueKind);   // no in-sample value beyond N
        Assert.NotEmpty(root.GetProperty("cautions").EnumerateArray());
        foreach (var f in new[] { "forecast.parquet", "forecast.fits.parquet", "forecast.json", "forecast.svg" })
            Assert.True(File.Exists(Path.Combine(d["out"], f)), f);
        await using var pq = await ParquetReader.CreateAsync(Path.Combine(d["out"], "forecast.parquet"));
        var names = pq.Schema.GetDataFields().Select(f => f.Name).ToList();
        foreach (var k in new[] { "tokens", "types", "types_lo", "types_hi", "hapax", "coverage_types" }) Assert.Contains(k, names);
        Assert.Empty(Directory.GetFiles(d["out"], "*.tmp"));
    }

    [Fact]
    public void ConsoleSummaryShowsTheTargetsAndCautions()
    {
        using var d = new TempDir();
        File.WriteAllText(d["s.txt"], Spectrum());
        var (code, o, e) = Cli.Run("forecast", d["s.txt"], "--to", "5x", "--reps", "0", "--model", "gigp");
        Assert.True(code == 0, e);
        Assert.Contains("gigp as asked", o);
        Assert.Contains("skipped", o);
        Assert.Contains("extrapolation", o);
        Assert.Contains("drawn like the sample", o);
    }

    [Fact]
    public void DegenerateInputGivesAStatusNotANumber()
    {
        using var d = new TempDir();
        File.WriteAllText(d["h.txt"], "1 4000\n");
        var (code, o, e) = Cli.Run("forecast", d["h.txt"], "--json");
        Assert.True(code == 0, e);
        using var j = JsonDocument.Parse(o);
        Assert.Equal("all_hapax", j.RootElement.GetProperty("status").GetString());
        Assert.Equal(0, j.RootElement.GetProperty("points").GetArrayLength());
        Assert.False(string.IsNullOrEmpty(j.RootElement.GetProperty("message").GetString()));
    }

    [Fact]
    public void BadOptionsAreUsageErrorsAndBadFilesErrors()
    {
        using var d = new TempDir();
        File.WriteAllText(d["s.txt"], Spectrum());
        Assert.Equal(2, Cli.Run("forecast", d["s.txt"], "--to", "lots").Code);
        Assert.Equal(2, Cli.Run("forecast", d["s.txt"], "--coverage", "1.5").Code);
        Assert.Equal(2, Cli.Run("forecast", d["s.txt"], "--model", "nope").Code);
        var (code, _, e) = Cli.Run("forecast", d["missing.txt"]);
        Assert.Equal(1, code);
        Assert.Contains("missing.txt", e);
    }
}
