using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Jobs;

/// <summary>
/// Counts a corpus with the default words tokenizer, fits the tail (point fit) and writes the tail's spectrum
/// (x ≥ xmin) as "value,types" lines with a "# xmin=…" header: the input of the alternatives reference script
/// (tests/RankFreq.Tests/Data/alternatives_reference.py). Also prints the alternatives as fitted here.
/// </summary>
internal static class TailSpectrum
{
    public static void Run(string corpus, string output)
    {
        using var r = CountJob.Count([corpus], new CountSettings());
        var s = r.Spectrum;
        Console.WriteLine($"counted: {s.Values.Length} distinct values");
        using (var w = new StreamWriter(output + ".full")) for (int i = 0; i < s.Values.Length; i++) w.WriteLine($"{s.Values[i]},{s.Types[i]}");
        var sw = System.Diagnostics.Stopwatch.StartNew();
        var f = TailFitter.Fit(s, new FitOptions(Reps: 0, CiReps: 0, Alternatives: []));
        Console.WriteLine($"power law {sw.Elapsed.TotalSeconds:F2} s");
        foreach (var name in Alternatives.Names)
        {
            sw.Restart();
            var one = TailFitter.Fit(s, new FitOptions(Reps: 0, CiReps: 0, Alternatives: [name]));
            Console.WriteLine($"{name} {sw.Elapsed.TotalSeconds:F2} s");
            f = f with { Alternatives = [.. f.Alternatives, .. one.Alternatives] };
        }
        var pl = f.PowerLaw;
        using (var w = new StreamWriter(output))
        {
            w.WriteLine($"# xmin={pl.Xmin} n_tail={pl.NTail} alpha={pl.Alpha:R}");
            for (int i = 0; i < s.Values.Length; i++)
                if (s.Values[i] >= pl.Xmin) w.WriteLine($"{s.Values[i]},{s.Types[i]}");
        }
        Console.WriteLine($"{corpus}: xmin {pl.Xmin}, n_tail {pl.NTail}, α {pl.Alpha:R} ({pl.Status})");
        foreach (var a in f.Alternatives)
            Console.WriteLine($"  {a.Name,-20} llr {a.Llr,12:G8} R {a.NormalizedLlr,9:F4} p {a.P:F4} {a.Status} "
                + string.Join(" ", a.Parameters.Select(kv => $"{kv.Key}={kv.Value:R}")) + " " + a.Message);
    }
}
