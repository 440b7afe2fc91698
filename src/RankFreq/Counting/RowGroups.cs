namespace RankFreq.Counting;

/// <summary>Rank-table batches re-cut into row groups of a fixed size.</summary>
/// <remarks>
/// A table's readers hand out batches whose size follows the path taken (a spilled table is read back in batches
/// sized to the memory budget). Written as they come, the Parquet row groups, and so the file's bytes, would depend
/// on the budget; re-cut to <see cref="Rows"/> rows, the same rows make the same file whatever the threads, budget or
/// spills.
/// </remarks>
public static class RowGroups
{
    /// <summary>Rows per row group of a count table (the last one may be shorter).</summary>
    public const int Rows = 1 << 17;

    /// <summary>The rows of <paramref name="batches"/> (consecutive ranks) in batches of exactly
    /// <paramref name="rows"/> rows, the last one shorter.</summary>
    public static IEnumerable<CountRowBatch> Of(IEnumerable<CountRowBatch> batches, int rows = Rows)
    {
        var tokens = new List<string?>(rows);
        var counts = new List<long>(rows);
        List<int>? ids = null;
        long first = 1;
        foreach (var b in batches)
        {
            if (counts.Count == 0) first = b.FirstRank;
            if (b.TokenIds is not null) ids ??= new List<int>(rows);
            for (int i = 0; i < b.Counts.Length; i++)
            {
                tokens.Add(b.Tokens[i]);
                counts.Add(b.Counts[i]);
                if (b.TokenIds is not null) ids!.Add(b.TokenIds[i]);
                if (counts.Count < rows) continue;
                yield return Take();
                first += rows;
            }
        }
        if (counts.Count > 0) yield return Take();

        CountRowBatch Take()
        {
            var batch = new CountRowBatch(first, [.. tokens], ids?.ToArray(), [.. counts]);
            tokens.Clear();
            counts.Clear();
            ids?.Clear();
            return batch;
        }
    }
}
