namespace RankFreq.Counting;

/// <summary>
/// The one way a <see cref="FrequencySpectrum"/> is built: add (value, types) in any order; a run of equal values
/// (as from rank-ordered counts) is added up before it touches the table, so sorted input costs O(1) a row.
/// </summary>
public sealed class SpectrumBuilder
{
    private readonly Dictionary<long, long> _types = [];
    private long _runValue = -1, _runTypes;

    /// <summary>Adds <paramref name="types"/> types that occur <paramref name="value"/> times each.</summary>
    public void Add(long value, long types = 1)
    {
        if (value == _runValue) { _runTypes = checked(_runTypes + types); return; }
        Flush();
        _runValue = value;
        _runTypes = types;
    }

    /// <summary>The spectrum of everything added, values increasing, zero multiplicities left out.</summary>
    public FrequencySpectrum Build()
    {
        Flush();
        var values = _types.Where(kv => kv.Value != 0).Select(kv => kv.Key).ToArray();
        Array.Sort(values);
        return new FrequencySpectrum(values, values.Select(v => _types[v]).ToArray());
    }

    private void Flush()
    {
        if (_runTypes != 0) _types[_runValue] = checked(_types.GetValueOrDefault(_runValue) + _runTypes);
        _runValue = -1;
        _runTypes = 0;
    }
}
