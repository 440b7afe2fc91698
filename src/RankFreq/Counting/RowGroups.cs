namespace RankFreq.Counting;

/// <summary>Rank-table batches re-cut into row groups of a fixed size.</summary>
/// <remarks>
/// A table's readers hand out batches whose size follows the path taken (a spilled table is read back in batches
/// sized to the memory budget). Written as they come, the Parquet row groups, and so the file's bytes, would depend
/// on the budget; re-cut to <see cref="Rows"/> rows, the same rows make the same file whatever the threads, budget or
/// spills. A batch that is a whole row group already is passed on as it is; UTF-8 tokens stay UTF-8.
/// </remarks>
public static class RowGroups
{
    /// <summary>Rows per row group of a count table (the last one may be shorter).</summary>
    public const int Rows = 1 << 17;

    /// <summary>The rows of <paramref name="batches"/> (consecutive ranks) in batches of exactly
    /// <paramref name="rows"/> rows, the last one shorter.</summary>
    public static IEnumerable<CountRowBatch> Of(IEnumerable<CountRowBatch> batches, int rows = Rows)
    {
        // pieces (batch, start, length) of the row group being gathered
        var pieces = new List<(CountRowBatch Batch, int Start, int Length)>();
        int pending = 0;
        foreach (var b in batches)
        {
            int at = 0, n = b.Counts.Length;
            if (pending == 0 && n == rows)
            {
                yield return b;
                continue;
            }
            while (at < n)
            {
                int take = Math.Min(rows - pending, n - at);
                pieces.Add((b, at, take));
                pending += take;
                at += take;
                if (pending < rows) continue;
                yield return Join(pieces);
                pieces.Clear();
                pending = 0;
            }
        }
        if (pending > 0) yield return Join(pieces);
    }

    /// <summary>The pieces as one batch: UTF-8 tokens when every piece has them, strings otherwise.</summary>
    private static CountRowBatch Join(List<(CountRowBatch Batch, int Start, int Length)> pieces)
    {
        int n = pieces.Sum(p => p.Length);
        long first = pieces[0].Batch.FirstRank + pieces[0].Start;
        var counts = new long[n];
        int[]? ids = pieces[0].Batch.TokenIds is null ? null : new int[n];
        int at = 0;
        foreach (var (b, s, len) in pieces)
        {
            Array.Copy(b.Counts, s, counts, at, len);
            if (ids is not null) Array.Copy(b.TokenIds!, s, ids, at, len);
            at += len;
        }
        if (pieces.All(p => p.Batch.Utf8 is not null))
        {
            long bytes = 0;
            foreach (var (b, s, len) in pieces) bytes += b.Utf8!.Starts[s + len] - b.Utf8.Starts[s];
            var all = new byte[checked((int)bytes)];
            var starts = new int[n + 1];
            int row = 0, pos = 0;
            foreach (var (b, s, len) in pieces)
            {
                var u = b.Utf8!;
                int from = u.Starts[s];
                for (int i = 0; i < len; i++) starts[row++] = u.Starts[s + i] - from + pos;
                int size = u.Starts[s + len] - from;
                Array.Copy(u.Bytes, from, all, pos, size);
                pos += size;
            }
            starts[n] = pos;
            return new CountRowBatch(first, new Utf8Tokens(all, starts), ids, counts);
        }
        var tokens = new string?[n];
        at = 0;
        foreach (var (b, s, len) in pieces)
        {
            Array.Copy(b.Tokens, s, tokens, at, len);
            at += len;
        }
        return new CountRowBatch(first, tokens, ids, counts);
    }
}
