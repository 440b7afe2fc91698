using System.Diagnostics;
using System.Text.Json;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Jobs;
using RankFreq.Lexical;
using Xunit;

namespace RankFreq.Tests.Demo;

/// <summary>
/// Runs only where python3 is on PATH. Without it the test reports itself skipped with the reason; under CI=true it
/// is not skipped, so a missing interpreter fails the run instead of passing unnoticed.
/// </summary>
public sealed class PythonFactAttribute : FactAttribute
{
    public PythonFactAttribute()
    {
        if (DemoCorpusTests.Python is null && !Corpora.InCi)
            Skip = "python3 is not on PATH: this test regenerates the demo corpus with corpora-demo/generate.py";
    }
}

/// <summary>
/// The committed demo corpus (corpora-demo/corpus, made by corpora-demo/generate.py) has the properties its README
/// promises: a power-law tail that starts in the tens and holds a real share of the types, tail exponents of the three
/// sets in the designed order, a planted rise of richness over the years, more subword pieces per word in the set
/// built from unusual syllables, and byte-identical regeneration.
/// </summary>
public class DemoCorpusTests
{
    /// <summary>The sets in the designed order of their Pitman–Yor discount d, hence of their exponent α.</summary>
    private static readonly string[] Sets = ["bulletins", "letters", "tales"];

    private static string Corpus => Path.Combine(Repo.Root, "corpora-demo", "corpus");
    private static string SetFile(string set) => Path.Combine(Corpus, set + ".jsonl");

    internal static string? Python =>
        (Environment.GetEnvironmentVariable("PATH") ?? "").Split(Path.PathSeparator).Where(p => p.Length > 0)
            .Select(p => Path.Combine(p, "python3")).FirstOrDefault(File.Exists);

    private static FrequencySpectrum Spectrum(params string[] inputs)
    {
        using var r = CountJob.Count(inputs, new CountSettings());
        return r.Spectrum;
    }

    private static (long Tokens, long Types) Totals(string input, string tokenizer)
    {
        using var r = CountJob.Count([input], new CountSettings(Tokenizer: tokenizer));
        return (r.Summary.Tokens, r.Summary.Types);
    }

    // no bootstrap: xmin and α of the observed data only, with a fixed seed, so the test is fast and repeatable
    private static PowerLawFit Fit(FrequencySpectrum s)
    {
        var f = TailFitter.Fit(s, new FitOptions(Reps: 0, CiReps: 0, Seed: 1, Alternatives: [])).PowerLaw;
        Assert.True(f.Status == FitStatus.Ok, f.Message);
        return f;
    }

    [Fact]
    public void CorpusFolderHoldsOnlyTheSetsAsJsonLines()
    {
        // the quick start profiles this folder: documentation or code beside the corpus would be counted as text
        var files = Directory.GetFiles(Corpus).Select(Path.GetFileName).Order(StringComparer.Ordinal).ToArray();
        Assert.Equal(Sets.Select(s => s + ".jsonl").Order(StringComparer.Ordinal), files);
        Assert.Empty(Directory.GetDirectories(Corpus));
    }

    [Fact]
    public void WholeCorpusTailStartsInTheTensAndCoversAShareOfTypes()
    {
        // Clauset, Shalizi & Newman (2009, SIAM Review 51:661) choose xmin by the KS criterion; on real corpora it
        // lands in the tens with a tail of a tenth or more of the types (the King James Bible in RANKFREQ_CORPORA: xmin 32,
        // 13% of types, measured with this tool). The demo is built to behave alike: bursts bend the spectrum below
        // a few times the mean burst size (8), so xmin in [10, 99] and a tail of at least 5% of types.
        var s = Spectrum(Corpus);
        var f = Fit(s);
        Assert.InRange(f.Xmin, 10, 99);
        Assert.True(f.NTail >= 0.05 * s.TypeCount, $"tail {f.NTail} of {s.TypeCount} types");
        // a Pitman–Yor tail with discounts 0.45–0.75 (α ≈ 1 + d, Pitman 2006, Combinatorial Stochastic Processes,
        // from memory) measured at this size: between 1.5 and 2.2
        Assert.InRange(f.Alpha, 1.5, 2.2);
    }

    [Theory]
    [InlineData("bulletins")]
    [InlineData("letters")]
    [InlineData("tales")]
    public void EachSetsTailStartsInTheTensAndCoversAShareOfTypes(string set)
    {
        var s = Spectrum(SetFile(set));
        var f = Fit(s);
        Assert.InRange(f.Xmin, 10, 99);
        Assert.True(f.NTail >= 0.05 * s.TypeCount, $"{set}: tail {f.NTail} of {s.TypeCount} types");
    }

    [Fact]
    public void SetsTailExponentsFollowTheDesignedOrder()
    {
        // Pitman–Yor: the frequency spectrum falls as k^-(1+d) (Pitman 2006, from memory), so the sets' discounts
        // 0.45 < 0.60 < 0.75 order their α. Tolerance: each step up must exceed two standard errors of the difference
        // (observed Fisher information, each at its own KS-chosen xmin) — a one-sided z-test at about the 2.5% level
        // (common practice). The bootstrap intervals are wider (they add the uncertainty of xmin); they are reported
        // in corpora-demo/README.md, not tested here, to keep the test fast.
        var fits = Sets.Select(s => Fit(Spectrum(SetFile(s)))).ToArray();
        for (int i = 1; i < fits.Length; i++)
        {
            double diff = fits[i].Alpha - fits[i - 1].Alpha;
            double se = Math.Sqrt(fits[i].AlphaSe * fits[i].AlphaSe + fits[i - 1].AlphaSe * fits[i - 1].AlphaSe);
            Assert.True(diff > 2 * se, $"α({Sets[i]}) = {fits[i].Alpha:F3} − α({Sets[i - 1]}) = "
                + $"{fits[i - 1].Alpha:F3} is {diff:F3}, not above 2 × {se:F3}");
        }
    }

    [Fact]
    public void LaterYearsAreRicher()
    {
        // Planted drift: the burst probability falls from 0.8 (1960) to 0.4 (2019), so a later record repeats fewer
        // words. Richness compared at a common size by rarefaction, E[V(M)] from the spectrum (Baayen 2001, Word
        // Frequency Distributions, ch. 2, from memory): lexical figures depend on sample size, so raw type counts of
        // bins of different sizes would not be comparable. Designed effect per set: about +20–30% types from the
        // 1960–1979 bin to the 2000–2019 bin; asserted: at least +10%.
        using var d = new TempDir();
        foreach (var set in Sets)
        {
            string early = d[set + "-early.jsonl"], late = d[set + "-late.jsonl"];
            using (var e = new StreamWriter(early))
            using (var l = new StreamWriter(late))
            {
                foreach (var line in File.ReadLines(SetFile(set)))
                {
                    using var j = JsonDocument.Parse(line);
                    Assert.Equal(set, j.RootElement.GetProperty("set").GetString());
                    int year = j.RootElement.GetProperty("year").GetInt32();
                    Assert.InRange(year, 1960, 2019);
                    if (year < 1980) e.WriteLine(line);
                    else if (year >= 2000) l.WriteLine(line);
                }
            }
            FrequencySpectrum a = Spectrum(early), b = Spectrum(late);
            long m = Math.Min(a.TokenCount, b.TokenCount);
            double va = Lexicon.ExpectedTypes(a, m), vb = Lexicon.ExpectedTypes(b, m);
            Assert.True(vb > 1.10 * va,
                $"{set}: {vb:F0} types in the latest bin vs {va:F0} in the earliest, at {m} tokens");
        }
    }

    [Fact]
    public void TalesSplitIntoMoreSubwordPiecesPerWord()
    {
        // The tales' own words use clusters and letters outside ASCII (þ, ð, ø, å, æ, ŋ) and compounds; a byte-level
        // BPE vocabulary trained mostly on English (o200k_base) holds few of them whole. Designed: clearly more
        // pieces per word than the sets built from open, English-like syllables; asserted: at least 1.5 times.
        // the first 100 records of each set are enough for a ratio and keep the test fast
        using var d = new TempDir();
        double Fertility(string set)
        {
            File.WriteAllLines(d[set + ".jsonl"], File.ReadLines(SetFile(set)).Take(100));
            return (double)Totals(d[set + ".jsonl"], "o200k_base").Tokens / Totals(d[set + ".jsonl"], "words").Tokens;
        }
        double bulletins = Fertility("bulletins"), letters = Fertility("letters"), tales = Fertility("tales");
        Assert.True(tales > 1.5 * Math.Max(bulletins, letters),
            $"pieces per word: {bulletins:F2}, {letters:F2}, {tales:F2}");
    }

    [PythonFact]
    public void RegenerationIsByteIdentical()
    {
        var python = Python ?? throw new InvalidOperationException("python3 is not on PATH (needed under CI=true)");
        using var d = new TempDir();
        var psi = new ProcessStartInfo(python, [Path.Combine(Repo.Root, "corpora-demo", "generate.py"), d["corpus"]])
        {
            RedirectStandardError = true,
            RedirectStandardOutput = true,
        };
        psi.Environment["PYTHONHASHSEED"] = "random"; // the generator must not depend on string hashing
        using var p = Process.Start(psi)!;
        var err = p.StandardError.ReadToEndAsync();
        _ = p.StandardOutput.ReadToEndAsync();
        Assert.True(p.WaitForExit(120_000), "generate.py timed out");
        Assert.True(p.ExitCode == 0, err.Result);
        var made = Directory.GetFiles(d["corpus"]).Select(Path.GetFileName).Order(StringComparer.Ordinal).ToArray();
        var committed = Directory.GetFiles(Corpus).Select(Path.GetFileName).Order(StringComparer.Ordinal).ToArray();
        Assert.Equal(committed, made);
        foreach (var name in committed)
        {
            byte[] x = File.ReadAllBytes(Path.Combine(Corpus, name!));
            byte[] y = File.ReadAllBytes(Path.Combine(d["corpus"], name!));
            Assert.True(x.AsSpan().SequenceEqual(y),
                $"{name}: regenerated file differs ({y.Length} bytes vs {x.Length} committed)");
        }
    }
}
