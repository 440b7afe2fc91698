using System.Globalization;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

public class HurwitzZetaTests
{
    public static IEnumerable<object[]> Reference() =>
        File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Data", "hurwitz-mpmath.csv"))
            .Where(l => l.Length > 0 && char.IsDigit(l[0]))
            .Select(l => l.Split(','))
            .Select(p => new object[] { double.Parse(p[0], CultureInfo.InvariantCulture), double.Parse(p[1], CultureInfo.InvariantCulture),
                double.Parse(p[2], CultureInfo.InvariantCulture), double.Parse(p[3], CultureInfo.InvariantCulture) });

    [Theory]
    [MemberData(nameof(Reference))]
    public void MatchesMpmathTo1e12(double s, double q, double zeta, double dzeta)
    {
        // Reference: mpmath 1.2.1 at 50 digits (Data/hurwitz-mpmath.csv)
        var z = HurwitzZeta.Evaluate(s, q);
        Assert.True(Math.Abs(z.Value / zeta - 1) <= 1e-12, $"ζ({s},{q}) = {z.Value:R}, reference {zeta:R}");
        Assert.True(Math.Abs(z.D1 / dzeta - 1) <= 1e-12, $"∂ζ({s},{q}) = {z.D1:R}, reference {dzeta:R}");
    }

    [Theory]
    [MemberData(nameof(Reference))]
    public void QuickScaledSumsMatchMpmathTo1e12(double s, double q, double zeta, double dzeta)
    {
        // the xmin screen's sums (HurwitzZeta.ScaledQuick, q ≥ 12 only), unscaled by q^−s, against the same reference
        if (q < 12) return;
        var z = HurwitzZeta.ScaledQuick(s, q, Math.Log(q));
        double scale = Math.Pow(q, -s);
        Assert.True(Math.Abs(z.Value * scale / zeta - 1) <= 1e-12, $"ζ({s},{q}) = {z.Value * scale:R}, reference {zeta:R}");
        Assert.True(Math.Abs(z.D1 * scale / dzeta - 1) <= 1e-12, $"∂ζ({s},{q}) = {z.D1 * scale:R}, reference {dzeta:R}");
    }

    [Fact]
    public void QuickScaledSumsAgreeWithTheFullSumsWhereTheScreenUsesThem()
    {
        // s from just above 1 to the cap 30, q from 12 to 10^12: value and both derivatives within a few 1e-16 relative
        // of the sums LogAt is built on (those are checked against mpmath above)
        var rng = new Xoshiro(5, 0, 0);
        for (int k = 0; k < 20_000; k++)
        {
            double s = 1.01 + 28.99 * rng.NextDouble() * rng.NextDouble();
            double q = Math.Floor(12 * Math.Pow(1e11, rng.NextDouble()));
            double lnQ = Math.Log(q);
            var a = HurwitzZeta.ScaledQuick(s, q, lnQ);
            var b = HurwitzZeta.ScaledAt(s, q, lnQ, derivatives: true);
            Assert.True(Math.Abs(a.Value / b.Value - 1) <= 4e-15, $"ζ s={s:R} q={q}: {a.Value:R} vs {b.Value:R}");
            Assert.True(Math.Abs(a.D1 / b.D1 - 1) <= 4e-15, $"ζ' s={s:R} q={q}: {a.D1:R} vs {b.D1:R}");
            Assert.True(Math.Abs(a.D2 / b.D2 - 1) <= 4e-15, $"ζ'' s={s:R} q={q}: {a.D2:R} vs {b.D2:R}");
        }
    }

    [Fact]
    public void DlmfIdentities()
    {
        // NIST DLMF 25.6.1: ζ(2) = π²/6, ζ(4) = π⁴/90; DLMF 25.11.2 (recurrence): ζ(s, q) − ζ(s, q+1) = q^−s
        Assert.Equal(Math.PI * Math.PI / 6, HurwitzZeta.Value(2, 1), 1e-14);
        Assert.Equal(Math.Pow(Math.PI, 4) / 90, HurwitzZeta.Value(4, 1), 1e-14);
        foreach (var s in new[] { 1.1, 1.7, 2.5, 6.0 })
            foreach (var q in new[] { 1.0, 3.5, 11.0, 12.0, 250.0 })
            {
                double lhs = HurwitzZeta.Value(s, q) - HurwitzZeta.Value(s, q + 1);
                Assert.True(Math.Abs(lhs / Math.Pow(q, -s) - 1) < 1e-10, $"s={s} q={q}");
            }
    }

    [Fact]
    public void SecondDerivativeIsTheDerivativeOfTheFirst()
    {
        // consistency: central difference of ∂ζ/∂s (tested above against mpmath) against ∂²ζ/∂s²
        foreach (var (s, q) in new[] { (1.3, 1.0), (2.0, 5.0), (3.0, 40.0) })
        {
            double h = 1e-5;
            double fd = (HurwitzZeta.Evaluate(s + h, q).D1 - HurwitzZeta.Evaluate(s - h, q).D1) / (2 * h);
            Assert.True(Math.Abs(fd / HurwitzZeta.Evaluate(s, q).D2 - 1) < 1e-7);
        }
    }
}
