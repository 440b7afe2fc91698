using System.Diagnostics;
using System.Runtime.InteropServices;
using System.Text;
using RankFreq.Primitives;
using Xunit;

namespace RankFreq.Tests.Robustness;

/// <summary>Runs only where a small tmpfs can be mounted (root with the mount capability); else skipped with the reason.</summary>
public sealed class TmpfsFactAttribute : FactAttribute
{
    public TmpfsFactAttribute()
    {
        if (OutputFaultTests.MountProbe.Value is { } why) Skip = why;
    }
}

/// <summary>Runs only where permission bits stop writes (not as root); else skipped with the reason.</summary>
public sealed partial class NonRootFactAttribute : FactAttribute
{
    [LibraryImport("libc")]
    internal static partial uint geteuid();

    public NonRootFactAttribute()
    {
        if (!OperatingSystem.IsLinux()) Skip = "permission bits as Linux applies them";
        else if (geteuid() == 0) Skip = "running as root, where a folder's permission bits do not stop writes (CI runs as root)";
    }
}

/// <summary>Disk full, unwritable folders, an existing output folder, and temporaries of other runs.</summary>
public class OutputFaultTests
{
    /// <summary>Null when a tmpfs can be mounted here, else why not.</summary>
    public static readonly Lazy<string?> MountProbe = new(() =>
    {
        if (!OperatingSystem.IsLinux()) return "tmpfs is Linux";
        string dir = Path.Combine(Path.GetTempPath(), "rankfreq-mount-probe-" + Environment.ProcessId);
        try
        {
            Directory.CreateDirectory(dir);
            var (code, err) = Run("mount", "-t", "tmpfs", "-o", "size=64k", "tmpfs", dir);
            if (code != 0) return $"cannot mount a small tmpfs here to fill the disk ({err.Trim()})";
            Run("umount", dir);
            return null;
        }
        catch (Exception e) when (e is System.ComponentModel.Win32Exception or IOException)
        {
            return $"cannot mount a small tmpfs here to fill the disk ({e.Message})";
        }
        finally { try { Directory.Delete(dir); } catch (IOException) { } }
    });

    private static (int Code, string Err) Run(string exe, params string[] args)
    {
        var psi = new ProcessStartInfo(exe) { RedirectStandardError = true, RedirectStandardOutput = true };
        foreach (var a in args) psi.ArgumentList.Add(a);
        using var p = Process.Start(psi)!;
        string err = p.StandardError.ReadToEnd();
        p.StandardOutput.ReadToEnd();
        p.WaitForExit();
        return (p.ExitCode, err);
    }

    /// <summary>A corpus of many distinct tokens, so its count table is far larger than the tmpfs.</summary>
    private static string WideCorpus(TempDir d)
    {
        var rng = new Random(5);
        var sb = new StringBuilder();
        for (int i = 0; i < 150000; i++) sb.Append('w').Append(rng.Next(1_000_000_000)).Append(i % 12 == 11 ? '\n' : ' ');
        File.WriteAllText(d["wide.txt"], sb.ToString());
        return d["wide.txt"];
    }

    [TmpfsFact]
    public void DiskFullIsOneLineExitOneAndNothingPartial()
    {
        using var d = new TempDir();
        string corpus = WideCorpus(d);
        string mnt = d["full"];
        Directory.CreateDirectory(mnt);
        var (mc, me) = Run("mount", "-t", "tmpfs", "-o", "size=64k", "tmpfs", mnt);
        Assert.True(mc == 0, me);
        try
        {
            foreach (var args in new[]
            {
                new[] { "count", corpus, "-o", Path.Combine(mnt, "t.parquet"), "-q" },
                ["profile", corpus, "-o", Path.Combine(mnt, "p"), "-q", "--reps", "0", "--ci-reps", "0", "--alternatives", "none"],
                // spill runs that do not fit: the table goes elsewhere, the spill folder is on the full disk
                ["count", corpus, "-o", d["t2.parquet"], "-q", "--memory", "1M", "--threads", "1", "--temp-dir", mnt],
            })
            {
                var (code, _, err) = Cli.Run(args);
                var lines = err.Trim().Split('\n');
                Assert.True(code == 1, $"{string.Join(' ', args)}: exit {code}: {err}");
                Assert.Single(lines);
                Assert.Contains("rankfreq: error: ", lines[0]);
                Assert.Contains(mnt, lines[0]); // names the place that could not be written
                Assert.Contains("space", lines[0], StringComparison.OrdinalIgnoreCase); // ENOSPC's own text: No space left on device
                Assert.Empty(Directory.GetFileSystemEntries(mnt)); // nothing partial, no temporaries
                Assert.False(File.Exists(d["t2.parquet"]));
            }
        }
        finally { Run("umount", mnt); }
    }

    [NonRootFact]
    public void UnwritableFolderIsOneLineExitOne()
    {
        if (!OperatingSystem.IsLinux()) return; // the attribute has skipped it already; this tells the analyzer
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two three three three\n");
        string locked = d["locked"];
        Directory.CreateDirectory(locked);
        File.SetUnixFileMode(locked, UnixFileMode.UserRead | UnixFileMode.UserExecute);
        try
        {
            foreach (var args in new[]
            {
                new[] { "count", d["a.txt"], "-o", Path.Combine(locked, "t.parquet"), "-q" },
                ["profile", d["a.txt"], "-o", Path.Combine(locked, "p"), "-q", "--reps", "0", "--ci-reps", "0"],
                ["profile", d["a.txt"], "-o", Path.Combine(locked, "deeper", "p"), "-q", "--reps", "0", "--ci-reps", "0"],
            })
            {
                var (code, _, err) = Cli.Run(args);
                Assert.True(code == 1, $"exit {code}: {err}");
                Assert.Single(err.Trim().Split('\n'));
                Assert.Contains(locked, err);
                Assert.Empty(Directory.GetFileSystemEntries(locked));
            }
        }
        finally { File.SetUnixFileMode(locked, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute); }
    }

    [Fact]
    public void AnExistingOutputFolderKeepsTheUsersOwnFiles()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "one two two three three three four four four four\n");
        string outDir = d["out"];
        Directory.CreateDirectory(outDir);
        File.WriteAllText(Path.Combine(outDir, "notes.txt"), "mine");
        var (code, _, err) = Cli.Run("profile", d["a.txt"], "-o", outDir, "-q", "--reps", "0", "--ci-reps", "0");
        Assert.True(code == 0, err);
        Assert.Equal("mine", File.ReadAllText(Path.Combine(outDir, "notes.txt")));
        Assert.True(File.Exists(Path.Combine(outDir, "report.html")));
        // a second run over its own earlier results replaces them whole (the folders are swapped)
        (code, _, err) = Cli.Run("profile", d["a.txt"], "-o", d["own"], "-q", "--reps", "0", "--ci-reps", "0");
        Assert.True(code == 0, err);
        var first = File.GetLastWriteTimeUtc(Path.Combine(d["own"], "summary.json"));
        (code, _, err) = Cli.Run("profile", d["a.txt"], "-o", d["own"], "-q", "--reps", "0", "--ci-reps", "0");
        Assert.True(code == 0, err);
        Assert.True(File.GetLastWriteTimeUtc(Path.Combine(d["own"], "summary.json")) >= first);
        Assert.Empty(Directory.GetFileSystemEntries(d.Path, "*rankfreq-tmp*"));
    }

    [Fact]
    public void TheSweepRemovesOnlyTemporariesOfRunsThatAreGone()
    {
        using var d = new TempDir();
        File.WriteAllText(d["a.txt"], "alpha beta beta\n");
        string host = System.Text.RegularExpressions.Regex.Replace(Environment.MachineName, "[^A-Za-z0-9-]", "-");
        // a pid no process has (a reused pid would only keep the temporary for a day)
        int deadPid = FreePid();
        string guid() => Guid.NewGuid().ToString("N");
        string dead = d[$".t.parquet.{TempNames.Marker}.{host}.{deadPid}.{guid()}"];
        string deadFolder = d[$".p.{TempNames.Marker}.{host}.{deadPid}.{guid()}"];
        string live = d[$".t.parquet.{TempNames.Marker}.{host}.{Environment.ProcessId}.{guid()}"];
        string otherHost = d[$".t.parquet.{TempNames.Marker}.elsewhere-node7.{deadPid}.{guid()}"];
        string oldOther = d[$".u.parquet.{TempNames.Marker}.elsewhere-node7.{deadPid}.{guid()}"];
        string notOurs = d[".t.parquet.something-else.tmp"];
        foreach (var f in new[] { dead, live, otherHost, oldOther, notOurs }) File.WriteAllText(f, "partial");
        Directory.CreateDirectory(deadFolder);
        File.WriteAllText(Path.Combine(deadFolder, "counts.parquet"), "partial");
        File.SetLastWriteTimeUtc(oldOther, DateTime.UtcNow - TempNames.StaleAge - TimeSpan.FromHours(1));

        // in a child process, as a real next run: this test process is a live run writing into the same folder
        var psi = new ProcessStartInfo(Path.Combine(AppContext.BaseDirectory, "rankfreq"), ["count", d["a.txt"], "-o", d["t.parquet"], "-q"])
        { RedirectStandardError = true };
        using var p = Process.Start(psi)!;
        string err = p.StandardError.ReadToEnd();
        p.WaitForExit();
        Assert.True(p.ExitCode == 0, err);
        Assert.False(File.Exists(dead), "a dead run's temporary file stays");
        Assert.False(Directory.Exists(deadFolder), "a dead run's temporary folder stays");
        Assert.False(File.Exists(oldOther), "a day-old temporary of another host stays");
        Assert.True(File.Exists(live), "a live run's temporary was removed");
        Assert.True(File.Exists(otherHost), "another host's recent temporary was removed");
        Assert.True(File.Exists(notOurs), "a file that is not ours was removed");
    }

    private static int FreePid()
    {
        for (int pid = 4_000_000; pid > 100_000; pid -= 7919)
            if (!Directory.Exists($"/proc/{pid}")) return pid;
        return 4_194_000;
    }
}
