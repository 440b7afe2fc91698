using RankFreq.Comparison;
using Xunit;

namespace RankFreq.Tests.Comparison;

public class HolmTests
{
    [Fact]
    public void WorkedExampleOfFourHypotheses()
    {
        // Worked example of the Holm–Bonferroni method in the English Wikipedia article "Holm–Bonferroni method"
        // (from memory): p = 0.01, 0.04, 0.03, 0.005 at α = 0.05. Sorted, 0.005 ≤ 0.05/4 and 0.01 ≤ 0.05/3 are rejected,
        // 0.03 > 0.05/2 stops the procedure, so H1 and H4 are rejected and H2, H3 kept. Adjusted values by Holm (1979):
        // 4·0.005 = 0.02, 3·0.01 = 0.03, max(0.03, 2·0.03) = 0.06, max(0.06, 1·0.04) = 0.06.
        var adj = Holm.Adjust([0.01, 0.04, 0.03, 0.005]);
        Assert.Equal([0.03, 0.06, 0.06, 0.02], adj.Select(x => Math.Round(x, 12)).ToArray());
        Assert.Equal([true, false, false, true], adj.Select(x => x <= 0.05).ToArray());
    }

    [Fact]
    public void CapsAtOneKeepsNaNAndIsMonotone()
    {
        var adj = Holm.Adjust([0.5, double.NaN, 0.2, 0.9, 0.001]);
        Assert.True(double.IsNaN(adj[1]));
        // m = 4 real tests: 4·0.001, then max(3·0.2 = 0.6), max(0.6, 2·0.5 = 1), max(1, 0.9) → capped at 1
        Assert.Equal(0.004, adj[4], 12);
        Assert.Equal(0.6, adj[2], 12);
        Assert.Equal(1.0, adj[0], 12);
        Assert.Equal(1.0, adj[3], 12);
    }
}
