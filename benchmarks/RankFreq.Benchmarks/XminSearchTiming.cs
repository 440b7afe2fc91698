using System.Diagnostics;
using RankFreq.Fitting;

/// <summary>Times the phases of the xmin search on a spectrum file: the α fits alone, the pruned search, the full scan.</summary>
internal static class XminSearchTiming
{
    /// <summary>Process CPU time (the machine is shared: wall time says little), restartable.</summary>
    private sealed class Cpu
    {
        private TimeSpan _t0 = Now;
        private static TimeSpan Now => Process.GetCurrentProcess().TotalProcessorTime;
        public void Restart() => _t0 = Now;
        public TimeSpan Elapsed => Now - _t0;
    }

    public static void Run(string file, bool full)
    {
        var pairs = File.ReadLines(file).Select(l => l.Split(',')).Select(p => (long.Parse(p[0]), long.Parse(p[1]))).ToArray();
        var v = pairs.Select(p => p.Item1).ToArray();
        var m = pairs.Select(p => p.Item2).ToArray();
        var s = new TailSearch(v, m, v.Length);
        var sw = new Cpu();
        double warm = 2; int fits = 0;
        long tail = 0;
        for (int i = v.Length - 1; i >= 0 && tail < 50; i--) tail += m[i];
        for (int i = 0; i < v.Length - 2; i++) { var f = s.FitAt(i, warm); if (f.Status == FitStatus.Ok) warm = f.Alpha; fits++; }
        Console.WriteLine($"{v.Length:N0} values: {fits:N0} α fits {sw.Elapsed.TotalSeconds:F3} s CPU");
        if (Environment.GetEnvironmentVariable("XMIN_TRACE") == "1")
            for (int i = 0; i < v.Length - 2; i++) { var f = s.FitAt(i); Console.Write($"{i}:{f.Alpha:F3} "); Console.Write($"{s.Ks(i, f.Alpha):F4} "); }
        sw.Restart();
        var r = s.Search(50);
        Console.WriteLine($"pruned search {sw.Elapsed.TotalSeconds:F3} s CPU: xmin {r.Xmin} α {r.Alpha:R} D {r.KsDistance:R} {r.Status}");
        if (!full) return;
        sw.Restart();
        r = s.SearchFullScan(50);
        Console.WriteLine($"full scan     {sw.Elapsed.TotalSeconds:F3} s CPU: xmin {r.Xmin} α {r.Alpha:R} D {r.KsDistance:R} {r.Status}");
    }
}
