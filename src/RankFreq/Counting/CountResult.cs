using RankFreq.Sources;

namespace RankFreq.Counting;

/// <summary>The outcome of counting: summary, rank table, spectrum and observed growth. Dispose removes temporary files.</summary>
public sealed class CountResult(CountSummary summary, ICountRows rows, FrequencySpectrum spectrum, GrowthCurve growth, bool hasTokenIds) : IDisposable
{
    /// <summary>What the run did.</summary>
    public CountSummary Summary => summary;
    /// <summary>The rank table.</summary>
    public ICountRows Rows => rows;
    /// <summary>The frequency spectrum of the counts.</summary>
    public FrequencySpectrum Spectrum => spectrum;
    /// <summary>Vocabulary growth in corpus order.</summary>
    public GrowthCurve Growth => growth;
    /// <summary>Whether rows carry vocabulary ids.</summary>
    public bool HasTokenIds => hasTokenIds;
    /// <inheritdoc/>
    public void Dispose() => rows.Dispose();
}
