namespace RankFreq.Counting;

/// <summary>
/// Adds up (token, count, id) rows from several count tables exactly, in bounded memory (spilling sorted runs past
/// the budget, as counting does), and ranks the result. Adding is associative and commutative, which is what makes
/// sharded counting plus a merge equal one run.
/// </summary>
public sealed class CountMerger : IDisposable
{
    private readonly TokenTable _table = new();
    private readonly SpillSet _spill;
    private readonly long _budget;
    private bool _ranked;

    /// <summary>A merger with a memory budget in bytes (0: the counting default) and a folder for spill runs.</summary>
    public CountMerger(long memoryBytes = 0, string? tempDirectory = null)
    {
        _budget = memoryBytes > 0 ? memoryBytes : new CountSettings().EffectiveMemory;
        _spill = new SpillSet(tempDirectory);
        _table.GrowthLimit = _budget;
    }

    /// <summary>Spill runs written so far.</summary>
    public int SpilledRuns => _spill.Runs;

    /// <summary>Adds <paramref name="count"/> occurrences of the token with UTF-8 bytes <paramref name="utf8"/>.</summary>
    public void Add(ReadOnlySpan<byte> utf8, long count, int id = -1)
    {
        _table.Add(utf8, count, 0, id);
        if (_table.OverBudget(_budget)) _spill.Spill(_table);
    }

    /// <summary>The merged rows in rank order and their spectrum; call once, after the last <see cref="Add"/>.</summary>
    public (ICountRows Rows, FrequencySpectrum Spectrum) Rank(bool withIds)
    {
        if (_ranked) throw new InvalidOperationException("a merger ranks once");
        _ranked = true;
        return RankBuilder.Build([_table], _spill, _budget, new GrowthHistogram([], null), withIds);
    }

    /// <summary>Removes the spill runs.</summary>
    public void Dispose() => _spill.Dispose();
}
