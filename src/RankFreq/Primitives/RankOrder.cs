namespace RankFreq.Primitives;

/// <summary>
/// The one rank order of every count table: count descending, ties broken by the token's UTF-8 bytes in ordinal
/// order, so that a table's row order (and so its file) is deterministic. Rank 1 is the most frequent type.
/// </summary>
public static class RankOrder
{
    /// <summary>Negative when (countA, keyA) ranks before (countB, keyB).</summary>
    public static int Compare(long countA, ReadOnlySpan<byte> keyA, long countB, ReadOnlySpan<byte> keyB)
    {
        int c = countB.CompareTo(countA);
        return c != 0 ? c : keyA.SequenceCompareTo(keyB);
    }
}
