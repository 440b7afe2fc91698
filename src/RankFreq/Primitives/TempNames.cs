using System.Collections.Concurrent;
using System.Text.RegularExpressions;

namespace RankFreq.Primitives;

/// <summary>
/// Names of temporary files and folders (a table being written, an output folder being filled, spill runs), a
/// register of the ones this process holds, and the sweep that removes those a killed run left behind.
/// </summary>
/// <remarks>
/// A temporary's name carries the host and process id that made it: <c>.NAME.rankfreq-tmp.HOST.PID.GUID</c> beside its
/// target. A sweep removes an entry only when it is ours by name and either its process is gone (same host, no such
/// pid) or it is older than <see cref="StaleAge"/>; so runs going on at the same time, on this machine or on another
/// one writing into the same shared folder, keep their temporaries.
/// </remarks>
public static partial class TempNames
{
    /// <summary>The part of every temporary name that marks it as this tool's.</summary>
    public const string Marker = "rankfreq-tmp";

    /// <summary>Past this age a temporary is removed whatever its pid says (a pid may have been reused).</summary>
    public static readonly TimeSpan StaleAge = TimeSpan.FromHours(24);

    private static readonly string Host = SafeHost();
    private static readonly ConcurrentDictionary<string, byte> Held = new(StringComparer.Ordinal);
    private static readonly ConcurrentDictionary<string, byte> Swept = new(StringComparer.Ordinal);
    private static int closing;

    /// <summary>A fresh temporary path beside <paramref name="target"/> (a file or a folder), not yet created.</summary>
    public static string Beside(string target)
    {
        string full = Path.TrimEndingDirectorySeparator(Path.GetFullPath(target));
        string dir = Path.GetDirectoryName(full)!;
        return Path.Combine(dir, $".{Path.GetFileName(full)}.{Marker}.{Host}.{Environment.ProcessId}.{Guid.NewGuid():N}");
    }

    /// <summary>A fresh temporary folder name inside <paramref name="root"/> (for spill runs), not yet created.</summary>
    public static string Inside(string root, string what) =>
        Path.Combine(root, $".{what}.{Marker}.{Host}.{Environment.ProcessId}.{Guid.NewGuid():N}");

    /// <summary>
    /// The path a user should see for <paramref name="path"/>: a file inside a temporary output folder is named
    /// under the folder it will be renamed to (<c>.out.rankfreq-tmp.H.P.G/x</c> is shown as <c>out/x</c>).
    /// </summary>
    public static string Shown(string path)
    {
        string? dir = Path.GetDirectoryName(path);
        if (dir is null) return path;
        string folder = Path.GetFileName(dir);
        if (!NamePattern().IsMatch(folder)) return path;
        string name = folder[1..folder.LastIndexOf($".{Marker}.", StringComparison.Ordinal)];
        return Path.Combine(Path.GetDirectoryName(dir) ?? "", name, Path.GetFileName(path));
    }

    /// <summary>Notes that this process holds <paramref name="path"/>, so an abrupt exit can remove it.</summary>
    /// <exception cref="OperationCanceledException">The process is removing its temporaries to exit
    /// (<see cref="RemoveHeld"/>): nothing new may be made.</exception>
    public static void Hold(string path)
    {
        Held.TryAdd(path, 0); // takes a lock: a full fence before the flag is read
        if (Volatile.Read(ref closing) != 0)
        {
            Held.TryRemove(path, out _);
            throw new OperationCanceledException("the process is stopping");
        }
    }

    /// <summary>Notes that <paramref name="path"/> was renamed into place or removed.</summary>
    public static void Release(string path) => Held.TryRemove(path, out _);

    /// <summary>
    /// Removes every temporary this process still holds (files and folders); for an exit that cannot wait for the
    /// work to unwind (a second signal, or work that does not stop in time). Returns how many were removed.
    /// </summary>
    /// <remarks>
    /// The work is still running while this runs. Nothing new is held from here on (<see cref="Hold"/> throws); a
    /// folder is first renamed to a fresh temporary name, so a file the work writes into it after that fails instead
    /// of keeping the folder from being removed; a second pass takes what a write in flight made meanwhile.
    /// </remarks>
    public static int RemoveHeld()
    {
        Interlocked.Exchange(ref closing, 1);
        int n = 0;
        for (int pass = 0; pass < 2; pass++)
        {
            if (pass > 0) Thread.Sleep(20);
            foreach (var p in Held.Keys)
            {
                string gone = p;
                if (Directory.Exists(p))
                {
                    string moved = Beside(p);
                    Held.TryAdd(moved, 0);
                    try { Directory.Move(p, moved); gone = moved; }
                    catch (Exception e) when (e is IOException or UnauthorizedAccessException) { Held.TryRemove(moved, out _); }
                    if (gone == moved) Held.TryRemove(p, out _);
                }
                // an entry not made yet stays held: the second pass removes it if a write in flight makes it
                if (TryRemove(gone)) { n++; Held.TryRemove(gone, out _); }
            }
        }
        return n;
    }

    /// <summary>The temporaries this process holds now (for tests).</summary>
    public static IReadOnlyCollection<string> HeldNow => Held.Keys.ToList();

    /// <summary>
    /// Removes the temporaries in <paramref name="folder"/> that a run which no longer exists left behind (see the
    /// remarks of <see cref="TempNames"/>); a folder that cannot be listed is left alone. Returns how many were removed.
    /// </summary>
    public static int SweepStale(string folder)
    {
        string[] entries;
        try { entries = Directory.Exists(folder) ? Directory.GetFileSystemEntries(folder, $".*.{Marker}.*") : []; }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { return 0; }
        int n = 0;
        foreach (var path in entries)
            if (IsStale(path) && TryRemove(path)) n++;
        return n;
    }

    /// <summary><see cref="SweepStale"/> the first time this process writes into <paramref name="folder"/>.</summary>
    public static void SweepStaleOnce(string folder)
    {
        if (Swept.TryAdd(Path.GetFullPath(folder), 0)) SweepStale(folder);
    }

    /// <summary>Whether <paramref name="path"/> is a temporary of a run that is gone (see <see cref="SweepStale"/>).</summary>
    public static bool IsStale(string path)
    {
        var m = NamePattern().Match(Path.GetFileName(path));
        if (!m.Success) return false;
        int pid = int.Parse(m.Groups["pid"].Value, System.Globalization.CultureInfo.InvariantCulture);
        if (m.Groups["host"].Value == Host && pid == Environment.ProcessId) return false;
        try
        {
            var age = DateTime.UtcNow - (Directory.Exists(path) ? Directory.GetLastWriteTimeUtc(path) : File.GetLastWriteTimeUtc(path));
            if (age > StaleAge) return true;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { return false; }
        return m.Groups["host"].Value == Host && !ProcessAlive(pid);
    }

    private static bool ProcessAlive(int pid)
    {
        // /proc answers without the cost (and the exceptions) of opening a process handle; elsewhere ask the runtime
        if (Directory.Exists("/proc/self")) return Directory.Exists($"/proc/{pid}");
        try
        {
            using var p = System.Diagnostics.Process.GetProcessById(pid);
            return !p.HasExited;
        }
        catch (Exception e) when (e is ArgumentException or InvalidOperationException) { return false; }
    }

    private static bool TryRemove(string path)
    {
        try
        {
            if (Directory.Exists(path)) Directory.Delete(path, recursive: true);
            else if (File.Exists(path)) File.Delete(path);
            else return false;
            return true;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException) { return false; }
    }

    private static string SafeHost()
    {
        string h;
        try { h = Environment.MachineName; }
        catch (InvalidOperationException) { h = "host"; }
        h = Regex.Replace(h, "[^A-Za-z0-9-]", "-");
        return h.Length == 0 ? "host" : h;
    }

    [GeneratedRegex(@"^\..*\.rankfreq-tmp\.(?<host>[A-Za-z0-9-]+)\.(?<pid>[0-9]{1,9})\.[0-9a-f]{32}$")]
    private static partial Regex NamePattern();
}
