using System.Text;
using RankFreq.Fitting;

namespace RankFreq.Tests.Comparison;

/// <summary>
/// Invented demo data: logbook entries of the ferry crews of an imaginary archipelago ("Vellmar isles"), one JSON
/// object a line with a crew, a year and the entry's text. Words are made-up syllable strings drawn from Zipf-like
/// distributions (exponent of the rank law given per crew), so each crew's tail can be fitted.
/// </summary>
internal static class ContrastDemo
{
    private static readonly string[] Syllables = ["ka", "lo", "mir", "ven", "tas", "ul", "dre", "ko", "sa", "nim", "or", "phe", "ril", "ta", "zu", "bel"];

    public static string Word(int rank)
    {
        var sb = new StringBuilder();
        int r = rank + 1;
        while (r > 0) { sb.Append(Syllables[r % Syllables.Length]); r /= Syllables.Length; }
        return sb.ToString();
    }

    /// <summary>A word of a Zipf-like law over <paramref name="vocabulary"/> ranks with rank exponent <paramref name="s"/>.</summary>
    private static int Rank(Xoshiro rng, double[] cdf)
    {
        double u = rng.NextDouble();
        int lo = 0, hi = cdf.Length - 1;
        while (lo < hi) { int mid = (lo + hi) / 2; if (cdf[mid] < u) lo = mid + 1; else hi = mid; }
        return lo;
    }

    private static double[] Cdf(int vocabulary, double s)
    {
        var c = new double[vocabulary];
        double sum = 0;
        for (int i = 0; i < vocabulary; i++) { sum += Math.Pow(i + 1, -s); c[i] = sum; }
        for (int i = 0; i < vocabulary; i++) c[i] /= sum;
        return c;
    }

    /// <summary>Entries as JSON lines: (crew, year, words per entry, entries, Zipf exponent), seeded.</summary>
    public static List<string> Lines(ulong seed, params (string Crew, int Year, int Entries, double S)[] crews)
    {
        var rng = new Xoshiro(seed);
        var lines = new List<string>();
        foreach (var (crew, year, entries, s) in crews)
        {
            var cdf = Cdf(4000, s);
            for (int e = 0; e < entries; e++)
            {
                var words = Enumerable.Range(0, 60).Select(_ => Word(Rank(rng, cdf)));
                lines.Add($"{{\"crew\": \"{crew}\", \"year\": {year + e % 7}, \"log\": {{\"text\": \"{string.Join(' ', words)}\"}}}}");
            }
        }
        return lines;
    }
}
