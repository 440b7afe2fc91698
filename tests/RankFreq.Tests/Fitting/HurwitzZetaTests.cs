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
