using System.Diagnostics;
using RankFreq.Fitting;

namespace RankFreq.Cli;

/// <summary>Bootstrap progress on stderr: replicates done, time elapsed and an estimate of the time left in the
/// stage (from its rate so far); a rewritten line on a terminal, a plain line every 10 s otherwise.</summary>
internal sealed class FitConsoleProgress(TextWriter err, bool quiet) : IProgress<FitProgress>
{
    private readonly bool _tty = !Console.IsErrorRedirected;
    private readonly Stopwatch _total = Stopwatch.StartNew();
    private DateTime _last = DateTime.UtcNow;
    private string? _stage;
    private TimeSpan _stageStart;
    private int _stageFrom;
    private bool _drew;

    public void Report(FitProgress p)
    {
        if (quiet) return;
        lock (this)
        {
            // the first report of a stage comes after some replicates: the rate is measured from there on
            if (p.Stage != _stage) { _stage = p.Stage; _stageStart = _total.Elapsed; _stageFrom = p.Done; }
            var now = DateTime.UtcNow;
            if (now - _last < TimeSpan.FromSeconds(_tty ? 0.25 : 10)) return;
            _last = now;
            string line = Line(p, _total.Elapsed, _total.Elapsed - _stageStart, _stageFrom);
            if (_tty) err.Write("\r" + line.PadRight(78)); else err.WriteLine(line);
            _drew |= _tty;
        }
    }

    /// <summary>"goodness of fit: 640 of 2,500 replicates, 0:12 elapsed, about 0:35 left": the time left at the rate
    /// of the replicates done in <paramref name="inStage"/> since <paramref name="from"/> were done.</summary>
    internal static string Line(FitProgress p, TimeSpan elapsed, TimeSpan inStage, int from)
    {
        string line = $"{p.Stage}: {p.Done:N0} of {p.Total:N0} replicates, {Human.Duration(elapsed)} elapsed";
        if (p.Done > from && p.Total > p.Done && inStage > TimeSpan.Zero)
            line += $", about {Human.Duration(inStage * ((p.Total - p.Done) / (double)(p.Done - from)))} left";
        return line;
    }

    public void Done()
    {
        lock (this) if (_drew) { err.Write("\r" + new string(' ', 78) + "\r"); _drew = false; }
    }
}
