using System.Text;
using RankFreq.Primitives;

namespace RankFreq.Counting;

/// <summary>Temporary folder of spill runs, removed on dispose (success, failure or cancellation).</summary>
internal sealed class SpillSet(string? root) : IDisposable
{
    private readonly object _gate = new();
    private string? _dir;
    private int _next;
    public List<string> Phase1 { get; } = [];
    public int Runs { get { lock (_gate) return _next; } }

    public string NewPath()
    {
        lock (_gate)
        {
            if (_dir is null)
            {
                string baseDir = root ?? Path.GetTempPath();
                // spill folders of killed runs are removed by the next run that spills here
                TempNames.SweepStaleOnce(baseDir);
                _dir = TempNames.Inside(baseDir, "spill");
                TempNames.Hold(_dir);
                try { Directory.CreateDirectory(_dir); }
                catch (Exception e) { throw new CountingException($"{baseDir}: cannot create a temporary folder for spill runs ({e.Message})", e); }
            }
            return Path.Combine(_dir, $"run-{_next++:D5}.bin");
        }
    }

    /// <summary>Writes a table as a key-sorted run and clears it.</summary>
    public void Spill(TokenTable table)
    {
        if (table.Count == 0) return;
        string path = NewPath();
        try
        {
            using (var w = new RunWriter(path))
                WriteSorted(w, table, byCount: false);
        }
        catch (IOException e)
        {
            throw new CountingException($"{path}: cannot write a spill run ({e.Message}); free disk space or raise the memory "
                + "budget", e)
            { Setting = nameof(CountSettings.MemoryBytes) };
        }
        lock (_gate) Phase1.Add(path);
        table.Clear();
    }

    /// <summary>
    /// Writes every type of <paramref name="table"/> to a run in key or rank order, in one sequential pass. The table
    /// may be consumed (see <see cref="TokenTable.Sorted"/>): callers clear it afterwards.
    /// </summary>
    internal static void WriteSorted(RunWriter w, TokenTable table, bool byCount)
    {
        using var sorted = table.Sorted(byCount, consume: true);
        Span<byte> buffer = stackalloc byte[16];
        for (int i = 0; i < sorted.Length; i++)
            w.Write(sorted.KeyAt(i, buffer), sorted.CountAt(i), sorted.FirstAt(i), sorted.IdAt(i));
    }

    public void Dispose()
    {
        lock (_gate)
        {
            if (_dir is not null && Directory.Exists(_dir))
            {
                try { Directory.Delete(_dir, recursive: true); } catch (IOException) { } catch (UnauthorizedAccessException) { }
            }
            if (_dir is not null) TempNames.Release(_dir);
            _dir = null;
        }
    }
}
