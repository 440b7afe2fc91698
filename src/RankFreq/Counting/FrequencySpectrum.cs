namespace RankFreq.Counting;

/// <summary>
/// The frequency spectrum: <c>Types[i]</c> types occur exactly <c>Values[i]</c> times; values strictly increasing.
/// Every statistic downstream works on these (value, multiplicity) pairs, never one value per type.
/// </summary>
public sealed record FrequencySpectrum(long[] Values, long[] Types)
{
    /// <summary>Number of types (Σ multiplicities).</summary>
    public long TypeCount { get; } = Types.Sum();

    /// <summary>Number of tokens (Σ value × multiplicity).</summary>
    public long TokenCount { get; } = Values.Zip(Types, (v, m) => checked(v * m)).Sum();

    /// <summary>Builds a spectrum from (value, multiplicity) pairs in any order; equal values are added up.</summary>
    public static FrequencySpectrum FromPairs(IEnumerable<(long Value, long Types)> pairs)
    {
        var b = new SpectrumBuilder();
        foreach (var (v, m) in pairs) b.Add(v, m);
        return b.Build();
    }

    /// <summary>Equal when the (value, multiplicity) pairs are equal.</summary>
    public bool Equals(FrequencySpectrum? other) =>
        other is not null && Values.AsSpan().SequenceEqual(other.Values) && Types.AsSpan().SequenceEqual(other.Types);

    /// <inheritdoc/>
    public override int GetHashCode() => HashCode.Combine(Values.Length, TypeCount, TokenCount);

    /// <summary>
    /// Builds a spectrum from one count per type in rank order (counts not increasing): one pass over runs of equal
    /// counts. Counts in any other order are accepted too (through <see cref="FromCounts"/>).
    /// </summary>
    public static FrequencySpectrum FromRankedCounts(long[] counts)
    {
        var values = new List<long>();
        var types = new List<long>();
        for (int i = 0; i < counts.Length;)
        {
            long c = counts[i];
            int j = i + 1;
            while (j < counts.Length && counts[j] == c) j++;
            if (j < counts.Length && counts[j] > c) return FromCounts(counts);
            values.Add(c);
            types.Add(j - i);
            i = j;
        }
        values.Reverse();
        types.Reverse();
        return FromPairs(values.Zip(types));
    }

    /// <summary>Builds a spectrum from one count per type.</summary>
    public static FrequencySpectrum FromCounts(IEnumerable<long> counts) => FromPairs(counts.Select(c => (c, 1L)));
}
