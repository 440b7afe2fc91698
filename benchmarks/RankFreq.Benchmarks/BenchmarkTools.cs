using RankFreq.Storage;

namespace RankFreq.Benchmarks;

/// <summary>Utility commands of the benchmark project that are not benchmarks (`-- tools ...`): they prepare inputs
/// for the whole-command scripts in benchmarks/peers/.</summary>
internal static class BenchmarkTools
{
    private const string Usage = "usage: RankFreq.Benchmarks tools make-spectrum FILE   "
        + "(writes a spectrum of 10^6 types, α = 2, xmin = 1, as value,types lines)";

    /// <summary>Runs one tool; returns the exit code (2 on a usage error).</summary>
    public static int Run(string[] args)
    {
        if (args is ["make-spectrum", var path]) return MakeSpectrum(path);
        if (args is ["make-highcard", .. var rest]) return HighCardinalityText.Run(rest);
        if (args is ["table-hash", var table]) return TableHash.Run(table);
        if (args is ["table-replay", .. var replay]) return TableReplay.Run(replay);
        Console.Error.WriteLine(Usage);
        Console.Error.WriteLine("       RankFreq.Benchmarks " + HighCardinalityText.Usage);
        Console.Error.WriteLine("       RankFreq.Benchmarks " + TableHash.Usage);
        Console.Error.WriteLine("       RankFreq.Benchmarks " + TableReplay.Usage);
        return 2;
    }

    private static int MakeSpectrum(string path)
    {
        var s = SyntheticSpectra.PowerLaw(1_000_000);
        try
        {
            AtomicFile.WriteAsync(path, async stream =>
            {
                await using var w = new StreamWriter(stream, leaveOpen: true);
                for (int i = 0; i < s.Values.Length; i++) await w.WriteLineAsync($"{s.Values[i]},{s.Types[i]}");
            }).GetAwaiter().GetResult();
        }
        catch (StorageException e)
        {
            Console.Error.WriteLine(e.Message);
            return 1;
        }
        Console.WriteLine($"{path}: {s.TypeCount:N0} types, {s.Values.Length:N0} distinct values");
        return 0;
    }
}
