using System.Globalization;
using Parquet;
using Parquet.Schema;
using RankFreq.Counting;
using RankFreq.Sources;

namespace RankFreq.Storage;

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
            var (tokens, ids, counts) = ParquetPages.Read(Path, g, () =>
            {
                using var rg = _r.OpenRowGroupReader(g);
                var tokens = new string?[rg.RowCount];
                var counts = new long[rg.RowCount];
                int[]? ids = _id is null ? null : new int[rg.RowCount];
                rg.ReadAsync(_token, tokens.AsMemory()).AsTask().GetAwaiter().GetResult();
                rg.ReadAsync<long>(_count, counts.AsMemory()).AsTask().GetAwaiter().GetResult();
                if (ids is not null) rg.ReadAsync<int>(_id!, ids.AsMemory()).AsTask().GetAwaiter().GetResult();
                return (tokens, ids, counts);
            });
            yield return new CountRowBatch(rank, tokens, ids, counts);
            rank += counts.Length;
        }
    }

    /// <summary>The frequency spectrum of the table's counts.</summary>
    public FrequencySpectrum ReadSpectrum()
    {
        var spectrum = new SpectrumBuilder();
        foreach (var b in Batches())
            foreach (var c in b.Counts)
            {
                if (c <= 0) throw new StorageException($"{Path}: count column holds a non-positive count ({c})");
                spectrum.Add(c);
            }
        return spectrum.Build();
    }

    /// <inheritdoc/>
    public ValueTask DisposeAsync() => _r.DisposeAsync();
    /// <inheritdoc/>
    public void Dispose() => _r.DisposeAsync().AsTask().GetAwaiter().GetResult();
}
