using System.Diagnostics;
using RankFreq.Fitting;

/// <summary>
/// CPU time of each alternative family's fit on a spectrum file's KS-chosen tail, with the Newton fit's iterations and
/// the curvature statistic of the lognormal (second round, after the JIT has warmed up).
/// </summary>
internal static class AlternativesProfile
{
    public static void Run(string file)
    {
        var pairs = File.ReadLines(file).Select(l => l.Split(',')).Select(p => (long.Parse(p[0]), long.Parse(p[1]))).ToArray();
        var v = pairs.Select(p => p.Item1).ToArray();
        var m = pairs.Select(p => p.Item2).ToArray();
        var s = new TailSearch(v, m, v.Length);
        var pl = s.Search(50);
        int from = s.IndexOf(pl.Xmin);
        Console.WriteLine($"xmin {pl.Xmin}, α {pl.Alpha:R}, tail {pl.NTail:N0} points over {v.Length - from:N0} values");
        for (int round = 0; round < 2; round++)
            foreach (var name in Alternatives.Names)
            {
                var t0 = Process.GetCurrentProcess().TotalProcessorTime;
                var a = Alternatives.Compare(v, m, from, v.Length, pl, [name]).Single();
                var t1 = Process.GetCurrentProcess().TotalProcessorTime;
                if (round == 1)
                    Console.WriteLine($"{name}: {(t1 - t0).TotalMilliseconds:F0} ms CPU, {FitStatusNames.Of(a.Status)}, ll {a.LogLikelihood:R}, "
                        + string.Join(", ", a.Parameters.Select(kv => $"{kv.Key} {kv.Value:R}")) + $" {a.Message}");
            }
        var tv = v[from..]; var tm = m[from..];
        var tail = new Alternatives.LognormalTail(tv, tm, pl.Xmin);
        double n = tm.Sum(), mu0 = 0, s0 = 0, mean = 0;
        for (int i = 0; i < tv.Length; i++) { mu0 += tm[i] * Math.Log(tv[i]); mean += tm[i] * (double)tv[i]; }
        mu0 /= n; mean /= n;
        for (int i = 0; i < tv.Length; i++) s0 += tm[i] * Math.Pow(Math.Log(tv[i]) - mu0, 2);
        s0 = Math.Sqrt(Math.Max(s0 / n, 1e-4));
        double k0 = 0.5 / (s0 * s0);
        var nt = Newton2.Minimize((e, k) => Alternatives.LognormalNllNatural(tail, e, k), mu0 * 2 * k0, k0, 0.5e-6);
        Console.WriteLine(nt is { } r ? $"lognormal Newton: {r.Iterations} iterations, μ {r.X0 / (2 * r.X1):R}, σ {Math.Sqrt(0.5 / r.X1):R}, "
            + $"z {Alternatives.LognormalCurvatureZ(tail, Math.Sqrt(0.5 / r.X1)):G3}" : "lognormal Newton: no convergence");
        var nw = Newton2.Minimize((w, v) => Alternatives.WeibullNllSlope(tv, tm, pl.Xmin, w, v),
            -0.5 * Math.Log(mean) + Math.Log(0.5), Math.Log(0.5), Math.Log(1e-4), 1e-12);
        Console.WriteLine(nw is { } w
            ? $"Weibull Newton: {w.Iterations} iterations, λ {Math.Exp(w.X0 - w.X1):R}, β {Math.Exp(w.X1):R}"
            : "Weibull Newton: no convergence");
    }
}
