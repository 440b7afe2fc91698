using RankFreq.Counting;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

/// <summary>Inputs at the edges of the tail fit: each must give its status (in snake_case) and a message that says what was found.</summary>
public class FitEdgeTests
{
    private static TailFitResult Fit(FrequencySpectrum s, long xmin = 0) => TailFitter.Fit(s, new FitOptions(Xmin: xmin, Reps: 0, CiReps: 0));

    private static FrequencySpectrum PowerLaw(double alpha, long xmin, long n, ulong seed)
    {
        var buf = new SpectrumBuffer();
        Synthetic.PowerLawTail(new Xoshiro(seed), alpha, xmin, n, buf);
        return new FrequencySpectrum(buf.Values[..buf.Count], buf.Mult[..buf.Count]);
    }

    [Fact]
    public void StatusNamesAreSnakeCase()
    {
        Assert.Equal(["ok", "too_few_points", "all_equal", "at_bound", "no_maximum", "not_converged"],
            Enum.GetValues<FitStatus>().Select(FitStatusNames.Of));
    }

    [Theory]
    // mpmath 1.3.0 at 40 digits: log(zeta(s, q)) and zeta(s, q, 1)/zeta(s, q) (ζ(30, 10^12) ≈ 10^−350 underflows a double)
    [InlineData(30, 1e12, -804.66690819189987207, -27.665503874548737863)]
    [InlineData(26.97, 1e12, -720.83456040632603759, -27.669527084353154101)]
    [InlineData(2.5, 1e12, -41.851996782000236694, -28.297687782594714875)]
    [InlineData(1.5, 7, -0.24348942255474234569, -3.8737612775293648884)]
    public void LogZetaIsFiniteWhereZetaUnderflows(double s, double q, double ln, double r1)
    {
        var z = HurwitzZeta.Log(s, q);
        Assert.True(Math.Abs(z.Ln / ln - 1) < 1e-13, $"ln ζ({s}, {q}) = {z.Ln:R}");
        Assert.True(Math.Abs(z.R1 / r1 - 1) < 1e-13, $"ζ'/ζ({s}, {q}) = {z.R1:R}");
        if (s < 20) Assert.Equal(Math.Log(HurwitzZeta.Value(s, q)), z.Ln, 12); // the unscaled sums, where finite
    }

    [Fact]
    public void AllEqualCountsAreSaidToBeEqual()
    {
        var f = Fit(new FrequencySpectrum([7], [500])).PowerLaw;
        Assert.Equal(FitStatus.AllEqual, f.Status);
        Assert.Contains("all 500 counts are equal (7)", f.Message);
        Assert.DoesNotContain("min-tail", f.Message);

        // a fixed xmin below the one value: the message names the value, not xmin
        var fixedLow = Fit(new FrequencySpectrum([7], [500]), xmin: 1).PowerLaw;
        Assert.Equal(FitStatus.AllEqual, fixedLow.Status);
        Assert.Contains("(7)", fixedLow.Message);
        Assert.DoesNotContain("equal 1", fixedLow.Message);

        var tailOnly = Fit(new FrequencySpectrum([2, 5, 9], [300, 40, 60]), xmin: 6).PowerLaw;
        Assert.Equal(FitStatus.AllEqual, tailOnly.Status);
        Assert.Contains("at or above xmin = 6 equal 9", tailOnly.Message);
    }

    [Fact]
    public void OneCountAndTwoValuesAreTooFew()
    {
        var one = Fit(new FrequencySpectrum([12], [1])).PowerLaw;
        Assert.Equal(FitStatus.TooFewPoints, one.Status);
        Assert.Contains("a single count (12)", one.Message);

        // two distinct values: one free proportion for one parameter, so KS ≈ 0 by construction; not a fit
        var two = Fit(new FrequencySpectrum([3, 7], [100, 50])).PowerLaw;
        Assert.Equal(FitStatus.TooFewPoints, two.Status);
        Assert.Contains("only 2 distinct counts (3 and 7)", two.Message);
    }

    [Fact]
    public void HugeCountsCloseTogetherHaveNoMaximum()
    {
        // 200 types with counts 10^12 … 10^12 + 199: ζ(α, 10^12) underflows for α > 26, so only log-space arithmetic
        // sees that the likelihood still rises at the cap (the MLE is near 1 + 1/mean ln(x/xmin) ≈ 10^10)
        var v = Enumerable.Range(0, 200).Select(i => 1_000_000_000_000L + i).ToArray();
        var f = Fit(new FrequencySpectrum(v, Enumerable.Repeat(1L, 200).ToArray())).PowerLaw;
        Assert.Equal(FitStatus.NoMaximum, f.Status);
        Assert.Contains("no maximum of the likelihood below α = 30", f.Message);
        Assert.True(f.KsDistance > 0.9, $"KS {f.KsDistance}"); // the model at the cap is nowhere near the data

        // a genuine power law at xmin = 10^12 fits as usual (ζ ≈ 10^-19 there)
        var pl = Fit(PowerLaw(2.5, 1_000_000_000_000L, 5000, 3), xmin: 1_000_000_000_000L).PowerLaw;
        Assert.Equal(FitStatus.Ok, pl.Status);
        Assert.InRange(pl.Alpha, 2.5 - 4 * pl.AlphaSe, 2.5 + 4 * pl.AlphaSe);
    }

    [Fact]
    public void ExponentsNearTheCap()
    {
        // α = 28 at xmin = 1000 lies below the cap of 30: an ordinary fit
        var below = Fit(PowerLaw(28, 1000, 20_000, 5), xmin: 1000).PowerLaw;
        Assert.Equal(FitStatus.Ok, below.Status);
        Assert.InRange(below.Alpha, 28 - 4 * below.AlphaSe, 28 + 4 * below.AlphaSe);
        // α = 36: the likelihood still rises at 30, so there is no maximum in range (formerly α ≈ 29.99, status ok)
        var above = Fit(PowerLaw(36, 1000, 20_000, 6), xmin: 1000).PowerLaw;
        Assert.Equal(FitStatus.NoMaximum, above.Status);
        Assert.Equal(TailSearch.MaxAlpha, above.Alpha);
        Assert.Contains("at xmin = 1,000", above.Message);
    }

    [Fact]
    public void UniformCountsEndAtTheBound()
    {
        // counts uniform on 1..1000: the KS-best candidate is one whose likelihood still rises at the cap
        var rng = new Xoshiro(17);
        var s = FrequencySpectrum.FromCounts(Enumerable.Range(0, 20_000).Select(_ => 1 + rng.NextLong(1000)));
        var f = Fit(s).PowerLaw;
        Assert.Equal(FitStatus.AtBound, f.Status);
        Assert.Contains("cap 30", f.Message);
        Assert.Equal(TailSearch.MaxAlpha, f.Alpha);
    }

    [Fact]
    public void HundredThousandDistinctValues()
    {
        // every value 1..10^5 present (multiplicity 1–3, no power law): the search finishes (it took 42 s before the
        // block pruning) and reports that the best candidate sits at the cap
        var v = Enumerable.Range(1, 100_000).Select(x => (long)x).ToArray();
        var m = v.Select(x => 1 + x % 3).ToArray();
        var f = Fit(new FrequencySpectrum(v, m)).PowerLaw;
        Assert.Equal(FitStatus.AtBound, f.Status);
        Assert.True(f.KsDistance > 0.05);

        // and a power-law tail spread over ~10^5 distinct values fits normally
        var pl = Fit(PowerLaw(1.6, 1, 2_000_000, 8));
        Assert.True(pl.PowerLaw.Status == FitStatus.Ok, pl.PowerLaw.Message);
        Assert.InRange(pl.PowerLaw.Alpha, 1.55, 1.65);
    }
}
