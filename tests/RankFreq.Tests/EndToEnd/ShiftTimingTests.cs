using RankFreq.Comparison;
using RankFreq.Counting;
using RankFreq.Fitting;
using RankFreq.Jobs;
using RankFreq.Tests.Counting;
using Xunit;

namespace RankFreq.Tests.EndToEnd;

public class ShiftTimingTests
{
    [Fact]
    public async Task TheJobReportsEachPhaseInOrder()
    {
        // what `tokshift --verbose` prints: the phases in the order they run, writing only with an output folder
        using var d = new TempDir();
        File.WriteAllText(d["t.txt"], RangeCutTests.WhitespaceBeforeNewlines(2_000));
        var options = new ShiftOptions(new FitOptions(Reps: 0, CiReps: 0, Alternatives: []));
        foreach (var (folder, phases) in new[]
                 {
                     ((string?)null, new[] { "load tokenizers", "count both", "fit and compare" }),
                     (d["out"], new[] { "load tokenizers", "count both", "fit and compare", "write" }),
                 })
        {
            var r = await ShiftJob.RunAsync([d["t.txt"]],
                new ShiftSettings(new CountSettings(Threads: 2), "words", "cl100k_base", options, folder));
            Assert.Equal(phases, r.Timings.Select(t => t.Phase).ToArray());
            Assert.All(r.Timings, t => Assert.True(t.Seconds >= 0 && t.Seconds < 600, $"{t.Phase}: {t.Seconds} s"));
        }
    }
}
