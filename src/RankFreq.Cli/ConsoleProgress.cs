using System.CommandLine;
using RankFreq.Counting;
using RankFreq.Sources;

namespace RankFreq.Cli;

/// <summary>Progress on stderr: a rewritten line on a terminal, a plain line every 10 s otherwise, nothing when quiet.</summary>
internal sealed class ConsoleProgress(TextWriter err, bool quiet) : IProgress<CountProgress>
{
    private readonly bool _tty = !Console.IsErrorRedirected;
    private DateTime _last = DateTime.MinValue;
    private bool _drew;

    public void Report(CountProgress p)
    {
        if (quiet) return;
        if (!_tty && DateTime.UtcNow - _last < TimeSpan.FromSeconds(10)) return;
        if (p.Elapsed < TimeSpan.FromSeconds(1)) return;
        _last = DateTime.UtcNow;
        double rate = p.Tokens / Math.Max(0.001, p.Elapsed.TotalSeconds);
        string left = "";
        if (p.TotalBytes > 0 && p.DoneBytes > 0)
        {
            double frac = Math.Min(1, p.DoneBytes / (double)p.TotalBytes);
            var remain = TimeSpan.FromSeconds(p.Elapsed.TotalSeconds * (1 - frac) / Math.Max(frac, 1e-9));
            left = $"  {frac:P0} of {Human.Bytes(p.TotalBytes)}, about {Human.Duration(remain)} left";
        }
        string line = $"counting: {Human.Bytes(p.DoneBytes)} read, {rate / 1e6:F1} M tokens/s, {Human.Duration(p.Elapsed)} elapsed{left}";
        lock (this)
        {
            if (_tty) { err.Write("\r" + line.PadRight(96)); _drew = true; }
            else err.WriteLine(line);
        }
    }

    public void Done()
    {
        lock (this) if (_drew) { err.Write("\r" + new string(' ', 96) + "\r"); _drew = false; }
    }
}
