using System.CommandLine;
using RankFreq.Counting;
using RankFreq.Sources;

namespace RankFreq.Cli;

internal static class Human
{
    public static string Bytes(long b) => b switch
    {
        >= 1L << 30 => $"{b / (double)(1L << 30):F2} GiB",
        >= 1L << 20 => $"{b / (double)(1L << 20):F1} MiB",
        >= 1L << 10 => $"{b / 1024.0:F1} KiB",
        _ => $"{b} B",
    };

    /// <summary>"0:42", "12:05", "1:02:09".</summary>
    public static string Duration(TimeSpan t) => t.TotalHours >= 1
        ? $"{(int)t.TotalHours}:{t.Minutes:00}:{t.Seconds:00}"
        : $"{t.Minutes}:{t.Seconds:00}";

    /// <summary>"1 table", "3 tables".</summary>
    public static string Count(long n, string noun) => n == 1 ? $"1 {noun}" : $"{n:N0} {noun}s";
}
