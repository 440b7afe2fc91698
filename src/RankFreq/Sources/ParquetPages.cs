using RankFreq.Primitives;

namespace RankFreq.Sources;

/// <summary>
/// Reads of a Parquet file's row groups. Whatever the Parquet library throws while decoding a damaged page (its own
/// exception types, the page decompressor's, Thrift's, index errors) is re-raised as a <see cref="SourceException"/>
/// naming the file and the row group: the rule <c>DecoderGuardStream</c> applies to compressed streams, so no fault is
/// recognised by guessing from exception types.
/// </summary>
public static class ParquetPages
{
    /// <summary>Runs <paramref name="read"/> (reads of row group <paramref name="rowGroup"/> only, no other work).</summary>
    public static T Read<T>(string path, int rowGroup, Func<T> read)
    {
        try { return read(); }
        catch (Exception e) when (IsFault(e)) { throw Fault(path, rowGroup, e); }
    }

    /// <summary>As <see cref="Read{T}"/>, for asynchronous reads.</summary>
    public static async Task<T> ReadAsync<T>(string path, int rowGroup, Func<Task<T>> read)
    {
        try { return await read(); }
        catch (Exception e) when (IsFault(e)) { throw Fault(path, rowGroup, e); }
    }

    private static bool IsFault(Exception e) => e is not OperationCanceledException and not RankFreqException and not OutOfMemoryException;

    private static SourceException Fault(string path, int rowGroup, Exception e) =>
        new($"{path}: damaged Parquet data in row group {rowGroup + 1} ({e.Message.Split('\n')[0].Trim()})", e);
}
