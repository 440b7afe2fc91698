using System.Globalization;
using RankFreq.Fitting;
using Xunit;

namespace RankFreq.Tests.Fitting;

public class GaussLogTests
{
    public static IEnumerable<object[]> Reference() =>
        File.ReadAllLines(Path.Combine(AppContext.BaseDirectory, "Data", "gausslog-mpmath.csv"))
            .Where(l => l.Length > 0 && l[0] != '#')
            .Select(l => l.Split(','))
            .Select(p => new object[] { p[0], double.Parse(p[1], CultureInfo.InvariantCulture), double.Parse(p[2], CultureInfo.InvariantCulture),
                double.Parse(p[3], CultureInfo.InvariantCulture) });

    [Theory]
    [MemberData(nameof(Reference))]
    public void MatchesMpmath(string kind, double a, double b, double expected)
    {
        // Reference: Data/gausslog_reference.py (mpmath 1.3.0 at 50 digits) → Data/gausslog-mpmath.csv; far-tail values
        // (z up to 60, where erfc is far below the smallest double) are the point of the log-space arithmetic
        double got = kind == "q" ? GaussLog.LogQ(a) : GaussLog.LogDiff(a, b);
        Assert.True(Math.Abs(got - expected) <= 1e-13 * Math.Abs(expected) + 1e-30, $"{kind}({a}, {b}) = {got:R}, reference {expected:R}");
    }
}
