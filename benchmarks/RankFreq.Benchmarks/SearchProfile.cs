using System.Diagnostics;
using RankFreq.Fitting;

/// <summary>
/// Where the xmin search of a goodness-of-fit replicate spends its time: the same replicate spectra (drawn once, seed 1)
/// searched whole, then their candidates' α fits alone and their KS distances alone (no give-up), in CPU time.
/// </summary>
internal static class SearchProfile
{
    public static void Run(string file, int reps)
    {
        var pairs = File.ReadLines(file).Select(l => l.Split(',')).Select(p => (long.Parse(p[0]), long.Parse(p[1]))).ToArray();
        var v = pairs.Select(p => p.Item1).ToArray();
        var m = pairs.Select(p => p.Item2).ToArray();
        long nTypes = m.Sum();
        var root = new TailSearch(v, m, v.Length);
        var pl = root.Search(50);
        int from = root.IndexOf(pl.Xmin);
        var spectra = new List<(long[] V, long[] M)>();
        var drawCpu = Cpu();
        for (int r = 0; r < reps; r++)
        {
            var rng = new Xoshiro(1, 1, (ulong)r);
            var buf = new SpectrumBuffer();
            long nTail = BinomialSampler.Draw(rng, nTypes, pl.NTail / (double)nTypes);
            Synthetic.Multinomial(rng, v, m, 0, from, nTypes - nTail, buf);
            Synthetic.PowerLawTail(rng, pl.Alpha, pl.Xmin, nTail, buf);
            spectra.Add((buf.Values[..buf.Count], buf.Mult[..buf.Count]));
        }
        double draw = (Cpu() - drawCpu).TotalMilliseconds / reps;
        for (int round = 0; round < 2; round++)
        {
            var t0 = Cpu();
            double sumD = 0;
            foreach (var (sv, sm) in spectra) sumD += new TailSearch(sv, sm, sv.Length).Search(50).KsDistance;
            var t1 = Cpu();
            long cands = 0;
            var alphas = new List<double[]>();
            foreach (var (sv, sm) in spectra)
            {
                var s = new TailSearch(sv, sm, sv.Length);
                var a = new double[Math.Max(0, sv.Length - 2)];
                double warm = 2;
                for (int i = 0; i < a.Length; i++) { var f = s.FitAt(i, warm); a[i] = f.Alpha; if (f.Status == FitStatus.Ok) warm = f.Alpha; }
                alphas.Add(a);
                cands += a.Length;
            }
            var t2 = Cpu();
            double sumKs = 0;
            for (int k = 0; k < spectra.Count; k++)
            {
                var (sv, sm) = spectra[k];
                var s = new TailSearch(sv, sm, sv.Length);
                var a = alphas[k];
                for (int i = 0; i < a.Length; i++) if (double.IsFinite(a[i])) sumKs += s.Ks(i, a[i]);
            }
            var t3 = Cpu();
            Console.WriteLine($"round {round}: per replicate CPU ms: draw {draw:F2}, search {(t1 - t0).TotalMilliseconds / reps:F2}, "
                + $"all α fits {(t2 - t1).TotalMilliseconds / reps:F2}, all KS {(t3 - t2).TotalMilliseconds / reps:F2}; "
                + $"{cands / reps:N0} candidates; checksum {sumD:R}");
        }
    }

    private static TimeSpan Cpu() => Process.GetCurrentProcess().TotalProcessorTime;
}
