using System.Diagnostics;
using RankFreq.Fitting;

/// <summary>
/// One part of the bootstrap replicates alone, for a profiler (perf) to look at: `gof-draw`, `gof-search`, `gof-level`
/// (the goodness-of-fit replicate's question alone: is its distance at or above the data's), `ci-draw` or
/// `ci-search` on a spectrum file, seed 1. Search parts draw their spectra first (outside the timed loop); every
/// part runs twice, or ROUNDS times (the first round warms the JIT up), and prints CPU ms per replicate.
/// </summary>
internal static class ReplicateLoop
{
    public static void Run(string file, int reps, string part, int rounds = 2)
    {
        var pairs = File.ReadLines(file).Select(l => l.Split(',')).Select(p => (long.Parse(p[0]), long.Parse(p[1]))).ToArray();
        var v = pairs.Select(p => p.Item1).ToArray();
        var m = pairs.Select(p => p.Item2).ToArray();
        long nTypes = m.Sum();
        var root = new TailSearch(v, m, v.Length);
        var pl = root.Search(50);
        int from = root.IndexOf(pl.Xmin);
        bool gof = part.StartsWith("gof", StringComparison.Ordinal);
        var buf = new SpectrumBuffer();
        var plan = new MultinomialPlan(v, m, 0, v.Length);
        var cells = new PowerLawCells(pl.Alpha, pl.Xmin, pl.NTail + 10 * (long)Math.Ceiling(Math.Sqrt(pl.NTail)) + 100);
        void Draw(int r)
        {
            buf.Clear();
            if (gof)
            {
                var rng = new Xoshiro(1, 1, (ulong)r);
                long nTail = BinomialSampler.Draw(rng, nTypes, pl.NTail / (double)nTypes);
                Synthetic.Multinomial(rng, v, m, 0, from, nTypes - nTail, buf);
                Synthetic.PowerLawTail(rng, pl.Alpha, pl.Xmin, nTail, buf, cells);
            }
            else Synthetic.Multinomial(new Xoshiro(1, 2, (ulong)r), plan, nTypes, buf);
        }
        var spectra = new List<(long[] V, long[] M)>();
        if (part.EndsWith("search", StringComparison.Ordinal) || part == "gof-level")
            for (int r = 0; r < reps; r++) { Draw(r); spectra.Add((buf.Values[..buf.Count], buf.Mult[..buf.Count])); }
        for (int round = 0; round < rounds; round++)
        {
            var t0 = Process.GetCurrentProcess().TotalProcessorTime;
            double check = 0;
            if (spectra.Count > 0 && part == "gof-level")
                foreach (var (sv, sm) in spectra)
                {
                    var s = new TailSearch(sv, sm, sv.Length, buf.Search);
                    check += (int)s.ReachesLevel(50, pl.Xmin, pl.KsDistance);
                }
            else if (spectra.Count > 0)
                foreach (var (sv, sm) in spectra) check += new TailSearch(sv, sm, sv.Length, buf.Search).Search(50, 0, pl.Xmin).Alpha;
            else
                for (int r = 0; r < reps; r++) { Draw(r); check += buf.Count; }
            var t1 = Process.GetCurrentProcess().TotalProcessorTime;
            Console.WriteLine($"round {round}: {part} {(t1 - t0).TotalMilliseconds / reps:F3} CPU ms per replicate; checksum {check:R}");
        }
    }
}
