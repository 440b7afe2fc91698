using System.Diagnostics;
using RankFreq.Fitting;

/// <summary>Where a bootstrap replicate's time goes on a spectrum file: drawing the synthetic spectrum vs the xmin search
/// (the same samplers, tables and scratch arrays as TailFitter).</summary>
internal static class ReplicateTiming
{
    public static void Run(string file, int reps)
    {
        var pairs = File.ReadLines(file).Select(l => l.Split(',')).Select(p => (long.Parse(p[0]), long.Parse(p[1]))).ToArray();
        var v = pairs.Select(p => p.Item1).ToArray();
        var m = pairs.Select(p => p.Item2).ToArray();
        long nTypes = m.Sum();
        var pl = new TailSearch(v, m, v.Length).Search(50);
        int from = new TailSearch(v, m, v.Length).IndexOf(pl.Xmin);
        var buf = new SpectrumBuffer();
        var plan = new MultinomialPlan(v, m, 0, v.Length);
        var cells = new PowerLawCells(pl.Alpha, pl.Xmin, pl.NTail + 10 * (long)Math.Ceiling(Math.Sqrt(pl.NTail)) + 100);
        for (int round = 0; round < 2; round++) // the first round warms the JIT up
        {
            TimeSpan gen = default, search = default, cgen = default, csearch = default;
            int distinct = 0;
            for (int r = 0; r < reps; r++)
            {
                var t0 = Cpu();
                var rng = new Xoshiro(1, 1, (ulong)r);
                buf.Clear();
                long nTail = BinomialSampler.Draw(rng, nTypes, pl.NTail / (double)nTypes);
                Synthetic.Multinomial(rng, v, m, 0, from, nTypes - nTail, buf);
                Synthetic.PowerLawTail(rng, pl.Alpha, pl.Xmin, nTail, buf, cells);
                var t1 = Cpu();
                buf.NewSearch().Search(50);
                var t2 = Cpu();
                distinct += buf.Count;
                buf.Clear();
                Synthetic.Multinomial(new Xoshiro(1, 2, (ulong)r), plan, nTypes, buf);
                var t3 = Cpu();
                buf.NewSearch().Search(50);
                var t4 = Cpu();
                gen += t1 - t0; search += t2 - t1; cgen += t3 - t2; csearch += t4 - t3;
            }
            Console.WriteLine($"round {round}: per replicate (CPU ms) goodness of fit: "
                + $"draw {gen.TotalMilliseconds / reps:F2}, search {search.TotalMilliseconds / reps:F2} "
                + $"({distinct / reps:N0} distinct values); "
                + $"uncertainty: draw {cgen.TotalMilliseconds / reps:F2}, search {csearch.TotalMilliseconds / reps:F2}");
        }
    }

    private static TimeSpan Cpu() => Process.GetCurrentProcess().TotalProcessorTime;
}
