using System.Buffers.Binary;
using System.Text;
using ZstdSharp;

namespace RankFreq.Storage;

/// <summary>
/// The Thrift compact protocol, writing side, for the few shapes Parquet metadata needs: i32, i64, binary fields,
/// nested structs and lists (field headers carry the id delta when it is 1–15; integers are zigzag varints).
/// </summary>
internal sealed class ThriftCompactWriter
{
    internal const byte I32Type = 5, I64Type = 6, Binary = 8, List = 9, Struct = 12;
    private byte[] _buf = new byte[256];
    private int _len;
    private readonly short[] _last = new short[16]; // enclosing structs' last field ids (metadata nests 4 deep)
    private int _depth;
    private short _lastId;

    public ReadOnlySpan<byte> ToSpan() => _buf.AsSpan(0, _len);

    public void I32(short id, int v) { Field(id, I32Type); ZigZag(v); }
    public void I64(short id, long v) { Field(id, I64Type); ZigZag(v); }
    public void String(short id, string v) { Field(id, Binary); Bytes(v); }

    public void BeginStruct(short id)
    {
        Field(id, Struct);
        _last[_depth++] = _lastId;
        _lastId = 0;
    }

    /// <summary>Starts a struct that is a list element (no field header).</summary>
    public void BeginElement()
    {
        _last[_depth++] = _lastId;
        _lastId = 0;
    }

    public void EndStruct()
    {
        Byte(0);
        _lastId = _last[--_depth];
    }

    public void Stop() => Byte(0);

    public void BeginList(short id, byte elementType, int count)
    {
        Field(id, List);
        if (count < 15) Byte((byte)((count << 4) | elementType));
        else
        {
            Byte((byte)(0xF0 | elementType));
            UVarint((ulong)count);
        }
    }

    public void ListI32(int v) => ZigZag(v);
    public void ListString(string v) => Bytes(v);

    private void Field(short id, byte type)
    {
        int delta = id - _lastId;
        if (delta > 0 && delta <= 15) Byte((byte)((delta << 4) | type));
        else
        {
            Byte(type);
            ZigZag(id);
        }
        _lastId = id;
    }

    private void Bytes(string v)
    {
        int n = Encoding.UTF8.GetByteCount(v);
        UVarint((ulong)n);
        Grow(n);
        _len += Encoding.UTF8.GetBytes(v, _buf.AsSpan(_len));
    }

    private void ZigZag(long v) => UVarint((ulong)((v << 1) ^ (v >> 63)));

    private void UVarint(ulong v)
    {
        Grow(10);
        _len = FlatParquetWriter.WriteUVarint(_buf, _len, v);
    }

    private void Byte(byte b)
    {
        Grow(1);
        _buf[_len++] = b;
    }

    private void Grow(int n)
    {
        if (_len + n > _buf.Length) Array.Resize(ref _buf, Math.Max(_len + n, _buf.Length * 2));
    }
}
