namespace RankFreq.Counting;

/// <summary>Reads a run file back one record at a time.</summary>
internal sealed class RunReader : IDisposable
{
    private readonly BinaryReader _r;
    private readonly long _length;
    public RunRecord? Current { get; private set; }

    public RunReader(string path)
    {
        var fs = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        _length = fs.Length;
        _r = new BinaryReader(fs);
        MoveNext();
    }

    public bool MoveNext()
    {
        if (_r.BaseStream.Position >= _length) { Current = null; return false; }
        int len = _r.Read7BitEncodedInt();
        var key = _r.ReadBytes(len);
        long count = _r.Read7BitEncodedInt64();
        long first = _r.Read7BitEncodedInt64();
        int id = _r.Read7BitEncodedInt() - 1;
        Current = new RunRecord(key, count, first, id);
        return true;
    }

    public void Dispose() => _r.Dispose();
}
