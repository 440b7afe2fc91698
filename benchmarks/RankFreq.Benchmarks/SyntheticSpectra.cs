using RankFreq.Counting;
using RankFreq.Fitting;

namespace RankFreq.Benchmarks;

/// <summary>Synthetic frequency spectra for the fitting benchmarks.</summary>
internal static class SyntheticSpectra
{
    /// <summary>A spectrum of <paramref name="types"/> types drawn from a discrete power law with α = 2, xmin = 1.</summary>
    public static FrequencySpectrum PowerLaw(long types, ulong seed = 1)
    {
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(seed), 2.0, 1, types, buf);
        return new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
    }
}
