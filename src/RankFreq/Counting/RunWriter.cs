namespace RankFreq.Counting;

/// <summary>Writes records to a temporary run file (7-bit varints, keys length-prefixed).</summary>
internal sealed class RunWriter : IDisposable
{
    private readonly BinaryWriter _w;
    public string Path { get; }
    public long Records { get; private set; }

    public RunWriter(string path)
    {
        Path = path;
        _w = new BinaryWriter(new BufferedStream(new FileStream(path, FileMode.CreateNew, FileAccess.Write, FileShare.None, 1), 1 << 16));
    }

    public void Write(ReadOnlySpan<byte> key, long count, long first, int id)
    {
        _w.Write7BitEncodedInt(key.Length);
        _w.Write(key);
        _w.Write7BitEncodedInt64(count);
        _w.Write7BitEncodedInt64(first);
        _w.Write7BitEncodedInt(id + 1);
        Records++;
    }

    public void Dispose() => _w.Dispose();
}
