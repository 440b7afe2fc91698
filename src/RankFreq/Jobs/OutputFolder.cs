using RankFreq.Primitives;
using RankFreq.Storage;

namespace RankFreq.Jobs;

/// <summary>
/// An output folder filled under a temporary name beside its target and renamed into place at the end, so that a
/// run stopped at any moment (an error, a signal, a kill) leaves the target absent or complete, never half-written.
/// </summary>
/// <remarks>
/// When the target exists and holds nothing but files this run writes too (an earlier run's results), the two folders
/// are swapped by renames: a kill between them leaves the target absent and the old folder as a temporary, which the
/// next run removes. A target that holds anything else (the user's own files, sub-folders) is never moved away: the
/// new files are then renamed into it one by one, each rename atomic. Temporaries left by killed runs in the parent
/// folder are removed first (<see cref="TempNames.SweepStale"/>).
/// </remarks>
internal sealed class OutputFolder : IDisposable
{
    private bool _published;

    private readonly string _given;

    private OutputFolder(string given, string target, string path)
    {
        _given = given;
        Target = target;
        Path = path;
    }

    /// <summary>The folder the user named (full path).</summary>
    public string Target { get; }

    /// <summary>The temporary folder to write into.</summary>
    public string Path { get; }

    /// <summary>Creates the temporary folder beside <paramref name="dir"/> (and the parents it needs).</summary>
    public static OutputFolder Create(string dir)
    {
        string full = System.IO.Path.TrimEndingDirectorySeparator(System.IO.Path.GetFullPath(dir));
        string parent = System.IO.Path.GetDirectoryName(full) ?? full;
        string tmp = TempNames.Beside(full);
        try
        {
            Directory.CreateDirectory(parent);
            TempNames.SweepStaleOnce(parent);
            TempNames.Hold(tmp);
            Directory.CreateDirectory(tmp);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            TempNames.Release(tmp);
            throw new StorageException($"{dir}: cannot create the output folder ({e.Message})", e);
        }
        return new OutputFolder(dir, full, tmp);
    }

    /// <summary>The final path of a file written as <paramref name="name"/> in the temporary folder, under the
    /// folder as the user gave it.</summary>
    public string Final(string name) => System.IO.Path.Combine(_given, System.IO.Path.GetFileName(name));

    /// <summary>Moves the finished folder into place (see the remarks).</summary>
    public void Publish()
    {
        try
        {
            if (!Directory.Exists(Target))
            {
                Directory.Move(Path, Target);
            }
            else if (OnlyEarlierResults())
            {
                string old = TempNames.Beside(Target);
                TempNames.Hold(old);
                Directory.Move(Target, old);
                Directory.Move(Path, Target);
                TryDelete(old);
            }
            else
            {
                foreach (var f in Directory.GetFiles(Path))
                    File.Move(f, System.IO.Path.Combine(Target, System.IO.Path.GetFileName(f)), overwrite: true);
                TryDelete(Path);
            }
            _published = true;
            TempNames.Release(Path);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw new StorageException($"{Target}: cannot move the results into place ({e.Message})", e);
        }
    }

    /// <summary>Whether the existing target holds only files of the names this run writes, and is not the working folder.</summary>
    private bool OnlyEarlierResults()
    {
        string cwd = System.IO.Path.TrimEndingDirectorySeparator(Directory.GetCurrentDirectory());
        if (string.Equals(cwd, Target, StringComparison.Ordinal)) return false;
        var mine = Directory.GetFiles(Path).Select(System.IO.Path.GetFileName).ToHashSet(StringComparer.Ordinal);
        return Directory.GetFileSystemEntries(Target).All(e => File.Exists(e) && mine.Contains(System.IO.Path.GetFileName(e)));
    }

    /// <summary>Removes the temporary folder unless it was published.</summary>
    public void Dispose()
    {
        if (!_published) TryDelete(Path);
    }

    private static void TryDelete(string dir)
    {
        try { if (Directory.Exists(dir)) Directory.Delete(dir, recursive: true); }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
        TempNames.Release(dir);
    }
}
