using System.CommandLine;
using System.Globalization;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Storage;

namespace RankFreq.Cli;

internal sealed class FitConsoleProgress(TextWriter err, bool quiet) : IProgress<FitProgress>
{
    private readonly bool _tty = !Console.IsErrorRedirected;
    private DateTime _last = DateTime.UtcNow;
    private bool _drew;

    public void Report(FitProgress p)
    {
        if (quiet) return;
        var now = DateTime.UtcNow;
        if (now - _last < TimeSpan.FromSeconds(_tty ? 0.25 : 10)) return;
        _last = now;
        lock (this)
        {
            string line = $"{p.Stage}: {p.Done:N0} of {p.Total:N0} replicates";
            if (_tty) { err.Write("\r" + line.PadRight(60)); _drew = true; } else err.WriteLine(line);
        }
    }

    public void Done()
    {
        lock (this) if (_drew) { err.Write("\r" + new string(' ', 60) + "\r"); _drew = false; }
    }
}
