using RankFreq.Primitives;
using System.Buffers;
using System.Text;
using System.Text.Json;
using Parquet;
using Parquet.Schema;

namespace RankFreq.Sources;

/// <summary>Reads one work unit and writes its text to a sink: decompression, UTF-8 repair, record extraction.</summary>
public static class InputReader
{
    private const int BlockBytes = 1 << 20;

    /// <summary>
    /// Reads <paramref name="unit"/>; <paramref name="progress"/> is called with stored bytes consumed since the last call.
    /// Throws <see cref="SourceException"/> naming the file (and line or byte offset) on bad input.
    /// </summary>
    public static void Read(WorkUnit unit, SourceOptions options, ITextSink sink, SourceStats stats, Action<long>? progress, CancellationToken ct)
    {
        var f = unit.File;
        try
        {
            switch (f.Format)
            {
                case InputFormat.Parquet: ReadParquet(f, options, sink, stats, progress, ct); break;
                default: ReadStream(unit, options, sink, stats, progress, ct); break;
            }
        }
        catch (SourceException) { throw; }
        catch (OperationCanceledException) { throw; }
        catch (UnauthorizedAccessException) { throw new SourceException($"{f.Path}: permission denied"); }
        catch (FileNotFoundException) { throw new SourceException($"{f.Path}: file disappeared while reading"); }
        catch (DecoderFaultException e) // a decoder that checks its first block as it opens
        {
            throw new SourceException($"{f.Path}: corrupt or truncated {f.Compression.ToString().ToLowerInvariant()} data at the start "
                + $"({e.Message})", e);
        }
        catch (IOException e) { throw new SourceException($"{f.Path}: cannot read ({e.Message})", e); }
    }

    private static void ReadStream(WorkUnit unit, SourceOptions options, ITextSink sink, SourceStats stats, Action<long>? progress, CancellationToken ct)
    {
        var f = unit.File;
        Stream raw = f.IsStdin
            ? new PrefixStream(f.StdinPeek ?? [], Console.OpenStandardInput())
            : new FileStream(f.Path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        long start = unit.Start, end = unit.End;
        if (start > 0) raw.Seek(start, SeekOrigin.Begin);
        using var counted = new CountingStream(raw);
        using var decoded = Decompression.Open(counted, f.Compression);
        // a large compressed file is decompressed on a second thread while this one counts
        using var ahead = f.Compression != CompressionKind.None && f.Length >= options.ReadAheadAboveBytes
            ? new ReadAheadStream(decoded, BlockBytes, 4)
            : null;
        Stream text = (Stream?)ahead ?? decoded;
        var sanitizer = new Utf8Sanitizer(f.Format == InputFormat.JsonLines
            ? new JsonLinesExtractor(f.Path, options, sink, stats, unit.Start)
            : sink);
        if (unit.Start > 0) sanitizer.Write([], false); // not at file start: no BOM to skip

        byte[] buf = ArrayPool<byte>.Shared.Rent(BlockBytes);
        long pos = start, reported = 0;
        var crc = f.Compression == CompressionKind.Gzip ? new System.IO.Hashing.Crc32() : null;
        try
        {
            while (true)
            {
                ct.ThrowIfCancellationRequested();
                int n;
                try { n = text.Read(buf, 0, BlockBytes); }
                catch (DecoderFaultException e)
                {
                    throw new SourceException($"{f.Path}: corrupt or truncated {f.Compression.ToString().ToLowerInvariant()} "
                        + $"data near byte {start + counted.BytesRead} ({e.Message})", e);
                }
                if (n <= 0) break;
                var block = buf.AsSpan(0, n);
                bool last = false;
                if (end >= 0 && pos + n >= end)
                {
                    // the range ends exactly at a cut the planner chose
                    block = block[..(int)(end - pos)];
                    last = true;
                }
                pos += block.Length;
                crc?.Append(block);
                stats.TextBytes += block.Length;
                sanitizer.Write(block, false);
                long done = f.Compression == CompressionKind.None ? pos - unit.Start : counted.BytesRead;
                progress?.Invoke(done - reported);
                reported = done;
                if (last) break;
            }
            if (crc is not null) CheckGzipTrailer(f, counted, crc.GetCurrentHashAsUInt32(), pos);
            sanitizer.Write([], true);
            stats.ReplacedBytes += sanitizer.ReplacedBytes;
            stats.StoredBytes += f.Compression == CompressionKind.None ? pos - unit.Start : counted.BytesRead;
        }
        finally { ArrayPool<byte>.Shared.Return(buf); }
    }

    /// <summary>
    /// .NET's gzip decoder ends quietly on a truncated file, so the trailer (RFC 1952 §2.3.1: CRC-32 and size mod 2^32)
    /// is checked: against the whole output for a one-member file, else against the file's last member
    /// (<see cref="GzipMembers"/>). Standard input cannot be re-read, so there only one-member data can be verified.
    /// </summary>
    private static void CheckGzipTrailer(InputFile f, CountingStream raw, uint crc, long size)
    {
        var t = raw.LastBytes;
        uint tCrc = System.Buffers.Binary.BinaryPrimitives.ReadUInt32LittleEndian(t);
        uint tSize = System.Buffers.Binary.BinaryPrimitives.ReadUInt32LittleEndian(t[4..]);
        if (tCrc == crc && tSize == (uint)size) return;
        if (f.IsStdin)
        {
            throw new SourceException($"{f.Path}: gzip data on standard input is truncated, corrupt or of several members "
                + "(which can be verified only from a file); pass the file instead");
        }
        if (!GzipMembers.LastMemberVerifies(f.Path))
            throw new SourceException($"{f.Path}: truncated or corrupt gzip data (the final CRC-32/size match no complete member; {size} bytes decompressed)");
    }

    private static void ReadParquet(InputFile f, SourceOptions options, ITextSink sink, SourceStats stats, Action<long>? progress, CancellationToken ct)
    {
        using var fs = File.OpenRead(f.Path);
        ParquetReader reader;
        try
        {
            ParquetFooterCheck.ThrowIfDamaged(fs); // a damaged footer can loop the Parquet decoder for ever
            reader = ParquetReader.CreateAsync(fs, cancellationToken: ct).GetAwaiter().GetResult();
            _ = reader.Schema.GetDataFields(); // the schema is decoded when first asked for: a damaged one fails here
        }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            throw new SourceException($"{f.Path}: not a readable Parquet file ({e.Message})", e);
        }
        try
        {
            var field = reader.Schema.GetDataFields().FirstOrDefault(d => d.Name == options.TextColumn || d.Path.ToString() == options.TextColumn)
                ?? throw new SourceException($"{f.Path}: no column '{options.TextColumn}' "
                    + $"(columns: {string.Join(", ", reader.Schema.GetDataFields().Select(d => d.Name))}); use --text-column");
            if (field.ClrType != typeof(string) && field.ClrType != typeof(ReadOnlyMemory<char>))
                throw new SourceException($"{f.Path}: column '{field.Name}' holds {field.ClrType.Name}, not text");
            var bytes = new byte[4096];
            long lastPos = 0, row = 0;
            var groupKey = options.Group is { Kind: GroupKind.Column } gk ? gk : null;
            var groupField = groupKey is null ? null : ParquetGroups.Field(reader, f.Path, groupKey);
            for (int g = 0; g < reader.RowGroupCount; g++)
            {
                ct.ThrowIfCancellationRequested();
                var (values, labels) = ParquetPages.Read(f.Path, g, () =>
                {
                    using var rg = reader.OpenRowGroupReader(g);
                    var values = new string?[rg.RowCount];
                    rg.ReadAsync(field, values.AsMemory(), null, ct).GetAwaiter().GetResult();
                    return (values, groupField is null ? null : ParquetGroups.Labels(f.Path, rg, groupField, groupKey!, ct));
                });
                for (int i = 0; i < values.Length; i++)
                {
                    string? v = values[i];
                    row++;
                    stats.Records++;
                    if (v is null) { stats.MissingField++; continue; }
                    if (labels is not null)
                    {
                        if (labels[i] is not { } label)
                        {
                            if (!options.SkipBadGroupValues)
                            {
                                throw new SourceException($"{f.Path}: row {row}: column '{groupKey!.Name}' "
                                    + "holds a value that is not a number, "
                                    + $"so it cannot be binned ({groupKey.Spec}); fix it or pass --skip-bad");
                            }
                            stats.BadGroupValues++;
                            continue;
                        }
                        (sink as IGroupSink)?.BeginGroup(label);
                    }
                    int max = Encoding.UTF8.GetMaxByteCount(v.Length);
                    if (bytes.Length < max) bytes = new byte[max];
                    int n = Encoding.UTF8.GetBytes(v, bytes);
                    stats.TextBytes += n;
                    sink.Write(bytes.AsSpan(0, n), true);
                }
                progress?.Invoke(fs.Position - lastPos);
                lastPos = fs.Position;
            }
            stats.StoredBytes += f.Length;
        }
        finally { reader.DisposeAsync().AsTask().GetAwaiter().GetResult(); }
    }

    /// <summary>Newlines in the first <paramref name="offset"/> bytes of a file.</summary>
    internal static long LinesBefore(string path, long offset)
    {
        using var fs = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 1 << 16, FileOptions.SequentialScan);
        var buf = new byte[1 << 20];
        long lines = 0, left = offset;
        while (left > 0)
        {
            int n = fs.Read(buf, 0, (int)Math.Min(buf.Length, left));
            if (n <= 0) break;
            lines += buf.AsSpan(0, n).Count((byte)'\n');
            left -= n;
        }
        return lines;
    }

    /// <summary>Splits sanitized text into JSON Lines records and writes each record's text field as one document.</summary>
    private sealed class JsonLinesExtractor(string path, SourceOptions options, ITextSink sink, SourceStats stats, long rangeStart) : ITextSink
    {
        /// <summary>The file's line number of this range's line <paramref name="local"/>: the lines before a range that
        /// starts inside the file are counted only when an error needs them.</summary>
        private long FileLine(long local) => rangeStart > 0 ? LinesBefore(path, rangeStart) + local : local;

        private readonly string[] _fieldPath = options.TextField.Split('.');
        private readonly GroupKey? _group = options.Group is { Kind: GroupKind.Field } g ? g : null;

        /// <summary>Reports the record's group; false when its value cannot be binned and --skip-bad counts it instead.</summary>
        private bool Group(ReadOnlySpan<byte> line)
        {
            var type = GroupKey.FindValue(line, _group!.Path, out var raw);
            string? label = _group.LabelOfJson(type, raw, out var problem);
            if (label is null)
            {
                if (!options.SkipBadGroupValues) throw new SourceException($"{path}:{FileLine(_lineNo)}: {problem}; fix the record or pass --skip-bad");
                stats.BadGroupValues++;
                return false;
            }
            (sink as IGroupSink)?.BeginGroup(label);
            return true;
        }
        private byte[] _line = new byte[1 << 16];
        private int _lineLen;
        private long _lineNo;
        private byte[] _value = new byte[1 << 12];

        public void Write(ReadOnlySpan<byte> utf8, bool endOfDocument)
        {
            while (!utf8.IsEmpty)
            {
                int nl = utf8.IndexOf((byte)'\n');
                var part = nl < 0 ? utf8 : utf8[..nl];
                Append(part);
                if (nl < 0) break;
                Record();
                utf8 = utf8[(nl + 1)..];
            }
            if (endOfDocument && _lineLen > 0) Record();
        }

        private void Append(ReadOnlySpan<byte> part)
        {
            long need = (long)_lineLen + part.Length;
            if (need > options.MaxRecordBytes)
                throw new SourceException($"{path}:{FileLine(_lineNo + 1)}: record longer than the limit of "
                    + $"{options.MaxRecordBytes:N0} bytes")
                { Setting = nameof(SourceOptions.MaxRecordBytes) };
            if (_line.Length < need) Array.Resize(ref _line, (int)Math.Min(Math.Max(need, _line.Length * 2L), Array.MaxLength));
            part.CopyTo(_line.AsSpan(_lineLen));
            _lineLen += part.Length;
        }

        private void Record()
        {
            _lineNo++;
            var line = _line.AsSpan(0, _lineLen);
            _lineLen = 0;
            if (line.Length > 0 && line[^1] == '\r') line = line[..^1];
            if (line.Trim((byte)' ').IsEmpty) return;
            stats.Records++;
            int len;
            bool found;
            try { found = Extract(line, out len); }
            catch (Exception e) when (e is JsonException or InvalidOperationException)
            {
                if (options.Strict) throw new SourceException(StrictMessage(e, line));
                stats.MalformedRecords++;
                return;
            }
            if (!found)
            {
                // the names a record does have make "no field 'body'" easy to fix; a few records show them
                if (++stats.MissingField <= 100) NoteFields(line);
                return;
            }
            if (_group is not null && !Group(line)) return;
            sink.Write(_value.AsSpan(0, len), true);
        }

        /// <summary>"file:line:column: malformed JSON record (what)", the column counted in characters from 1, and the
        /// reader's own "LineNumber: 0 | BytePositionInLine: 1." (positions inside the one-line record) left out.</summary>
        private string StrictMessage(Exception e, ReadOnlySpan<byte> line)
        {
            string what = e.Message.Split('\n')[0];
            int cut = what.IndexOf(" LineNumber:", StringComparison.Ordinal);
            if (cut > 0) what = what[..cut].TrimEnd('.', ' ');
            string where = $"{path}:{FileLine(_lineNo)}";
            if (e is JsonException { BytePositionInLine: { } b })
                where += $":{Encoding.UTF8.GetCharCount(line[..(int)Math.Min(b, line.Length)]) + 1}";
            return $"{where}: malformed JSON record ({what})";
        }

        private void NoteFields(ReadOnlySpan<byte> json)
        {
            var r = new Utf8JsonReader(json);
            while (r.Read() && stats.FieldsSeen.Count < 30)
                if (r.TokenType == JsonTokenType.PropertyName && r.CurrentDepth == 1 && r.GetString() is { } name
                    && !stats.FieldsSeen.Contains(name))
                    stats.FieldsSeen.Add(name);
        }

        private bool Extract(ReadOnlySpan<byte> json, out int len)
        {
            len = 0;
            bool found = false;
            var r = new Utf8JsonReader(json, new JsonReaderOptions { CommentHandling = JsonCommentHandling.Disallow });
            if (!r.Read() || r.TokenType != JsonTokenType.StartObject) throw new JsonException("a record must be a JSON object");
            int level = 0;
            while (r.Read())
            {
                if (r.TokenType == JsonTokenType.PropertyName && !found && r.CurrentDepth == level + 1
                    && level < _fieldPath.Length && r.ValueTextEquals(_fieldPath[level]))
                {
                    r.Read();
                    if (level == _fieldPath.Length - 1)
                    {
                        if (r.TokenType == JsonTokenType.String)
                        {
                            int max = r.HasValueSequence ? (int)r.ValueSequence.Length : r.ValueSpan.Length;
                            if (_value.Length < max) _value = new byte[Math.Max(max, _value.Length * 2)];
                            len = r.CopyString(_value);
                            found = true;
                        }
                        else r.Skip();
                    }
                    else if (r.TokenType == JsonTokenType.StartObject) level++;
                    else r.Skip();
                }
            }
            return found;
        }
    }
}
