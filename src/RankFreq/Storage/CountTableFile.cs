using System.Globalization;
using Parquet;
using Parquet.Schema;
using RankFreq.Counting;

namespace RankFreq.Storage;

/// <summary>Footer metadata of a count table (keys under the prefix <c>rankfreq.</c>).</summary>
public sealed record CountTableMetadata(
    string Tokenizer,
    string Normalization,
    string CaseRule,
    long Tokens,
    long Types,
    IReadOnlyList<InputInfo> Inputs,
    string ToolVersion,
    DateTime CreatedUtc,
    long RedactedBelow)
{
    /// <summary>The version of this library.</summary>
    public static string CurrentVersion => typeof(CountTableMetadata).Assembly.GetName().Version?.ToString(3) ?? "0";

    /// <summary>The metadata of a table written now from a counting run.</summary>
    public static CountTableMetadata From(CountSummary s, long redactBelow) =>
        new(s.TokenizerSpec, s.Normalization, s.CaseRule, s.Tokens, s.Types, s.Inputs, CurrentVersion, DateTime.UtcNow, redactBelow);

    internal Dictionary<string, string> ToFooter() => new()
    {
        ["rankfreq.tokenizer"] = Tokenizer,
        ["rankfreq.normalization"] = Normalization,
        ["rankfreq.case"] = CaseRule,
        ["rankfreq.tokens"] = Tokens.ToString(CultureInfo.InvariantCulture),
        ["rankfreq.types"] = Types.ToString(CultureInfo.InvariantCulture),
        ["rankfreq.inputs"] = InputsJson(),
        ["rankfreq.version"] = ToolVersion,
        ["rankfreq.created_utc"] = CreatedUtc.ToString("yyyy-MM-ddTHH:mm:ssZ", CultureInfo.InvariantCulture),
        ["rankfreq.redacted_below"] = RedactedBelow.ToString(CultureInfo.InvariantCulture),
    };

    /// <summary>The inputs as a JSON array of {path, bytes}, written directly (no reflection-based serializer on this path).</summary>
    private string InputsJson()
    {
        var buf = new System.Buffers.ArrayBufferWriter<byte>();
        using (var w = new System.Text.Json.Utf8JsonWriter(buf))
        {
            w.WriteStartArray();
            foreach (var i in Inputs)
            {
                w.WriteStartObject();
                w.WriteString("path", i.Path);
                w.WriteNumber("bytes", i.Bytes);
                w.WriteEndObject();
            }
            w.WriteEndArray();
        }
        return System.Text.Encoding.UTF8.GetString(buf.WrittenSpan);
    }

    internal static CountTableMetadata FromFooter(IReadOnlyDictionary<string, string> f, string path)
    {
        string Get(string k) => f.TryGetValue("rankfreq." + k, out var v) ? v : throw new StorageException($"{path}: not a RankFreq count table (footer key rankfreq.{k} missing)");
        var inputs = new List<InputInfo>();
        if (f.TryGetValue("rankfreq.inputs", out var js))
            using (var doc = System.Text.Json.JsonDocument.Parse(js))
                foreach (var e in doc.RootElement.EnumerateArray())
                    inputs.Add(new InputInfo(e.GetProperty("path").GetString() ?? "", e.GetProperty("bytes").GetInt64()));
        return new CountTableMetadata(Get("tokenizer"), Get("normalization"), Get("case"),
            long.Parse(Get("tokens"), CultureInfo.InvariantCulture), long.Parse(Get("types"), CultureInfo.InvariantCulture), inputs,
            f.GetValueOrDefault("rankfreq.version", "?"),
            DateTime.Parse(f.GetValueOrDefault("rankfreq.created_utc", "2000-01-01T00:00:00Z"), CultureInfo.InvariantCulture, DateTimeStyles.AdjustToUniversal | DateTimeStyles.AssumeUniversal),
            long.Parse(f.GetValueOrDefault("rankfreq.redacted_below", "0"), CultureInfo.InvariantCulture));
    }
}

/// <summary>
/// Reads and writes count tables: columns token, token_id (subword only), count, rank; Zstd pages; row groups of 1M
/// rows. Written by <see cref="FlatParquetWriter"/> (fast for tables of millions of rows), read with Parquet.Net.
/// </summary>
public static class CountTableFile
{

    /// <summary>
    /// Writes <paramref name="rows"/> atomically. Token strings of types with count below <c>meta.RedactedBelow</c>
    /// are written as null; counts and ranks are kept, so the spectrum and every fit are unchanged.
    /// </summary>
    public static Task WriteAsync(string path, ICountRows rows, bool hasIds, CountTableMetadata meta, CancellationToken ct = default) =>
        AtomicFile.WriteAsync(path, stream =>
        {
            var columns = new List<FlatColumn> { new("token", FlatType.String, Nullable: true) };
            if (hasIds) columns.Add(new("token_id", FlatType.Int32));
            columns.Add(new("count", FlatType.Int64));
            columns.Add(new("rank", FlatType.Int64));
            using var w = new FlatParquetWriter(stream, columns) { Metadata = meta.ToFooter(), CreatedBy = $"rankfreq {meta.ToolVersion}" };
            foreach (var b in rows.Batches())
            {
                ct.ThrowIfCancellationRequested();
                w.WriteRowGroup(b.Counts.Length, BatchColumns(b, hasIds, meta.RedactedBelow));
            }
            w.Finish();
            return Task.CompletedTask;
        });

    /// <summary>The token (redacted below <paramref name="redactBelow"/>), token_id, count and rank columns of a batch.</summary>
    internal static List<Array> BatchColumns(CountRowBatch b, bool hasIds, long redactBelow)
    {
        var tokens = b.Tokens;
        if (redactBelow > 1)
        {
            tokens = (string?[])tokens.Clone();
            for (int i = 0; i < tokens.Length; i++) if (b.Counts[i] < redactBelow) tokens[i] = null;
        }
        var ranks = new long[b.Counts.Length];
        for (int i = 0; i < ranks.Length; i++) ranks[i] = b.FirstRank + i;
        var data = new List<Array> { tokens };
        if (hasIds) data.Add(b.TokenIds ?? throw new InvalidOperationException("ids missing"));
        data.Add(b.Counts);
        data.Add(ranks);
        return data;
    }

    /// <summary>Opens a count table; throws <see cref="StorageException"/> if it is not one.</summary>
    public static async Task<CountTableReader> OpenAsync(string path, CancellationToken ct = default)
    {
        if (!File.Exists(path)) throw new StorageException($"{path}: no such file");
        ParquetReader r;
        try { r = await ParquetReader.CreateAsync(path, cancellationToken: ct); }
        catch (Exception e) when (e is not OperationCanceledException)
        {
            throw new StorageException($"{path}: not a Parquet file ({e.Message.Split('\n')[0]})", e);
        }
        var meta = CountTableMetadata.FromFooter(r.CustomMetadata, path);
        var df = r.Schema.GetDataFields();
        var count = df.FirstOrDefault(f => f.Name == "count" && f.ClrType == typeof(long));
        var token = df.FirstOrDefault(f => f.Name == "token" && (f.ClrType == typeof(string) || f.ClrType == typeof(ReadOnlyMemory<char>)));
        var id = df.FirstOrDefault(f => f.Name == "token_id" && f.ClrType == typeof(int));
        if (count is null || token is null) { await r.DisposeAsync(); throw new StorageException($"{path}: not a count table (needs columns token and count)"); }
        return new CountTableReader(path, r, meta, token, id, count);
    }
}

/// <summary>An open count table, read row group by row group.</summary>
public sealed class CountTableReader : IAsyncDisposable, ICountRows
{
    private readonly ParquetReader _r;
    private readonly DataField _token, _count;
    private readonly DataField? _id;

    internal CountTableReader(string path, ParquetReader r, CountTableMetadata meta, DataField token, DataField? id, DataField count)
    {
        Path = path; _r = r; Metadata = meta; _token = token; _id = id; _count = count;
    }

    /// <summary>The file.</summary>
    public string Path { get; }
    /// <summary>Footer metadata.</summary>
    public CountTableMetadata Metadata { get; }
    /// <summary>Whether rows carry vocabulary ids.</summary>
    public bool HasTokenIds => _id is not null;
    /// <inheritdoc/>
    public bool Repeatable => true;

    /// <inheritdoc/>
    public IEnumerable<CountRowBatch> Batches(int batchSize = 1 << 20)
    {
        long rank = 1;
        for (int g = 0; g < _r.RowGroupCount; g++)
        {
            using var rg = _r.OpenRowGroupReader(g);
            var tokens = new string?[rg.RowCount];
            var counts = new long[rg.RowCount];
            int[]? ids = _id is null ? null : new int[rg.RowCount];
            rg.ReadAsync(_token, tokens.AsMemory()).AsTask().GetAwaiter().GetResult();
            rg.ReadAsync<long>(_count, counts.AsMemory()).AsTask().GetAwaiter().GetResult();
            if (ids is not null) rg.ReadAsync<int>(_id!, ids.AsMemory()).AsTask().GetAwaiter().GetResult();
            yield return new CountRowBatch(rank, tokens, ids, counts);
            rank += counts.Length;
        }
    }

    /// <summary>The frequency spectrum of the table's counts.</summary>
    public FrequencySpectrum ReadSpectrum()
    {
        var d = new Dictionary<long, long>();
        foreach (var b in Batches())
            foreach (var c in b.Counts)
            {
                if (c <= 0) throw new StorageException($"{Path}: count column holds a non-positive count ({c})");
                d[c] = d.GetValueOrDefault(c) + 1;
            }
        return FrequencySpectrum.FromPairs(d.Select(kv => (kv.Key, kv.Value)));
    }

    /// <inheritdoc/>
    public ValueTask DisposeAsync() => _r.DisposeAsync();
    /// <inheritdoc/>
    public void Dispose() => _r.DisposeAsync().AsTask().GetAwaiter().GetResult();
}
