using RankFreq.Primitives;
using System.Buffers.Binary;
using System.Text;
using ZstdSharp;

namespace RankFreq.Storage;

/// <summary>
/// Writes a flat Parquet file (no nesting) of required INT32 / INT64 columns and optional UTF-8 string columns:
/// data pages v1, PLAIN values, RLE definition levels, Zstd-compressed pages, footer key–value metadata.
/// </summary>
/// <remarks>
/// Written for count tables: in a fresh process the general-purpose writer took 0.14 s for 73,000 rows and 0.70 s
/// for a million on these machines, this one 0.03 s and 0.19 s (benchmarks: <c>write-cold</c>). Layout per the
/// Apache Parquet format specification (parquet.thrift: FileMetaData, RowGroup, ColumnChunk, ColumnMetaData,
/// PageHeader, DataPageHeader, SchemaElement) and its Thrift compact protocol encoding. Tests read its files back
/// with Parquet.Net and with ParquetSharp (the Apache Arrow C++ reader).
/// </remarks>
internal sealed class FlatParquetWriter : IDisposable
{
    private const int RowsPerPage = 1 << 16;
    private readonly Stream _out;
    private readonly IReadOnlyList<FlatColumn> _columns;
    private readonly List<RowGroupMeta> _groups = [];
    private long _pos;
    private long _rows;

    /// <summary>One page's buffers and compressor: the pages of a row group are encoded and compressed in parallel.</summary>
    private sealed class PageSlot : IDisposable
    {
        public byte[] Page = new byte[1 << 16];
        public byte[] Packed = new byte[1 << 16];
        public readonly Compressor Zstd = new(1); // level 1: count tables are written once per run and read rarely
        public int Len, Compressed;
        public void Dispose() => Zstd.Dispose();
    }

    private sealed record ChunkMeta(long Offset, long Values, long Uncompressed, long Compressed);
    private sealed record RowGroupMeta(long Rows, List<ChunkMeta> Chunks);

    public FlatParquetWriter(Stream output, IReadOnlyList<FlatColumn> columns)
    {
        _out = output;
        _columns = columns;
        Write("PAR1"u8);
    }

    /// <summary>Key–value metadata written in the footer.</summary>
    public IReadOnlyDictionary<string, string> Metadata { get; init; } = new Dictionary<string, string>();

    /// <summary>The writer name recorded in the footer.</summary>
    public string CreatedBy { get; init; } = "rankfreq";

    /// <summary>Row groups handed over and not yet written: their pages and the tasks encoding them.</summary>
    private readonly Queue<(int Rows, int PerColumn, PageSlot[] Slots, Task Work)> _inFlight = new();
    private readonly Stack<PageSlot> _free = new();

    /// <summary>Row groups encoded at once: enough that no core waits for the slowest page of one group.</summary>
    private readonly int _maxInFlight = Math.Max(2, CoreLimit.Cores + 2);

    /// <summary>A run limited to one core encodes pages on the calling thread (<see cref="CoreLimit"/>).</summary>
    private readonly bool _inline = CoreLimit.Cores < 2;

    /// <summary>
    /// Hands over one row group; <paramref name="data"/> holds, per column, a <c>string?[]</c> or
    /// <see cref="Utf8Values"/> (string columns), <c>int[]</c> or <c>long[]</c> of <paramref name="rows"/> values, which
    /// must not change until <see cref="Finish"/>. Pages are encoded and compressed on the run's cores (<see cref="CoreLimit"/>), several row groups
    /// at a time, and written in order (the same bytes as one page after another).
    /// </summary>
    public void WriteRowGroup(int rows, IReadOnlyList<object> data)
    {
        if (data.Count != _columns.Count) throw new ArgumentException("one array per column");
        if (rows == 0) return;
        int perColumn = (rows + RowsPerPage - 1) / RowsPerPage;
        var slots = new PageSlot[_columns.Count * perColumn];
        for (int j = 0; j < slots.Length; j++) slots[j] = _free.TryPop(out var s) ? s : new PageSlot();
        var columns = _columns;
        void Encode(int j)
        {
            var col = columns[j / perColumn];
            int start = j % perColumn * RowsPerPage, n = Math.Min(RowsPerPage, rows - start);
            var slot = slots[j];
            var values = data[j / perColumn];
            slot.Len = col.Type switch
            {
                FlatType.String when values is Utf8Values u => EncodeUtf8(ref slot.Page, u, start, n, col.Nullable),
                FlatType.String => EncodeStrings(ref slot.Page, (string?[])values, start, n, col.Nullable),
                FlatType.Int32 => EncodeFixed(ref slot.Page, (int[])values, start, n),
                FlatType.Int64 when col.Delta => DeltaBinaryPacked.Encode(ref slot.Page, ((long[])values).AsSpan(start, n)),
                _ => EncodeFixed(ref slot.Page, (long[])values, start, n),
            };
            Ensure(ref slot.Packed, Compressor.GetCompressBound(slot.Len));
            slot.Compressed = slot.Zstd.Wrap(slot.Page.AsSpan(0, slot.Len), slot.Packed);
        }
        var work = new Task[slots.Length];
        for (int j = 0; j < slots.Length; j++)
        {
            int page = j;
            if (_inline) { Encode(page); work[j] = Task.CompletedTask; }
            else work[j] = Task.Run(() => Encode(page));
        }
        _inFlight.Enqueue((rows, perColumn, slots, Task.WhenAll(work)));
        while (_inFlight.Count >= _maxInFlight) WriteOldest();
    }

    /// <summary>Waits for the oldest row group handed over and writes its pages, column by column.</summary>
    private void WriteOldest()
    {
        var (rows, perColumn, slots, work) = _inFlight.Dequeue();
        try
        {
            work.GetAwaiter().GetResult(); // an encoding failure surfaces here, as itself
            var chunks = new List<ChunkMeta>(_columns.Count);
            for (int c = 0; c < _columns.Count; c++)
            {
                long offset = _pos, unc = 0, comp = 0;
                for (int p = 0; p < perColumn; p++)
                {
                    var (u, z) = WritePage(slots[c * perColumn + p], Math.Min(RowsPerPage, rows - p * RowsPerPage), _columns[c]);
                    unc += u;
                    comp += z;
                }
                chunks.Add(new ChunkMeta(offset, rows, unc, comp));
            }
            _groups.Add(new RowGroupMeta(rows, chunks));
            _rows += rows;
        }
        finally
        {
            foreach (var slot in slots) _free.Push(slot);
        }
    }

    private static int EncodeFixed<T>(ref byte[] page, T[] values, int start, int n) where T : unmanaged
    {
        var src = System.Runtime.InteropServices.MemoryMarshal.AsBytes(values.AsSpan(start, n));
        Ensure(ref page, src.Length);
        src.CopyTo(page);
        return src.Length; // PLAIN: little-endian values (this library runs on little-endian machines only)
    }

    private static int EncodeStrings(ref byte[] page, string?[] values, int start, int n, bool nullable)
    {
        int pos = 0;
        if (nullable)
        {
            // definition levels: 4-byte length, then the RLE/bit-packed hybrid with runs only (bit width 1)
            Ensure(ref page, 4 + 6 * n + 16);
            int lenPos = pos;
            pos += 4;
            int i = 0;
            while (i < n)
            {
                bool present = values[start + i] is not null;
                int run = 1;
                while (i + run < n && (values[start + i + run] is not null) == present) run++;
                pos = WriteUVarint(page, pos, (ulong)run << 1);
                page[pos++] = present ? (byte)1 : (byte)0;
                i += run;
            }
            BinaryPrimitives.WriteInt32LittleEndian(page.AsSpan(lenPos), pos - lenPos - 4);
        }
        for (int i = 0; i < n; i++)
        {
            var v = values[start + i];
            if (v is null)
            {
                if (!nullable) throw new InvalidOperationException("null in a required column");
                continue;
            }
            int max = Encoding.UTF8.GetMaxByteCount(v.Length);
            Ensure(ref page, pos + 4 + max);
            int w = Encoding.UTF8.GetBytes(v, page.AsSpan(pos + 4));
            BinaryPrimitives.WriteInt32LittleEndian(page.AsSpan(pos), w);
            pos += 4 + w;
        }
        return pos;
    }

    /// <summary>A page of a string column given as UTF-8 (PLAIN: each value's length, then its bytes).</summary>
    private static int EncodeUtf8(ref byte[] page, Utf8Values values, int start, int n, bool nullable)
    {
        var t = values.Tokens;
        var isNull = values.IsNull;
        int pos = 0;
        if (nullable)
        {
            Ensure(ref page, 4 + 6 * n + 16);
            pos = 4;
            int i = 0;
            while (i < n)
            {
                bool present = isNull is null || !isNull[start + i];
                int run = 1;
                while (i + run < n && (isNull is null || !isNull[start + i + run]) == present) run++;
                pos = WriteUVarint(page, pos, (ulong)run << 1);
                page[pos++] = present ? (byte)1 : (byte)0;
                i += run;
            }
            BinaryPrimitives.WriteInt32LittleEndian(page, pos - 4);
        }
        else if (isNull is not null && Array.IndexOf(isNull, true, start, n) >= 0)
            throw new InvalidOperationException("null in a required column");
        var starts = t.Starts;
        Ensure(ref page, pos + 4 * n + (starts[start + n] - starts[start]));
        var bytes = t.Bytes;
        for (int i = start; i < start + n; i++)
        {
            if (isNull is not null && isNull[i]) continue;
            int from = starts[i], len = starts[i + 1] - from;
            BinaryPrimitives.WriteInt32LittleEndian(page.AsSpan(pos), len);
            Buffer.BlockCopy(bytes, from, page, pos + 4, len);
            pos += 4 + len;
        }
        return pos;
    }

    private (long Uncompressed, long Compressed) WritePage(PageSlot slot, int values, FlatColumn column)
    {
        int len = slot.Len, z = slot.Compressed;
        var h = new ThriftCompactWriter();
        h.I32(1, 0);            // type: DATA_PAGE
        h.I32(2, len);          // uncompressed_page_size
        h.I32(3, z);            // compressed_page_size
        h.BeginStruct(5);       // data_page_header
        h.I32(1, values);       // num_values
        h.I32(2, ValueEncoding(column)); // encoding: PLAIN or DELTA_BINARY_PACKED
        h.I32(3, 3);            // definition_level_encoding: RLE
        h.I32(4, 3);            // repetition_level_encoding: RLE
        h.EndStruct();
        h.Stop();
        var header = h.ToSpan();
        Write(header);
        Write(slot.Packed.AsSpan(0, z));
        return (header.Length + len, header.Length + z);
    }

    /// <summary>The values' encoding: DELTA_BINARY_PACKED (5) for a delta column, else PLAIN (0).</summary>
    private static int ValueEncoding(FlatColumn c) => c.Delta && c.Type == FlatType.Int64 ? 5 : 0;

    /// <summary>Writes the footer (FileMetaData, its length, the magic). Call once, after the last row group.</summary>
    public void Finish()
    {
        while (_inFlight.Count > 0) WriteOldest();
        var m = new ThriftCompactWriter();
        m.I32(1, 1);                                         // version
        m.BeginList(2, ThriftCompactWriter.Struct, _columns.Count + 1); // schema
        m.BeginElement();
        m.String(4, "schema");
        m.I32(5, _columns.Count);                            // num_children
        m.EndStruct();
        foreach (var c in _columns)
        {
            m.BeginElement();
            m.I32(1, (int)c.Type);
            m.I32(3, c.Nullable ? 1 : 0);                    // repetition_type: OPTIONAL / REQUIRED
            m.String(4, c.Name);
            if (c.Type == FlatType.String)
            {
                m.I32(6, 0);                                 // converted_type: UTF8
                m.BeginStruct(10);                           // logicalType
                m.BeginStruct(1);                            //   STRING
                m.EndStruct();
                m.EndStruct();
            }
            m.EndStruct();
        }
        m.I64(3, _rows);                                     // num_rows
        m.BeginList(4, ThriftCompactWriter.Struct, _groups.Count);
        foreach (var g in _groups)
        {
            m.BeginElement();
            m.BeginList(1, ThriftCompactWriter.Struct, g.Chunks.Count);
            long total = 0, totalComp = 0;
            for (int c = 0; c < g.Chunks.Count; c++)
            {
                var ch = g.Chunks[c];
                total += ch.Uncompressed;
                totalComp += ch.Compressed;
                m.BeginElement();
                m.I64(2, ch.Offset);                         // file_offset
                m.BeginStruct(3);                            // meta_data
                m.I32(1, (int)_columns[c].Type);
                m.BeginList(2, ThriftCompactWriter.I32Type, 2); // encodings: PLAIN or DELTA_BINARY_PACKED, RLE
                m.ListI32(ValueEncoding(_columns[c]));
                m.ListI32(3);
                m.BeginList(3, ThriftCompactWriter.Binary, 1);  // path_in_schema
                m.ListString(_columns[c].Name);
                m.I32(4, 6);                                 // codec: ZSTD
                m.I64(5, ch.Values);                         // num_values
                m.I64(6, ch.Uncompressed);                   // total_uncompressed_size
                m.I64(7, ch.Compressed);                     // total_compressed_size
                m.I64(9, ch.Offset);                         // data_page_offset
                m.EndStruct();
                m.EndStruct();
            }
            m.I64(2, total);                                 // total_byte_size
            m.I64(3, g.Rows);                                // num_rows
            if (g.Chunks.Count > 0)
            {
                m.I64(5, g.Chunks[0].Offset);                // file_offset
                m.I64(6, totalComp);                         // total_compressed_size
            }
            m.EndStruct();
        }
        if (Metadata.Count > 0)
        {
            m.BeginList(5, ThriftCompactWriter.Struct, Metadata.Count);
            foreach (var (k, v) in Metadata)
            {
                m.BeginElement();
                m.String(1, k);
                m.String(2, v);
                m.EndStruct();
            }
        }
        m.String(6, CreatedBy);
        m.Stop();
        var footer = m.ToSpan();
        Write(footer);
        Span<byte> tail = stackalloc byte[8];
        BinaryPrimitives.WriteInt32LittleEndian(tail, footer.Length);
        "PAR1"u8.CopyTo(tail[4..]);
        Write(tail);
        _out.Flush();
    }

    private void Write(ReadOnlySpan<byte> b)
    {
        _out.Write(b);
        _pos += b.Length;
    }

    /// <summary>Grows a buffer, keeping its contents.</summary>
    private static void Ensure(ref byte[] buf, int n)
    {
        if (buf.Length < n) Array.Resize(ref buf, Math.Max(n, buf.Length * 2));
    }

    internal static int WriteUVarint(byte[] buf, int pos, ulong v)
    {
        while (v >= 0x80)
        {
            buf[pos++] = (byte)(v | 0x80);
            v >>= 7;
        }
        buf[pos++] = (byte)v;
        return pos;
    }

    public void Dispose()
    {
        // row groups still being encoded (a failure or cancellation before Finish): their compressors are in use
        foreach (var (_, _, slots, work) in _inFlight)
        {
            try { work.Wait(); }
            catch (AggregateException) { } // the failure that matters has left through WriteRowGroup or Finish
            foreach (var slot in slots) slot.Dispose();
        }
        _inFlight.Clear();
        foreach (var slot in _free) slot.Dispose();
    }
}
