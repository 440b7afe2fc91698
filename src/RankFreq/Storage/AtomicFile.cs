using RankFreq.Primitives;

namespace RankFreq.Storage;

/// <summary>
/// Writes a file through a temporary file in the target folder and renames it into place, so an interrupted
/// run never leaves a partial file under the final name.
/// </summary>
public static class AtomicFile
{
    /// <summary>Runs <paramref name="write"/> on a temporary file beside <paramref name="path"/>, then renames it.</summary>
    public static async Task WriteAsync(string path, Func<Stream, Task> write)
    {
        string full = Path.GetFullPath(path);
        string dir = Path.GetDirectoryName(full)!;
        if (!Directory.Exists(dir)) throw new StorageException($"{path}: folder {dir} does not exist");
        // a run killed earlier may have left its temporary here; the next run writing to this folder removes it
        TempNames.SweepStaleOnce(dir);
        string tmp = TempNames.Beside(full);
        TempNames.Hold(tmp);
        try
        {
            await using (var fs = new FileStream(tmp, FileMode.CreateNew, FileAccess.ReadWrite, FileShare.None, 1 << 16))
            {
                await write(fs);
                await fs.FlushAsync();
            }
            File.Move(tmp, full, overwrite: true);
            TempNames.Release(tmp);
        }
        catch (Exception e) when (e is UnauthorizedAccessException or IOException)
        {
            TryDelete(tmp);
            // the system's message names the temporary, which the user never sees
            string why = e.Message.Replace($" : '{tmp}'", "", StringComparison.Ordinal).Replace(tmp, TempNames.Shown(full), StringComparison.Ordinal);
            throw new StorageException($"{TempNames.Shown(path)}: cannot write ({why})", e);
        }
        catch
        {
            TryDelete(tmp);
            throw;
        }
    }

    /// <summary>Writes text atomically.</summary>
    public static Task WriteTextAsync(string path, string text) =>
        WriteAsync(path, async s => { var b = System.Text.Encoding.UTF8.GetBytes(text); await s.WriteAsync(b); });

    /// <summary>Writes bytes atomically.</summary>
    public static Task WriteBytesAsync(string path, byte[] bytes) => WriteAsync(path, async s => await s.WriteAsync(bytes));

    private static void TryDelete(string p)
    {
        try { if (File.Exists(p)) File.Delete(p); } catch (IOException) { } catch (UnauthorizedAccessException) { }
        TempNames.Release(p);
    }
}
